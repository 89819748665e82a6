/* src/cli/cmd_rotor.c
 * "airscrew rotor": propeller performance from a blade file over rpm and axial speed, with
 * section tables computed by airscrew (or given), and the rpm for a target thrust.
 */
#define _GNU_SOURCE
#include "cli.h"
#include "cli_figures.h"
#include "cli_rotor_opts.h"
#include "cli_tables.h"
#include "commands.h"

#include <getopt.h>
#include <jansson.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#define ROTOR_MAX_VALUES 64

static const char *const rotor_cautions[] = {
    "Predictions are estimates: confirm them on a guarded thrust stand before flight.",
    "A spinning propeller cuts; blades and hubs can fail at high rpm. Keep clear of the rotor "
    "plane, use guards and follow local rules and qualified practice.",
    NULL};

static void rotor_help(FILE *fp)
{
  fputs("usage: airscrew rotor BLADE.json --rpm VALUES [--airspeed VALUES | --advance-ratio VALUES]\n"
        "                      [options]\n"
        "       airscrew rotor BLADE.json --thrust N --rpm-range LO:HI [--airspeed VALUES] [options]\n"
        "\n"
        "Thrust, torque, power and efficiency of a propeller from its blade file. The section\n"
        "polars are computed by airscrew's viscous solver over the Reynolds numbers the\n"
        "operating points need, and kept in a cache so that the next run reuses them.\n"
        "VALUES is a comma-separated list or START:END:STEP.\n"
        "\n"
        "operating points:\n"
        "  -n, --rpm VALUES        rotation rates, rev/min\n"
        "  -v, --airspeed VALUES   axial airspeeds (flight or climb), m/s (default 0: static);\n"
        "                          --speed is the same option\n"
        "      --advance-ratio VALUES  advance ratios J = V/(n D) instead of airspeeds: every\n"
        "                          rpm is run at every J\n"
        "      --thrust N          find the rpm giving N newtons at each airspeed (needs\n"
        "                          --rpm-range)\n"
        "      --rpm-range LO:HI   search range of --thrust, rev/min\n"
        CLI_ROTOR_OPTS_HELP
        "transition uncertainty:\n"
        "      --ncrit-range LO:HI also solve every point with tables at N_crit LO and HI and\n"
        "                          report the band of thrust, power and efficiency they span\n"
        "output:\n"
        "      --stations          print the spanwise distributions in the table output\n"
        "      --plot DIR          also draw CT, CP, efficiency against J, thrust against rpm and\n"
        "                          the spanwise loading (DIR/rotor*.svg and .png); with\n"
        "                          --advance-ratio at two or more rpm also CT and CP at each\n"
        "                          J against the chord Reynolds number at 0.75 R\n"
        "      --json, --csv       machine-readable output (JSON carries the distributions)\n"
        "  -o, --output FILE       write to FILE (whole or not at all)\n"
        "      --force             replace FILE if it exists\n"
        "  -h, --help              this help\n"
        "\n"
        "Predictions are estimates. Test on a guarded thrust stand; a spinning propeller cuts.\n",
        fp);
}

typedef struct rotor_point {
  ascr_rotor_result r;
  ascr_rotor_element *el;
  int solved;       /* the solver ran and filled r */
  int banded;       /* band filled (--ncrit-range) */
  ascr_rotor_result band_lo; /* the point at N_crit LO, until the band is formed */
  ascr_rotor_band band;
  char note[ASCR_ERRBUF_SIZE]; /* why there is no result */
} rotor_point;

/* The notes on one operating point, each a sentence of its own, counts with their totals
 * (issue 17: "34 elements beyond ..." did not say of how many): the same words in the table
 * and in JSON. Returns the number of notes. */
#define NOTE_MAX 8
static size_t point_notes(const rotor_point *pt, size_t n_el, char notes[NOTE_MAX][200])
{
  size_t k = 0;
  if (!pt->solved) {
    snprintf(notes[k++], 200, "no solution: %.170s", pt->note);
    return k;
  }
  if (!pt->r.converged) snprintf(notes[k++], 200, "not converged");
  if (pt->r.converged && pt->r.low_confidence) {
    snprintf(notes[k++], 200, "low confidence: %.0f %% of the thrust on flagged elements",
             100.0 * pt->r.flagged_thrust_share);
  }
  if (pt->r.n_stalled > 0) {
    snprintf(notes[k++], 200, "%zu of %zu elements stalled", pt->r.n_stalled, n_el);
  }
  if (pt->r.n_extended > 0) {
    snprintf(notes[k++], 200, "%zu of %zu elements beyond the computed polar range (post-stall "
             "model)", pt->r.n_extended, n_el);
  }
  if (pt->r.n_bridged > 0) {
    snprintf(notes[k++], 200, "%zu of %zu elements in a gap of their polar (bridged)",
             pt->r.n_bridged, n_el);
  }
  if (pt->r.n_re_outside > 0) {
    snprintf(notes[k++], 200, "%zu of %zu elements outside the table's Re range (nearest curve)",
             pt->r.n_re_outside, n_el);
  }
  if (pt->r.n_trip_unbound > 0) {
    snprintf(notes[k++], 200, "%zu of %zu elements where the section's trip binds nothing (free "
             "transition there)", pt->r.n_trip_unbound, n_el);
  }
  if (pt->r.tip_mach > 0.7) {
    snprintf(notes[k++], 200, "tip Mach %.3f above 0.7: compressibility beyond the correction",
             pt->r.tip_mach);
  }
  return k;
}

static void point_warnings(const rotor_point *pt, size_t n_el, char *buf, size_t n)
{
  char notes[NOTE_MAX][200];
  size_t m = point_notes(pt, n_el, notes), used = 0;
  buf[0] = '\0';
  for (size_t i = 0; i < m && used < n; i++) {
    used += (size_t)snprintf(buf + used, n - used, "%s%s", i > 0 ? "; " : "", notes[i]);
  }
}

static json_t *warnings_json(const rotor_point *pt, size_t n_el)
{
  char notes[NOTE_MAX][200];
  size_t m = point_notes(pt, n_el, notes);
  json_t *a = json_array();
  for (size_t i = 0; i < m; i++) json_array_append_new(a, json_string(notes[i]));
  return a;
}

int cmd_rotor(int argc, char **argv)
{
  static const struct option opts[] = {
    {"rpm", required_argument, NULL, 'n'},          {"airspeed", required_argument, NULL, 'v'},
    {"speed", required_argument, NULL, 'v'},        {"advance-ratio", required_argument, NULL, 'j'},
    {"thrust", required_argument, NULL, 'H'},       {"rpm-range", required_argument, NULL, 'R'},
    CLI_ROTOR_LONGOPTS,
    {"stations", no_argument, NULL, 's'},
    {"json", no_argument, NULL, 'J'},               {"csv", no_argument, NULL, 'C'},
    {"output", required_argument, NULL, 'o'},       {"force", no_argument, NULL, 'F'},
    {"plot", required_argument, NULL, 'G'},          {"ncrit-range", required_argument, NULL, 'B'},
    {"help", no_argument, NULL, 'h'},               {NULL, 0, NULL, 0}};
  double rpms[ROTOR_MAX_VALUES], speeds[ROTOR_MAX_VALUES] = {0.0};
  size_t nrpm = 0, nspeed = 1;
  int by_j = 0, by_v = 0; /* speeds given as advance ratios J / as airspeeds */
  double thrust = NAN, rpm_lo = NAN, rpm_hi = NAN, nc_lo = NAN, nc_hi = NAN;
  cli_rotor_opts ro;
  cli_rotor_opts_init(&ro);
  int stations = 0, json = 0, csv = 0, force = 0, c;
  const char *outpath = NULL, *plotdir = NULL;
  opterr = 0;
  cli_getopt_reset();
  while ((c = getopt_long(argc, argv, ":n:v:i:p:e:o:h", opts, NULL)) != -1) {
    switch (c) {
    case 'n': if (cli_parse_values("--rpm", optarg, 1.0, 1e6, ROTOR_MAX_VALUES, rpms, &nrpm)) return CLI_EXIT_USAGE; break;
    case 'v':
      if (cli_parse_values("--airspeed", optarg, 0.0, 300.0, ROTOR_MAX_VALUES, speeds, &nspeed)) return CLI_EXIT_USAGE;
      by_v = 1;
      break;
    case 'j':
      if (cli_parse_values("--advance-ratio", optarg, 0.0, 5.0, ROTOR_MAX_VALUES, speeds, &nspeed)) return CLI_EXIT_USAGE;
      by_j = 1;
      break;
    case 'H': if (cli_parse_double("--thrust", optarg, 1e-6, 1e6, &thrust)) return CLI_EXIT_USAGE; break;
    case 'R': if (cli_parse_pair("--rpm-range", optarg, 1.0, 1e6, &rpm_lo, &rpm_hi)) return CLI_EXIT_USAGE; break;
    case 's': stations = 1; break;
    case 'G': plotdir = optarg; break;
    case 'B':
      if (cli_parse_pair("--ncrit-range", optarg, 0.5, 20.0, &nc_lo, &nc_hi)) return CLI_EXIT_USAGE;
      break;
    case 'J': json = 1; break;
    case 'C': csv = 1; break;
    case 'o': outpath = optarg; break;
    case 'F': force = 1; break;
    case 'h': rotor_help(stdout); return CLI_EXIT_OK;
    case ':': cli_error("rotor: option %s needs a value", argv[optind - 1]); return CLI_EXIT_USAGE;
    default: {
      int r = cli_rotor_opts_parse(&ro, c, optarg);
      if (r == 0) break;
      if (r < 0) cli_error("rotor: unknown option '%s' (see airscrew rotor --help)", argv[optind - 1]);
      return CLI_EXIT_USAGE;
    }
    }
  }
  if (optind != argc - 1) {
    cli_error("rotor: give exactly one BLADE file; see airscrew rotor --help");
    return CLI_EXIT_USAGE;
  }
  if (by_j && by_v) {
    cli_error("rotor: --airspeed and --advance-ratio exclude each other");
    return CLI_EXIT_USAGE;
  }
  int trim = !isnan(thrust);
  if (trim && by_j) {
    cli_error("rotor: --thrust takes airspeeds (--airspeed), not advance ratios");
    return CLI_EXIT_USAGE;
  }
  if (trim && (nrpm > 0 || isnan(rpm_lo))) {
    cli_error("rotor: --thrust needs --rpm-range LO:HI and no --rpm");
    return CLI_EXIT_USAGE;
  }
  if (!trim && nrpm == 0) {
    cli_error("rotor: --rpm VALUES is required (or --thrust N with --rpm-range LO:HI)");
    return CLI_EXIT_USAGE;
  }
  if (!isnan(rpm_lo) && !trim) {
    cli_error("rotor: --rpm-range belongs with --thrust");
    return CLI_EXIT_USAGE;
  }
  if (json && csv) {
    cli_error("rotor: --json and --csv exclude each other");
    return CLI_EXIT_USAGE;
  }
  int orc0 = cli_rotor_opts_finish(&ro, "rotor");
  if (orc0) return orc0;
  ascr_inflow model = cli_rotor_opts_model(&ro);
  const char *inflow = ro.inflow;
  ascr_rotor_params rp = ro.rp;
  cli_table_opts to = ro.to;

  if (cli_check_options_only) return CLI_EXIT_OK;
  /* the output file checked before the plot folder is created (nothing left behind) */
  if (outpath != NULL) {
    int orc = cli_output_check(outpath, force);
    if (orc) return orc;
  }
  if (plotdir != NULL) {
    int prc = fig_prepare_dir(plotdir, (const char *const[]){"rotor", "rotor-spanwise", NULL}, force);
    if (prc) return prc;
  }
  cli_output out;
  int rc = cli_output_open(&out, outpath, force);
  if (rc) return rc;
  ascr_blade *blade = NULL;
  ascr_errbuf err;
  ascr_status st = ascr_blade_read(argv[optind], &blade, &err);
  if (st != ASCR_OK) {
    cli_error("%s", err.msg);
    cli_output_discard(&out);
    return st == ASCR_ENOMEM ? CLI_EXIT_INTERNAL : CLI_EXIT_INPUT;
  }
  double rmin = trim ? rpm_lo : rpms[0], rmax = trim ? rpm_hi : rpms[0];
  for (size_t i = 0; i < nrpm; i++) {
    rmin = fmin(rmin, rpms[i]);
    rmax = fmax(rmax, rpms[i]);
  }
  /* advance ratios: the airspeed of each point is J n D at its own rpm */
  double dia = 2.0 * blade->r_tip_m;
  double vmin = by_j ? speeds[0] * rmin / 60.0 * dia : speeds[0], vmax = vmin;
  for (size_t i = 0; i < nspeed; i++) {
    double lo = by_j ? speeds[i] * rmin / 60.0 * dia : speeds[i];
    double hi = by_j ? speeds[i] * rmax / 60.0 * dia : speeds[i];
    vmin = fmin(vmin, lo);
    vmax = fmax(vmax, hi);
  }
  cli_tables tabs;
  rc = cli_tables_prepare(blade, &rp, rmin, rmax, vmin, vmax, &to, &tabs);
  if (rc) {
    ascr_blade_free(blade);
    cli_output_discard(&out);
    return rc;
  }
  size_t npt = trim ? nspeed : nrpm * nspeed;
  rotor_point *pts = calloc(npt, sizeof *pts);
  ascr_rotor_element *els = calloc(npt * rp.n_elements, sizeof *els);
  if (pts == NULL || els == NULL) {
    cli_error("out of memory");
    rc = CLI_EXIT_INTERNAL;
    goto done;
  }
  const ascr_polar_table *const *tv = (const ascr_polar_table *const *)tabs.tables;
  size_t nconv = 0;
  for (size_t k = 0; k < npt && rc == 0; k++) {
    rotor_point *pt = &pts[k];
    pt->el = els + k * rp.n_elements;
    double v = trim ? speeds[k] : speeds[k % nspeed];
    if (by_j) v = speeds[k % nspeed] * rpms[k / nspeed] / 60.0 * dia;
    if (trim) {
      st = ascr_rotor_rpm_for_thrust(blade, tv, &rp, model, NULL, thrust, v, rpm_lo, rpm_hi, &pt->r,
                                     pt->el, &err);
      if (st == ASCR_EDOM || st == ASCR_EMAXITER) {
        snprintf(pt->note, sizeof pt->note, "%s", err.msg);
        pt->r.speed_m_s = v;
        pt->r.rpm = NAN;
        cli_warn("speed %g m/s: %s", v, err.msg);
        continue;
      }
    } else {
      st = ascr_rotor_point(blade, tv, &rp, model, NULL, rpms[k / nspeed], v, &pt->r, pt->el, &err);
    }
    if (st != ASCR_OK) {
      cli_error("%s", err.msg);
      rc = cli_exit_for(st);
      break;
    }
    pt->solved = 1;
    nconv += (size_t)pt->r.converged;
    if (!pt->r.converged) {
      cli_warn("%g rpm, %g m/s: not converged (flagged in the output)", pt->r.rpm, v);
    }
  }
  if (rc == 0 && nconv == 0) {
    cli_error("rotor: no operating point converged");
    rc = CLI_EXIT_ANALYSIS;
  }
  if (rc != 0) goto done;
  /* transition-uncertainty band: every solved point again at N_crit LO and HI (tables of their
   * own, cached like the nominal ones), at the nominal point's rpm and airspeed */
  if (!isnan(nc_lo)) {
    for (int side = 0; side < 2 && rc == 0; side++) {
      cli_table_opts tb = to;
      tb.vo.ncrit = side == 0 ? nc_lo : nc_hi;
      tb.vo.turbulence = NAN;
      cli_tables tt;
      rc = cli_tables_prepare(blade, &rp, rmin, rmax, vmin, vmax, &tb, &tt);
      if (rc) break;
      const ascr_polar_table *const *tw = (const ascr_polar_table *const *)tt.tables;
      for (size_t k = 0; k < npt && rc == 0; k++) {
        rotor_point *pt = &pts[k];
        if (!pt->solved || !isfinite(pt->r.rpm)) continue;
        ascr_rotor_result rr[3];
        rr[0] = pt->r;
        st = ascr_rotor_point(blade, tw, &rp, model, NULL, pt->r.rpm, pt->r.speed_m_s, &rr[1], NULL,
                              &err);
        if (st != ASCR_OK) {
          cli_error("%s", err.msg);
          rc = cli_exit_for(st);
          break;
        }
        if (side == 1) {
          rr[2] = rr[1];
          rr[1] = pt->band_lo;
          ascr_rotor_band_of(rr, 3, &pt->band);
          pt->banded = 1;
        } else {
          pt->band_lo = rr[1];
        }
      }
      cli_tables_free(&tt);
    }
    if (rc != 0) goto done;
  }

  FILE *fp = out.fp;
  const char *bname = blade->name != NULL ? blade->name : argv[optind];
  if (plotdir != NULL) {
    fig_rotor_point *fr = calloc(npt, sizeof *fr);
    double *sb = calloc(2 * npt * rp.n_elements + 1, sizeof *sb);
    if (fr == NULL || sb == NULL) {
      cli_error("out of memory");
      rc = CLI_EXIT_INTERNAL;
    }
    for (size_t k = 0; rc == 0 && k < npt; k++) {
      const rotor_point *pt = &pts[k];
      int ok = pt->solved && pt->r.converged;
      fr[k].rpm = pt->r.rpm;
      fr[k].speed = pt->r.speed_m_s;
      fr[k].J = ok ? pt->r.J : NAN;
      fr[k].CT = ok ? pt->r.CT : NAN;
      fr[k].CP = ok ? pt->r.CP : NAN;
      fr[k].eta = ok ? pt->r.efficiency : NAN;
      fr[k].thrust = ok ? pt->r.thrust_N : NAN;
      fr[k].power = ok ? pt->r.power_W : NAN;
      fr[k].re_075 = ok ? pt->r.re_075 : NAN;
      for (int q = 0; q < 2; q++) {
        fr[k].thrust_band[q] = ok && pt->banded ? pt->band.thrust_N[q] : NAN;
        fr[k].power_band[q] = ok && pt->banded ? pt->band.power_W[q] : NAN;
      }
      if (ok) {
        fr[k].ns = rp.n_elements;
        fr[k].r_over_R = sb + 2 * k * rp.n_elements;
        fr[k].dT_dr = fr[k].r_over_R + rp.n_elements;
        for (size_t i = 0; i < rp.n_elements; i++) {
          fr[k].r_over_R[i] = pt->el[i].r_m / blade->r_tip_m;
          fr[k].dT_dr[i] = pt->el[i].dT_dr_N_m;
        }
      }
    }
    if (rc == 0) rc = fig_rotor(plotdir, bname, fr, npt);
    free(fr);
    free(sb);
    if (rc != 0) goto done;
  }
  if (json) {
    json_t *o = json_object();
    json_object_set_new(o, "blade", json_string(bname));
    json_object_set_new(o, "blade_file", json_string(argv[optind]));
    json_object_set_new(o, "inflow", json_string(inflow));
    json_object_set_new(o, "stall_delay", json_string(rp.stall_delay == ASCR_STALL_DELAY_SNEL ? "snel" : "none"));
    json_object_set_new(o, "blades", json_integer(blade->n_blades));
    json_object_set_new(o, "diameter_m", json_real(2.0 * blade->r_tip_m));
    json_object_set_new(o, "solidity", npt > 0 && pts[0].solved ? json_real(pts[0].r.solidity) : json_null());
    if (!isnan(nc_lo)) {
      json_t *nr = json_array();
      json_array_append_new(nr, json_real(nc_lo));
      json_array_append_new(nr, json_real(nc_hi));
      json_object_set_new(o, "ncrit_range", nr);
    }
    json_t *air = json_object();
    json_object_set_new(air, "density_kg_m3", json_real(rp.density_kg_m3));
    json_object_set_new(air, "viscosity_pa_s", json_real(rp.viscosity_pa_s));
    json_object_set_new(air, "sound_speed_m_s", json_real(rp.sound_speed_m_s));
    json_object_set_new(o, "air", air);
    json_t *sa = json_array();
    for (size_t s = 0; s < tabs.n; s++) {
      const cli_section_info *in = &tabs.info[s];
      json_t *so = json_object(), *ra = json_array();
      json_object_set_new(so, "name", json_string(blade->section_name[s]));
      json_object_set_new(so, "source", json_string(in->user_file ? in->user_file : blade->section_source[s]));
      json_object_set_new(so, "table_from", json_string(in->user_file ? "polar-table file" : "computed"));
      if (!in->user_file) {
        json_object_set_new(so, "fingerprint", json_string(in->fingerprint));
        json_object_set_new(so, "re_needed_min", json_real(in->re_lo));
        json_object_set_new(so, "re_needed_max", json_real(in->re_hi));
        json_object_set_new(so, "curves_from_cache", json_integer((json_int_t)in->from_cache));
        json_object_set_new(so, "curves_computed", json_integer((json_int_t)in->computed));
      }
      for (size_t k = 0; k < in->n_curves; k++) {
        json_t *co = json_object();
        json_object_set_new(co, "re", json_real(in->re[k]));
        json_object_set_new(co, "converged_points", json_integer((json_int_t)in->converged[k]));
        json_object_set_new(co, "points", json_integer((json_int_t)in->points[k]));
        /* a tripped curve: its converged points where a trip bound nothing (free transition) */
        const ascr_curve_data *cd = !in->user_file && k < in->n_curve ? &in->curve[k] : NULL;
        if (cd != NULL && (cd->trip_upper <= 1.0 || cd->trip_lower <= 1.0)) {
          size_t nt[2];
          ascr_curve_trip_counts(cd, nt);
          json_t *tn = json_object();
          json_object_set_new(tn, "upper", json_integer((json_int_t)nt[0]));
          json_object_set_new(tn, "lower", json_integer((json_int_t)nt[1]));
          json_object_set_new(co, "trip_not_applied_points", tn);
        }
        json_array_append_new(ra, co);
      }
      json_object_set_new(so, "curves", ra);
      json_array_append_new(sa, so);
    }
    json_object_set_new(o, "sections", sa);
    /* the elements carry trip_not_applied where a trip was asked for or a table's flags say
     * one bound nothing */
    int tripped = 0;
    for (size_t s = 0; s < tabs.n; s++) {
      const cli_section_info *in = &tabs.info[s];
      for (size_t k = 0; !in->user_file && k < in->n_curve; k++) {
        tripped |= in->curve[k].trip_upper <= 1.0 || in->curve[k].trip_lower <= 1.0;
      }
    }
    for (size_t k = 0; k < npt; k++) {
      for (size_t i = 0; pts[k].solved && i < rp.n_elements; i++) {
        tripped |= pts[k].el[i].trip_unbound != 0;
      }
    }
    json_t *pa = json_array();
    for (size_t k = 0; k < npt; k++) {
      const rotor_point *pt = &pts[k];
      int ok = pt->solved && pt->r.converged;
      json_t *po = json_object();
      json_object_set_new(po, "rpm", cli_json_num(pt->solved, pt->r.rpm));
      json_object_set_new(po, "speed_m_s", json_real(pt->r.speed_m_s));
      json_object_set_new(po, "thrust_N", cli_json_num(ok, pt->r.thrust_N));
      json_object_set_new(po, "torque_Nm", cli_json_num(ok, pt->r.torque_Nm));
      json_object_set_new(po, "power_W", cli_json_num(ok, pt->r.power_W));
      json_object_set_new(po, "CT", cli_json_num(ok, pt->r.CT));
      json_object_set_new(po, "CP", cli_json_num(ok, pt->r.CP));
      json_object_set_new(po, "CQ", cli_json_num(ok, pt->r.CQ));
      json_object_set_new(po, "CT_rotor", cli_json_num(ok, pt->r.CT_rotor));
      json_object_set_new(po, "CP_rotor", cli_json_num(ok, pt->r.CP_rotor));
      json_object_set_new(po, "CT_over_sigma", cli_json_num(ok, pt->r.CT_over_sigma));
      json_object_set_new(po, "re_075", cli_json_num(pt->solved, pt->r.re_075));
      if (pt->banded) {
        json_t *tb = json_array(), *pb = json_array(), *eb = json_array();
        for (int q = 0; q < 2; q++) {
          json_array_append_new(tb, cli_json_num(isfinite(pt->band.thrust_N[q]), pt->band.thrust_N[q]));
          json_array_append_new(pb, cli_json_num(isfinite(pt->band.power_W[q]), pt->band.power_W[q]));
          json_array_append_new(eb, cli_json_num(isfinite(pt->band.efficiency[q]), pt->band.efficiency[q]));
        }
        json_object_set_new(po, "thrust_band_N", tb);
        json_object_set_new(po, "power_band_W", pb);
        json_object_set_new(po, "efficiency_band", isfinite(pt->band.efficiency[0]) ? eb : json_null());
        if (!isfinite(pt->band.efficiency[0])) json_decref(eb);
        json_object_set_new(po, "band_complete", json_boolean(pt->band.complete));
      }
      json_object_set_new(po, "J", cli_json_num(pt->solved, pt->r.J));
      json_object_set_new(po, "efficiency", cli_json_num(ok, pt->r.efficiency));
      json_object_set_new(po, "figure_of_merit", cli_json_num(ok, pt->r.figure_of_merit));
      json_object_set_new(po, "tip_mach", cli_json_num(pt->solved, pt->r.tip_mach));
      json_object_set_new(po, "converged", json_boolean(ok));
      json_object_set_new(po, "confidence",
                          ok ? json_string(pt->r.low_confidence ? "low" : "normal") : json_null());
      json_object_set_new(po, "flagged_thrust_share", cli_json_num(ok, pt->r.flagged_thrust_share));
      json_object_set_new(po, "warnings", warnings_json(pt, rp.n_elements));
      json_t *ea = json_array();
      for (size_t i = 0; pt->solved && i < rp.n_elements; i++) {
        const ascr_rotor_element *e = &pt->el[i];
        int eok = ok && e->converged;
        json_t *eo = json_object();
        json_object_set_new(eo, "r_m", json_real(e->r_m));
        json_object_set_new(eo, "r_over_R", json_real(e->r_m / blade->r_tip_m));
        json_object_set_new(eo, "chord_m", json_real(e->chord_m));
        json_object_set_new(eo, "alpha_deg", cli_json_num(eok, e->alpha_deg));
        json_object_set_new(eo, "phi_deg", cli_json_num(eok, e->phi_deg));
        json_object_set_new(eo, "re", cli_json_num(eok, e->re));
        json_object_set_new(eo, "mach", cli_json_num(eok, e->mach));
        json_object_set_new(eo, "cl", cli_json_num(eok, e->cl));
        json_object_set_new(eo, "cd", cli_json_num(eok, e->cd));
        json_object_set_new(eo, "cm", cli_json_num(eok, e->cm));
        json_object_set_new(eo, "dT_dr_N_per_m", cli_json_num(eok, e->dT_dr_N_m));
        json_object_set_new(eo, "dM_dr_Nm_per_m", cli_json_num(eok, e->dM_dr_Nm_m));
        json_object_set_new(eo, "dQ_dr_Nm_per_m", cli_json_num(eok, e->dQ_dr_Nm_m));
        json_object_set_new(eo, "stalled", json_boolean(e->stalled));
        json_object_set_new(eo, "beyond_polar", json_boolean(e->region == ASCR_TABLE_EXTENDED));
        json_object_set_new(eo, "bridged", json_boolean(e->region == ASCR_TABLE_BRIDGED));
        json_object_set_new(eo, "re_outside", json_boolean(e->re_outside));
        if (tripped) {
          json_t *tn = json_array();
          if (eok && (e->trip_unbound & 1)) json_array_append_new(tn, json_string("upper"));
          if (eok && (e->trip_unbound & 2)) json_array_append_new(tn, json_string("lower"));
          json_object_set_new(eo, "trip_not_applied", tn);
        }
        json_array_append_new(ea, eo);
      }
      json_object_set_new(po, "stations", ea);
      json_array_append_new(pa, po);
    }
    json_object_set_new(o, "points", pa);
    json_t *ca = json_array();
    for (size_t i = 0; rotor_cautions[i] != NULL; i++) json_array_append_new(ca, json_string(rotor_cautions[i]));
    json_object_set_new(o, "cautions", ca);
    json_dumpf(o, fp, JSON_REAL_PRECISION(10) | JSON_COMPACT);
    fputc('\n', fp);
    json_decref(o);
  } else if (csv) {
    fprintf(fp, "# blade: %s\n# inflow: %s\n# stall delay: %s\n", bname, inflow,
            rp.stall_delay == ASCR_STALL_DELAY_SNEL ? "snel" : "none");
    for (size_t i = 0; rotor_cautions[i] != NULL; i++) fprintf(fp, "# caution: %s\n", rotor_cautions[i]);
    fputs("rpm,speed_m_s,J,thrust_N,torque_Nm,power_W,CT,CP,efficiency,figure_of_merit,tip_mach,converged,"
          "confidence,flagged_thrust_share,CT_rotor,CP_rotor,CT_over_sigma,re_075,thrust_band_lo_N,"
          "thrust_band_hi_N,power_band_lo_W,power_band_hi_W,efficiency_band_lo,efficiency_band_hi,"
          "warnings\n", fp);
    for (size_t k = 0; k < npt; k++) {
      const rotor_point *pt = &pts[k];
      int ok = pt->solved && pt->r.converged;
      char w[512];
      point_warnings(pt, rp.n_elements, w, sizeof w);
      for (char *q = w; *q; q++) if (*q == ',' || *q == '"') *q = ' ';
      if (pt->solved) fprintf(fp, "%.6g,%.6g,%.6f,", pt->r.rpm, pt->r.speed_m_s, pt->r.J);
      else fprintf(fp, ",%.6g,,", pt->r.speed_m_s);
      if (ok) {
        fprintf(fp, "%.6g,%.6g,%.6g,%.6f,%.6f,", pt->r.thrust_N, pt->r.torque_Nm, pt->r.power_W, pt->r.CT, pt->r.CP);
        if (isfinite(pt->r.efficiency)) fprintf(fp, "%.5f", pt->r.efficiency);
        fputc(',', fp);
        if (isfinite(pt->r.figure_of_merit)) fprintf(fp, "%.5f", pt->r.figure_of_merit);
        fprintf(fp, ",%.4f,true,%s,%.4f,%.6f,%.6f,%.5f,%.0f", pt->r.tip_mach,
                pt->r.low_confidence ? "low" : "normal", pt->r.flagged_thrust_share, pt->r.CT_rotor,
                pt->r.CP_rotor, pt->r.CT_over_sigma, pt->r.re_075);
        const double bv[6] = {pt->band.thrust_N[0], pt->band.thrust_N[1], pt->band.power_W[0],
                              pt->band.power_W[1], pt->band.efficiency[0], pt->band.efficiency[1]};
        for (int q = 0; q < 6; q++) {
          fputc(',', fp);
          if (pt->banded && isfinite(bv[q])) fprintf(fp, "%.6g", bv[q]);
        }
        fprintf(fp, ",%s\n", w);
      } else {
        fprintf(fp, ",,,,,,,,false,,,,,,,,,,,,,%s\n", w);
      }
    }
  } else {
    fprintf(fp, "blade    %s\n", bname);
    fprintf(fp, "rotor    %d blades, diameter %.1f mm, solidity %.4f, inflow model %s%s\n",
            blade->n_blades, 2000.0 * blade->r_tip_m, npt > 0 ? pts[0].r.solidity : NAN, inflow,
            rp.stall_delay == ASCR_STALL_DELAY_SNEL ? ", stall delay (Snel)" : "");
    fprintf(fp, "         CT, CP propeller convention (n rev/s, D); CT/sig = T/(rho A (Omega R)^2)"
            " / solidity\n");
    fprintf(fp, "air      density %.4f kg/m3, viscosity %.4g Pa s, speed of sound %.1f m/s\n",
            rp.density_kg_m3, rp.viscosity_pa_s, rp.sound_speed_m_s);
    for (size_t s = 0; s < tabs.n; s++) {
      const cli_section_info *in = &tabs.info[s];
      if (in->user_file) {
        fprintf(fp, "section  %-10s table from %s\n", blade->section_name[s], in->user_file);
      } else {
        fprintf(fp, "section  %-10s Re %.0f .. %.0f to cover; %zu curves (%zu from cache, %zu computed)\n",
                blade->section_name[s], in->re_lo, in->re_hi, in->n_curves, in->from_cache, in->computed);
      }
    }
    fprintf(fp, "\n%8s %7s %6s %9s %10s %9s %8s %8s %6s %6s %7s %7s  %s\n", "rpm", "V m/s", "J", "thrust N",
            "torque Nm", "power W", "CT", "CP", "eta", "FM", "CT/sig", "Re0.75", "notes");
    for (size_t k = 0; k < npt; k++) {
      const rotor_point *pt = &pts[k];
      char w[512];
      point_warnings(pt, rp.n_elements, w, sizeof w);
      if (!pt->solved) {
        fprintf(fp, "%8s %7.2f   %s\n", "-", pt->r.speed_m_s, w);
        continue;
      }
      if (!pt->r.converged) {
        fprintf(fp, "%8.0f %7.2f %6.3f   not converged\n", pt->r.rpm, pt->r.speed_m_s, pt->r.J);
        continue;
      }
      char eta[16] = "-", fm[16] = "-";
      if (isfinite(pt->r.efficiency)) snprintf(eta, sizeof eta, "%.3f", pt->r.efficiency);
      if (isfinite(pt->r.figure_of_merit)) snprintf(fm, sizeof fm, "%.3f", pt->r.figure_of_merit);
      fprintf(fp, "%8.0f %7.2f %6.3f %9.4f %10.5f %9.3f %8.5f %8.5f %6s %6s %7.4f %7.0f  %s\n", pt->r.rpm,
              pt->r.speed_m_s, pt->r.J, pt->r.thrust_N, pt->r.torque_Nm, pt->r.power_W, pt->r.CT,
              pt->r.CP, eta, fm, pt->r.CT_over_sigma, pt->r.re_075, w);
      if (pt->banded) {
        char eb[64] = "";
        if (isfinite(pt->band.efficiency[0])) {
          snprintf(eb, sizeof eb, ", efficiency %.3f .. %.3f", pt->band.efficiency[0], pt->band.efficiency[1]);
        }
        fprintf(fp, "%8s N_crit %g .. %g: thrust %.4f .. %.4f N, power %.3f .. %.3f W%s%s\n", "", nc_lo,
                nc_hi, pt->band.thrust_N[0], pt->band.thrust_N[1], pt->band.power_W[0],
                pt->band.power_W[1], eb, pt->band.complete ? "" : " (not every N_crit converged)");
      }
      if (stations) {
        fprintf(fp, "    %7s %7s %7s %9s %6s %7s %8s %9s %11s  %s\n", "r/R", "alpha", "phi", "Re",
                "Mach", "cl", "cd", "dT/dr", "dQ/dr", "flags");
        for (size_t i = 0; i < rp.n_elements; i++) {
          const ascr_rotor_element *e = &pt->el[i];
          static const char *const trip[4] = {"", "trip-unbound(upper) ", "trip-unbound(lower) ",
                                              "trip-unbound(both) "};
          fprintf(fp, "    %7.4f %7.2f %7.2f %9.0f %6.3f %7.4f %8.5f %9.4f %11.6f  %s%s%s%s%s\n",
                  e->r_m / blade->r_tip_m, e->alpha_deg, e->phi_deg, e->re, e->mach, e->cl, e->cd,
                  e->dT_dr_N_m, e->dQ_dr_Nm_m, e->stalled ? "stalled " : "",
                  e->region == ASCR_TABLE_EXTENDED ? "beyond-polar " : "",
                  e->region == ASCR_TABLE_BRIDGED ? "bridged " : "",
                  e->re_outside ? "re-outside " : "", trip[e->trip_unbound & 3]);
        }
      }
    }
    fputc('\n', fp);
    for (size_t i = 0; rotor_cautions[i] != NULL; i++) fprintf(fp, "caution: %s\n", rotor_cautions[i]);
  }
done: /* one exit for the points, the tables, the blade and the collected output */
  free(pts);
  free(els);
  cli_tables_free(&tabs);
  ascr_blade_free(blade);
  if (rc != 0) {
    cli_output_discard(&out);
    return rc;
  }
  return cli_output_commit(&out);
}
