/* src/cli/cmd_polar.c
 * "airscrew polar": viscous polars of one section for several Reynolds and Mach numbers.
 */
#define _GNU_SOURCE
#include "cli.h"
#include "cli_figures.h"
#include "commands.h"


#include <getopt.h>
#include <jansson.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

static void polar_help(FILE *fp)
{
  fputs("usage: airscrew polar SECTION --re LIST --alpha START:END:STEP [options]\n"
        "\n"
        "Viscous polars: cl, cd, cm and transition against angle of attack, for every\n"
        "Reynolds number (and Mach number) in the lists. The sweep starts near zero lift\n"
        "and continues outward from each converged point, then reaches every angle from\n"
        "the other side too, and starts afresh at each angle: an angle with two converged\n"
        "states (hysteresis, a bubble that bursts, a layer separating at the trailing\n"
        "edge) is flagged with both. Points that do not converge are kept and\n"
        "flagged, never reported as results. With several Reynolds numbers a summary per\n"
        "Re follows (smallest cd, best L/D, cl_max, zero-lift angle, lift slope, the\n"
        "upper-surface bubble at a chosen cl; also in --json as re_summary).\n"
        "\n"
        "options:\n"
        "  -r, --re LIST          chord Reynolds numbers, comma separated (1e3 .. 1e8)\n"
        "  -a, --alpha A:B:STEP   angle range and step, degrees (e.g. -4:12:0.5)\n"
        "  -m, --mach LIST        free-stream Mach numbers, comma separated (0 .. 0.7; default 0)\n"
        "      --ncrit N          critical amplification exponent (default 9)\n"
        "      --ncrit-range LO:HI  also sweep at N_crit LO and HI and report the band each\n"
        "                         point spans over the three (transition uncertainty)\n"
        "      --turbulence PCT   free-stream turbulence in percent; sets N_crit (Mack 1977)\n"
        "      --transition NAME   N_crit of a named condition: quiet-air 11, tunnel 9, sanded 7,\n"
        "                         rotor-inflow 5, printed-rough 3 (common practice; user guide)\n"
        "      --trip-upper X     forced transition at x/c = X on the upper surface\n"
        "      --trip-lower X     forced transition at x/c = X on the lower surface\n"
        "  -p, --panels N         panels on the contour (default 160 up to Re 1e6, 240 above,\n"
        "                         320 above 6.5e6: a leading-edge transition needs them)\n"
        "      --json, --csv      machine-readable output\n"
        "  -o, --output FILE      write to FILE (whole or not at all)\n"
        "      --plot DIR         also draw the polars (cl-alpha, drag polar, cm-alpha, L/D;\n"
        "                         every Re and Mach on one figure) as DIR/polar.svg and .png,\n"
        "                         and with several Re the Reynolds-number study as\n"
        "                         DIR/polar-re.svg and .png\n"
        "      --bubble-cl CL     lift coefficient at which the Reynolds-number summary\n"
        "                         reports the upper-surface bubble (default 0.5)\n"
        "      --table FILE       also write the polars as a polar-table file (for rotor\n"
        "                         --polar-table; Mach 0 curves only)\n"
        "      --sweep-only       skip the fresh start at each angle (a half to a fifth of\n"
        "                         the time; second states only it reaches go unflagged)\n"
        "      --force            replace FILE if it exists\n"
        "  -h, --help             this help\n",
        fp);
}

typedef struct progress_ctx {
  double re, mach;
} progress_ctx;

static void progress(void *ctx, size_t done, size_t total)
{
  const progress_ctx *p = ctx;
  fprintf(stderr, "\rpolar Re %.0f Mach %.2f: %zu/%zu points", p->re, p->mach, done, total);
  if (done == total) fputc('\n', stderr);
  fflush(stderr);
}

/* the panel count of the polar at Re re: the one given (--panels), else the library's for re */
static size_t polar_panels(size_t given, double re)
{
  return given > 0 ? given : ascr_geom_panels_for_re(re);
}

/* 1 if every polar of the request has the same panel count */
static int panels_uniform(size_t panels, const double *res, size_t nre)
{
  for (size_t i = 1; i < nre; i++) {
    if (polar_panels(panels, res[i]) != polar_panels(panels, res[0])) return 0;
  }
  return 1;
}

int cmd_polar(int argc, char **argv)
{
  static const struct option opts[] = {
    {"re", required_argument, NULL, 'r'},        {"alpha", required_argument, NULL, 'a'},
    {"mach", required_argument, NULL, 'm'},      {"ncrit", required_argument, NULL, 'N'},
    {"turbulence", required_argument, NULL, 'T'}, {"transition", required_argument, NULL, 'W'}, {"trip-upper", required_argument, NULL, 'U'},
    {"trip-lower", required_argument, NULL, 'L'}, {"panels", required_argument, NULL, 'p'},
    {"json", no_argument, NULL, 'J'},            {"csv", no_argument, NULL, 'C'},
    {"output", required_argument, NULL, 'o'},    {"force", no_argument, NULL, 'F'},
    {"table", required_argument, NULL, 'B'},    {"plot", required_argument, NULL, 'P'},
    {"bubble-cl", required_argument, NULL, 'Q'}, {"ncrit-range", required_argument, NULL, 'G'},
    {"sweep-only", no_argument, NULL, 'S'},
    {"help", no_argument, NULL, 'h'},            {NULL, 0, NULL, 0}};
  cli_visc_opts vo;
  cli_visc_opts_init(&vo);
  double res[CLI_MAX_LIST], machs[CLI_MAX_LIST] = {0.0};
  size_t nre = 0, nmach = 1;
  double a0 = NAN, a1 = NAN, da = NAN, bubble_cl = 0.5, nc_lo = NAN, nc_hi = NAN;
  size_t panels = 0; /* 0: by Re (ascr_geom_panels_for_re) */
  int json = 0, csv = 0, force = 0, sweep_only = 0, c;
  const char *outpath = NULL, *tablepath = NULL, *plotdir = NULL;
  opterr = 0;
  cli_getopt_reset();
  while ((c = getopt_long(argc, argv, ":r:a:m:p:o:h", opts, NULL)) != -1) {
    switch (c) {
    case 'r':
      if (cli_parse_list("--re", optarg, 1e3, 1e8, res, &nre)) return CLI_EXIT_USAGE;
      break;
    case 'a':
      if (cli_parse_range("--alpha", optarg, -60.0, 60.0, &a0, &a1, &da)) return CLI_EXIT_USAGE;
      break;
    case 'm':
      if (cli_parse_list("--mach", optarg, 0.0, 0.7, machs, &nmach)) return CLI_EXIT_USAGE;
      break;
    case 'N': case 'T': case 'W': case 'U': case 'L':
      if (cli_visc_opts_parse(&vo, c, optarg)) return CLI_EXIT_USAGE;
      break;
    case 'p':
      if (cli_parse_size("--panels", optarg, 40, 400, &panels)) return CLI_EXIT_USAGE;
      break;
    case 'J': json = 1; break;
    case 'C': csv = 1; break;
    case 'o': outpath = optarg; break;
    case 'B': tablepath = optarg; break;
    case 'P': plotdir = optarg; break;
    case 'G':
      if (cli_parse_pair("--ncrit-range", optarg, 0.5, 20.0, &nc_lo, &nc_hi)) return CLI_EXIT_USAGE;
      break;
    case 'Q':
      if (cli_parse_double("--bubble-cl", optarg, -2.0, 3.0, &bubble_cl)) return CLI_EXIT_USAGE;
      break;
    case 'F': force = 1; break;
    case 'S': sweep_only = 1; break;
    case 'h': polar_help(stdout); return CLI_EXIT_OK;
    case ':': cli_error("polar: option %s needs a value", argv[optind - 1]); return CLI_EXIT_USAGE;
    default: cli_error("polar: unknown option '%s' (see airscrew polar --help)", argv[optind - 1]); return CLI_EXIT_USAGE;
    }
  }
  if (optind != argc - 1) {
    cli_error("polar: give exactly one SECTION (file or spec); see airscrew polar --help");
    return CLI_EXIT_USAGE;
  }
  if (nre == 0) {
    cli_error("polar: --re LIST is required");
    return CLI_EXIT_USAGE;
  }
  if (isnan(a0)) {
    cli_error("polar: --alpha START:END:STEP is required");
    return CLI_EXIT_USAGE;
  }
  if (json && csv) {
    cli_error("polar: --json and --csv exclude each other");
    return CLI_EXIT_USAGE;
  }
  if (tablepath != NULL) {
    /* before anything is computed (issue 17): the table holds the Mach 0 curves */
    int has0 = 0;
    for (size_t im = 0; im < nmach; im++) has0 |= machs[im] == 0.0;
    if (!has0) {
      cli_error("polar: --table needs Mach 0 among --mach");
      return CLI_EXIT_USAGE;
    }
  }
  if (cli_check_options_only) return CLI_EXIT_OK;
  /* every output checked before anything is computed, the plot folder (which is created) last */
  if (tablepath != NULL) {
    int prc = cli_output_check(tablepath, force); /* refuses an existing file */
    if (prc) return prc;
  }
  if (outpath != NULL) {
    int prc = cli_output_check(outpath, force);
    if (prc) return prc;
  }
  if (plotdir != NULL) {
    int prc = fig_prepare_dir(plotdir, (const char *const[]){"polar", nre > 1 ? "polar-re" : NULL, NULL},
                              force);
    if (prc) return prc;
  }
  cli_output out;
  int rc = cli_output_open(&out, outpath, force);
  if (rc) return rc;
  cli_analysis an;
  rc = cli_analysis_open(&an, argv[optind], polar_panels(panels, res[0]));
  if (rc) {
    cli_output_discard(&out);
    return rc;
  }
  size_t npts = ascr_polar_grid_size(a0, a1, da);
  ascr_polar_point *pts = calloc(npts * nre * nmach, sizeof *pts);
  ascr_polar_summary *sums = calloc(nre * nmach, sizeof *sums);
  ascr_polar_re_summary *rsum = calloc(nre * nmach, sizeof *rsum);
  /* the transition band: sweeps at the two ends of the N_crit range beside the nominal one */
  int banded = !isnan(nc_lo);
  ascr_polar_point *pts_end = banded ? calloc(2 * npts * nre * nmach, sizeof *pts_end) : NULL;
  ascr_polar_band *bands = banded ? calloc(npts * nre * nmach, sizeof *bands) : NULL;
  if (pts == NULL || sums == NULL || rsum == NULL || (banded && (pts_end == NULL || bands == NULL))) {
    free(pts);
    free(sums);
    free(rsum);
    free(pts_end);
    free(bands);
    cli_analysis_close(&an);
    cli_output_discard(&out);
    cli_error("out of memory");
    return CLI_EXIT_INTERNAL;
  }
  size_t total_conv = 0;
  int tty = cli_isatty(stderr);
  for (size_t im = 0; im < nmach && rc == 0; im++) {
    for (size_t ir = 0; ir < nre && rc == 0; ir++) {
      ascr_visc_params vp = cli_visc_params(&vo, res[ir], machs[im]);
      size_t want = polar_panels(panels, res[ir]);
      if (want != an.n_panels) {
        rc = cli_analysis_repanel(&an, want);
        if (rc != 0) break;
      }
      ascr_errbuf err;
      ascr_status st = ascr_visc_solver_set(an.visc, an.panel, &vp, &err);
      if (st != ASCR_OK) {
        cli_error("%s", err.msg);
        rc = cli_exit_for(st);
        break;
      }
      size_t k = im * nre + ir;
      progress_ctx pc = {res[ir], machs[im]};
      st = ascr_polar_sweep(an.visc, a0, a1, da, pts + k * npts, &sums[k], tty ? progress : NULL,
                            &pc, &err);
      if (st != ASCR_OK) {
        cli_error("%s", err.msg);
        rc = cli_exit_for(st);
        break;
      }
      /* the states a fresh start reaches that the sweep's walks do not: flagged as second
       * states (the sweep's state stays the result) */
      if (!sweep_only) st = ascr_polar_check_fresh(an.visc, pts + k * npts, npts, NULL, &err);
      if (st != ASCR_OK) {
        cli_error("%s", err.msg);
        rc = cli_exit_for(st);
        break;
      }
      total_conv += sums[k].n_converged;
      ascr_polar_re_summary_compute(pts + k * npts, npts, bubble_cl, &rsum[k], NULL);
      for (int e = 0; banded && e < 2 && rc == 0; e++) {
        ascr_visc_params ve = vp;
        ve.ncrit = e == 0 ? nc_lo : nc_hi;
        ascr_polar_summary se;
        ascr_polar_point *pe = pts_end + (2 * k + (size_t)e) * npts;
        st = ascr_visc_solver_set(an.visc, an.panel, &ve, &err);
        if (st == ASCR_OK) {
          st = ascr_polar_sweep(an.visc, a0, a1, da, pe, &se, tty ? progress : NULL, &pc, &err);
        }
        if (st != ASCR_OK) {
          cli_error("%s", err.msg);
          rc = cli_exit_for(st);
        }
      }
      if (banded && rc == 0) {
        const ascr_polar_point *runs[3] = {pts + k * npts, pts_end + 2 * k * npts,
                                           pts_end + (2 * k + 1) * npts};
        ascr_polar_band_compute(runs, 3, npts, bands + k * npts, NULL);
      }
      if (sums[k].n_converged < sums[k].n_points) {
        cli_warn("Re %.0f Mach %.3g: %zu of %zu points did not converge (flagged in the output)",
                 res[ir], machs[im], sums[k].n_points - sums[k].n_converged, sums[k].n_points);
        /* fewer panels asked for than the default at this Re (ascr_geom_panels_for_re: a
         * leading-edge transition interval too coarse for the young turbulent layer) */
        if (panels > 0 && panels < ascr_geom_panels_for_re(res[ir])) {
          cli_warn("at Re %.3g the leading edge needs finer panels: try --panels %zu", res[ir],
                   ascr_geom_panels_for_re(res[ir]));
        }
      }
    }
  }
  if (rc == 0 && total_conv == 0) {
    cli_error("polar: no point converged");
    rc = CLI_EXIT_ANALYSIS;
  }
  if (rc != 0) goto fail;
  FILE *fp = out.fp;
  const char *name = ascr_geom_section_name(an.section);
  if (tablepath != NULL) {
    /* the Mach 0 curves (tables apply Mach by correction), converged points with numbers */
    ascr_curve_data *cv = calloc(nre, sizeof *cv);
    double *buf = calloc(4 * npts * nre, sizeof *buf);
    int *ok = calloc(npts * nre, sizeof *ok), *tn = calloc(npts * nre, sizeof *tn);
    size_t im0 = 0;
    while (im0 < nmach && machs[im0] != 0.0) im0++;
    if (cv == NULL || buf == NULL || ok == NULL || tn == NULL || im0 == nmach) {
      if (im0 == nmach) cli_error("polar: --table needs Mach 0 among --mach");
      else cli_error("out of memory");
      rc = im0 == nmach ? CLI_EXIT_USAGE : CLI_EXIT_INTERNAL;
    }
    for (size_t ir = 0; rc == 0 && ir < nre; ir++) {
      ascr_visc_params vp = cli_visc_params(&vo, res[ir], 0.0);
      size_t k = im0 * nre + ir;
      cv[ir].re = res[ir];
      cv[ir].mach = 0.0;
      cv[ir].ncrit = vp.ncrit;
      cv[ir].trip_upper = vp.trip_upper;
      cv[ir].trip_lower = vp.trip_lower;
      cv[ir].n = npts;
      cv[ir].alpha_deg = buf + (4 * ir + 0) * npts;
      cv[ir].cl = buf + (4 * ir + 1) * npts;
      cv[ir].cd = buf + (4 * ir + 2) * npts;
      cv[ir].cm = buf + (4 * ir + 3) * npts;
      cv[ir].converged = ok + ir * npts;
      cv[ir].trip_not_applied = tn + ir * npts;
      for (size_t i = 0; i < npts; i++) {
        const ascr_polar_point *q = &pts[k * npts + i];
        cv[ir].alpha_deg[i] = q->alpha_deg;
        cv[ir].converged[i] = q->converged;
        cv[ir].trip_not_applied[i] = q->converged ? q->trip_not_applied & 3 : 0;
        cv[ir].cl[i] = q->cl;
        cv[ir].cd[i] = q->cd;
        cv[ir].cm[i] = q->cm;
      }
    }
    ascr_errbuf err;
    char *text = NULL;
    size_t tlen = 0;
    if (rc == 0 && ascr_table_file_format(name, NULL, cv, nre, &text, &tlen, &err) != ASCR_OK) {
      cli_error("%s", err.msg);
      rc = CLI_EXIT_INTERNAL;
    }
    if (rc == 0) rc = cli_write_atomic(tablepath, text, tlen, force);
    free(text);
    free(cv);
    free(buf);
    free(ok);
    free(tn);
    if (rc != 0) goto fail;
  }
  if (json) {
    json_t *o = json_object(), *pl = json_array();
    json_object_set_new(o, "section", json_string(name));
    /* the panel count: per polar (it follows Re unless --panels is given), and at the top
     * where every polar has the same */
    if (panels_uniform(panels, res, nre)) {
      json_object_set_new(o, "n_panels", json_integer((json_int_t)polar_panels(panels, res[0])));
    }
    for (size_t im = 0; im < nmach; im++) {
      for (size_t ir = 0; ir < nre; ir++) {
        size_t k = im * nre + ir;
        ascr_visc_params vp = cli_visc_params(&vo, res[ir], machs[im]);
        json_t *po = json_object(), *pa = json_array();
        json_object_set_new(po, "re", json_real(res[ir]));
        json_object_set_new(po, "mach", json_real(machs[im]));
        json_object_set_new(po, "ncrit", json_real(vp.ncrit));
        json_object_set_new(po, "n_panels", json_integer((json_int_t)polar_panels(panels, res[ir])));
        if (banded) {
          json_t *nr = json_array();
          json_array_append_new(nr, json_real(nc_lo));
          json_array_append_new(nr, json_real(nc_hi));
          json_object_set_new(po, "ncrit_range", nr);
        }
        json_object_set_new(po, "trip_upper", vp.trip_upper <= 1.0 ? json_real(vp.trip_upper) : json_null());
        json_object_set_new(po, "trip_lower", vp.trip_lower <= 1.0 ? json_real(vp.trip_lower) : json_null());
        json_object_set_new(po, "converged_points", json_integer((json_int_t)sums[k].n_converged));
        json_object_set_new(po, "cl_max", cli_json_num(sums[k].n_converged > 0, sums[k].cl_max));
        json_object_set_new(po, "alpha_cl_max_deg", cli_json_num(sums[k].n_converged > 0, sums[k].alpha_cl_max_deg));
        json_object_set_new(po, "stall_seen", json_boolean(sums[k].stall));
        for (size_t i = 0; i < npts; i++) {
          const ascr_polar_point *q = &pts[k * npts + i];
          int ok = q->converged;
          json_t *pt = json_object();
          json_object_set_new(pt, "alpha_deg", json_real(q->alpha_deg));
          json_object_set_new(pt, "cl", cli_json_num(ok, q->cl));
          json_object_set_new(pt, "cd", cli_json_num(ok, q->cd));
          json_object_set_new(pt, "cdf", cli_json_num(ok, q->cdf));
          json_object_set_new(pt, "cdp", cli_json_num(ok, q->cdp));
          json_object_set_new(pt, "cm", cli_json_num(ok, q->cm));
          json_object_set_new(pt, "x_transition_upper", cli_json_num(ok, q->x_transition_upper));
          json_object_set_new(pt, "x_transition_lower", cli_json_num(ok, q->x_transition_lower));
          json_object_set_new(pt, "converged", json_boolean(ok));
          json_object_set_new(pt, "iterations", json_integer(q->iterations));
          json_object_set_new(pt, "bistable", json_boolean(ok && q->bistable));
          if (vp.trip_upper <= 1.0 || vp.trip_lower <= 1.0) {
            /* a trip ahead of the stagnation point binds nothing: said per point */
            json_t *tn = json_array();
            if (ok && (q->trip_not_applied & 1)) json_array_append_new(tn, json_string("upper"));
            if (ok && (q->trip_not_applied & 2)) json_array_append_new(tn, json_string("lower"));
            json_object_set_new(pt, "trip_not_applied", tn);
          }
          if (banded) {
            const ascr_polar_band *bq = &bands[k * npts + i];
            json_t *cb = json_array(), *db = json_array(), *mb = json_array();
            int has = bq->n_converged > 0;
            json_array_append_new(cb, cli_json_num(has, bq->cl_lo));
            json_array_append_new(cb, cli_json_num(has, bq->cl_hi));
            json_array_append_new(db, cli_json_num(has, bq->cd_lo));
            json_array_append_new(db, cli_json_num(has, bq->cd_hi));
            json_array_append_new(mb, cli_json_num(has, bq->cm_lo));
            json_array_append_new(mb, cli_json_num(has, bq->cm_hi));
            json_object_set_new(pt, "cl_band", cb);
            json_object_set_new(pt, "cd_band", db);
            json_object_set_new(pt, "cm_band", mb);
            json_object_set_new(pt, "band_complete", json_boolean(bq->n_converged == bq->n_runs));
          }
          if (ok && q->bistable) {
            json_t *os = json_object();
            json_object_set_new(os, "cl", json_real(q->other_cl));
            json_object_set_new(os, "cd", json_real(q->other_cd));
            json_object_set_new(os, "cm", json_real(q->other_cm));
            json_object_set_new(pt, "other_state", os);
          }
          json_array_append_new(pa, pt);
        }
        json_object_set_new(po, "points", pa);
        json_array_append_new(pl, po);
      }
    }
    json_object_set_new(o, "polars", pl);
    json_t *ra = json_array();
    for (size_t im = 0; im < nmach; im++) {
      for (size_t ir = 0; ir < nre; ir++) {
        const ascr_polar_re_summary *q = &rsum[im * nre + ir];
        json_t *ro = json_object();
        json_object_set_new(ro, "re", json_real(res[ir]));
        json_object_set_new(ro, "mach", json_real(machs[im]));
        json_object_set_new(ro, "converged_points", json_integer((json_int_t)q->n_converged));
        json_object_set_new(ro, "cd_min", cli_json_num(1, q->cd_min));
        json_object_set_new(ro, "cl_at_cd_min", cli_json_num(1, q->cl_at_cd_min));
        json_object_set_new(ro, "alpha_at_cd_min_deg", cli_json_num(1, q->alpha_at_cd_min_deg));
        json_object_set_new(ro, "ld_max", cli_json_num(1, q->ld_max));
        json_object_set_new(ro, "cl_at_ld_max", cli_json_num(1, q->cl_at_ld_max));
        json_object_set_new(ro, "alpha_at_ld_max_deg", cli_json_num(1, q->alpha_at_ld_max_deg));
        json_object_set_new(ro, "cl_max", cli_json_num(1, q->cl_max));
        json_object_set_new(ro, "alpha_cl_max_deg", cli_json_num(1, q->alpha_cl_max_deg));
        json_object_set_new(ro, "alpha_zero_lift_deg", cli_json_num(1, q->alpha_zero_lift_deg));
        json_object_set_new(ro, "lift_slope_per_deg", cli_json_num(1, q->lift_slope_per_deg));
        json_t *bo = json_object();
        json_object_set_new(bo, "cl", json_real(q->bubble_cl));
        json_object_set_new(bo, "status", json_string(q->bubble_status > 0 ? "closed" :
                                                      q->bubble_status == 0 ? "not closed" :
                                                      "cl not reached"));
        json_object_set_new(bo, "x_separation_upper", cli_json_num(1, q->x_separation_upper));
        json_object_set_new(bo, "x_reattach_upper", cli_json_num(1, q->x_reattach_upper));
        json_object_set_new(ro, "bubble", bo);
        json_array_append_new(ra, ro);
      }
    }
    json_object_set_new(o, "re_summary", ra);
    json_object_set_new(o, "note", json_string(CLI_ESTIMATE_NOTE));
    json_dumpf(o, fp, JSON_REAL_PRECISION(10) | JSON_COMPACT);
    fputc('\n', fp);
    json_decref(o);
  } else if (csv) {
    fprintf(fp, "# section: %s\n# note: %s\n", name, CLI_ESTIMATE_NOTE);
    /* what a reader wants first: the angle, lift, drag, their ratio, the moment; then where
     * transition is; then the drag split (issue 17) */
    fputs("re,mach,ncrit,alpha_deg,cl,cd,ld,cm,x_transition_upper,x_transition_lower,cdf,cdp,"
          "converged,bistable", fp);
    if (banded) fputs(",ncrit_lo,ncrit_hi,cl_lo,cl_hi,cd_lo,cd_hi,band_complete", fp);
    ascr_visc_params vp0 = cli_visc_params(&vo, res[0], machs[0]);
    int tripped = vp0.trip_upper <= 1.0 || vp0.trip_lower <= 1.0;
    if (tripped) fputs(",trip_not_applied", fp);
    fputc('\n', fp);
    for (size_t im = 0; im < nmach; im++) {
      for (size_t ir = 0; ir < nre; ir++) {
        size_t k = im * nre + ir;
        ascr_visc_params vp = cli_visc_params(&vo, res[ir], machs[im]);
        for (size_t i = 0; i < npts; i++) {
          const ascr_polar_point *q = &pts[k * npts + i];
          fprintf(fp, "%.6g,%.4g,%.4g,%.4f,", res[ir], machs[im], vp.ncrit, q->alpha_deg);
          if (q->converged) {
            fprintf(fp, "%.6f,%.6f,%.4f,%.6f,", q->cl, q->cd, q->cl / q->cd, q->cm);
            if (isfinite(q->x_transition_upper)) fprintf(fp, "%.5f", q->x_transition_upper);
            fputc(',', fp);
            if (isfinite(q->x_transition_lower)) fprintf(fp, "%.5f", q->x_transition_lower);
            fprintf(fp, ",%.6f,%.6f", q->cdf, q->cdp);
            fputs(q->bistable ? ",true,true" : ",true,false", fp);
          } else {
            fputs(",,,,,,,,false,false", fp);
          }
          if (banded) {
            const ascr_polar_band *bq = &bands[k * npts + i];
            fprintf(fp, ",%.4g,%.4g,", nc_lo, nc_hi);
            if (bq->n_converged > 0) {
              fprintf(fp, "%.6f,%.6f,%.6f,%.6f", bq->cl_lo, bq->cl_hi, bq->cd_lo, bq->cd_hi);
            } else {
              fputs(",,,", fp);
            }
            fputs(bq->n_converged == bq->n_runs ? ",true" : ",false", fp);
          }
          if (tripped) {
            static const char *const which[4] = {"", "upper", "lower", "upper lower"};
            fprintf(fp, ",%s", q->converged ? which[q->trip_not_applied & 3] : "");
          }
          fputc('\n', fp);
        }
      }
    }
  } else {
    size_t n_partial = 0;
    int mixed = !panels_uniform(panels, res, nre);
    if (mixed) fprintf(fp, "section   %s  (panels by Re, given with each)\n", name);
    else fprintf(fp, "section   %s  (%zu panels)\n", name, polar_panels(panels, res[0]));
    for (size_t im = 0; im < nmach; im++) {
      for (size_t ir = 0; ir < nre; ir++) {
        size_t k = im * nre + ir;
        ascr_visc_params vp = cli_visc_params(&vo, res[ir], machs[im]);
        fprintf(fp, "\nRe %.0f   Mach %.3g   N_crit %.3g", res[ir], machs[im], vp.ncrit);
        if (banded) fprintf(fp, " (band over N_crit %.3g, %.3g, %.3g)", nc_lo, vp.ncrit, nc_hi);
        if (vp.trip_upper <= 1.0) fprintf(fp, "   trip upper x/c %.3f", vp.trip_upper);
        if (vp.trip_lower <= 1.0) fprintf(fp, "   trip lower x/c %.3f", vp.trip_lower);
        if (mixed) fprintf(fp, "   %zu panels", polar_panels(panels, res[ir]));
        fprintf(fp, "\n%8s %8s %9s %6s %8s %9s %9s %9s %9s", "alpha", "cl", "cd", "L/D", "cm",
                "trans_up", "trans_lo", "cdf", "cdp");
        if (banded) fprintf(fp, " %14s %16s", "cl band", "cd band");
        fputc('\n', fp);
        for (size_t i = 0; i < npts; i++) {
          const ascr_polar_point *q = &pts[k * npts + i];
          if (!q->converged) {
            fprintf(fp, "%8.2f   not converged\n", q->alpha_deg);
            continue;
          }
          char tu[16], tl[16];
          /* "none": laminar to the trailing edge, said the same way in every text output */
          snprintf(tu, sizeof tu, isfinite(q->x_transition_upper) ? "%.3f" : "none", q->x_transition_upper);
          snprintf(tl, sizeof tl, isfinite(q->x_transition_lower) ? "%.3f" : "none", q->x_transition_lower);
          fprintf(fp, "%8.2f %8.4f %9.5f %6.1f %8.4f %9s %9s %9.5f %9.5f", q->alpha_deg, q->cl,
                  q->cd, q->cl / q->cd, q->cm, tu, tl, q->cdf, q->cdp);
          if (banded) {
            const ascr_polar_band *bq = &bands[k * npts + i];
            fprintf(fp, "  %6.4f-%6.4f %7.5f-%7.5f%s", bq->cl_lo, bq->cl_hi, bq->cd_lo, bq->cd_hi,
                    bq->n_converged < bq->n_runs ? " *" : "");
            n_partial += bq->n_converged < bq->n_runs;
          }
          fputc('\n', fp);
          if (q->bistable) {
            fprintf(fp, "%8s two states: the other converges to cl %.4f, cd %.5f, cm %.4f\n",
                    "", q->other_cl, q->other_cd, q->other_cm);
          }
          for (int sd = 0; sd < 2; sd++) {
            if (q->trip_not_applied & (1 << sd)) {
              fprintf(fp, "%8s the %s trip lies ahead of the stagnation point: not applied, "
                      "transition there is free\n", "", sd == 0 ? "upper" : "lower");
            }
          }
        }
        if (sums[k].n_converged > 0) {
          fprintf(fp, "cl_max %.4f at %.2f deg%s; %zu of %zu points converged\n", sums[k].cl_max,
                  sums[k].alpha_cl_max_deg, sums[k].stall ? " (stall seen)" : " (no stall within the range)",
                  sums[k].n_converged, sums[k].n_points);
        }
      }
    }
    if (nre > 1) {
      for (size_t im = 0; im < nmach; im++) {
        fprintf(fp, "\nReynolds-number summary, Mach %.3g (upper-surface bubble at cl %.3g)\n",
                machs[im], bubble_cl);
        fprintf(fp, "%10s %9s %7s %7s %7s %7s %7s %8s %9s %15s\n", "Re", "cd_min", "at cl",
                "L/D max", "at cl", "cl_max", "at deg", "alpha_0", "slope/deg", "bubble x/c");
        for (size_t ir = 0; ir < nre; ir++) {
          const ascr_polar_re_summary *q = &rsum[im * nre + ir];
          char f[9][16], bub[32];
          const double vals[9] = {q->cd_min, q->cl_at_cd_min, q->ld_max, q->cl_at_ld_max,
                                  q->cl_max, q->alpha_cl_max_deg, q->alpha_zero_lift_deg,
                                  q->lift_slope_per_deg, 0.0};
          static const char *const fmts[9] = {"%.5f", "%.3f", "%.1f", "%.3f", "%.3f", "%.2f",
                                              "%.2f", "%.4f", ""};
          for (int j = 0; j < 8; j++) {
            if (isfinite(vals[j])) snprintf(f[j], sizeof f[j], fmts[j], vals[j]);
            else snprintf(f[j], sizeof f[j], "-");
          }
          if (q->bubble_status > 0) {
            snprintf(bub, sizeof bub, "%.3f-%.3f", q->x_separation_upper, q->x_reattach_upper);
          } else if (q->bubble_status == 0 && isfinite(q->x_separation_upper)) {
            snprintf(bub, sizeof bub, "open from %.3f", q->x_separation_upper);
          } else {
            snprintf(bub, sizeof bub, q->bubble_status == 0 ? "none" : "cl not reached");
          }
          fprintf(fp, "%10.0f %9s %7s %7s %7s %7s %7s %8s %9s %15s\n", res[ir], f[0], f[1], f[2],
                  f[3], f[4], f[5], f[6], f[7], bub);
        }
      }
      fputs("(cd_min, L/D max: the grid point; cl_max: the first peak of the lift curve; slope: "
            "fitted\nwithin alpha_0 -2 .. +4 deg; '-': not determined by the converged points)\n", fp);
    }
    fputs("\ntrans_up, trans_lo: x/c of transition on each surface; none: laminar to the trailing "
          "edge\n", fp);
    int any_two = 0;
    for (size_t i = 0; i < npts * nre * nmach && !any_two; i++) any_two = pts[i].converged && pts[i].bistable;
    if (any_two) {
      fputs("two states: the equations converge to a second state at that angle too (reached from the\n"
            "other side of the sweep or by a fresh start); the row is the sweep's, the method does not\n"
            "decide between them\n", fp);
    }
    if (banded) {
      fputs("\nband: the least and largest value over the sweeps at the ends of the N_crit range and "
            "the\nnominal one (the transition uncertainty, not an error bar of the method)", fp);
      if (n_partial > 0) fprintf(fp, "; * %zu band(s) from fewer sweeps: not every sweep converged there", n_partial);
      fputc('\n', fp);
    }
    fprintf(fp, "\nnote: %s\n", CLI_ESTIMATE_NOTE);
  }
  if (plotdir != NULL) {
    size_t nk = nre * nmach;
    fig_polar *fp2 = calloc(nk, sizeof *fp2);
    double *buf = calloc((banded ? 12 : 4) * npts * nk + 1, sizeof *buf);
    if (fp2 == NULL || buf == NULL) {
      cli_error("out of memory");
      rc = CLI_EXIT_INTERNAL;
    }
    for (size_t k = 0; rc == 0 && k < nk; k++) {
      fig_polar *f = &fp2[k];
      f->n = npts;
      f->alpha = buf + (4 * k) * npts;
      f->cl = f->alpha + npts;
      f->cd = f->cl + npts;
      f->cm = f->cd + npts;
      for (size_t i = 0; i < npts; i++) {
        const ascr_polar_point *q = &pts[k * npts + i];
        f->alpha[i] = q->alpha_deg;
        f->cl[i] = q->converged ? q->cl : NAN;
        f->cd[i] = q->converged ? q->cd : NAN;
        f->cm[i] = q->converged ? q->cm : NAN;
      }
      if (banded) {
        double *bb = buf + 4 * npts * nk + 8 * npts * k;
        double **dst[8] = {&f->cl_lo, &f->cl_hi, &f->cd_lo, &f->cd_hi,
                           &f->cm_lo, &f->cm_hi, &f->ld_lo, &f->ld_hi};
        for (int j = 0; j < 8; j++) *dst[j] = bb + (size_t)j * npts;
        for (size_t i = 0; i < npts; i++) {
          const ascr_polar_band *bq = &bands[k * npts + i];
          f->cl_lo[i] = bq->cl_lo;
          f->cl_hi[i] = bq->cl_hi;
          f->cd_lo[i] = bq->cd_lo;
          f->cd_hi[i] = bq->cd_hi;
          f->cm_lo[i] = bq->cm_lo;
          f->cm_hi[i] = bq->cm_hi;
          f->ld_lo[i] = bq->ld_lo;
          f->ld_hi[i] = bq->ld_hi;
        }
      }
      ascr_visc_params vp = cli_visc_params(&vo, res[k % nre], machs[k / nre]);
      if (banded) {
        snprintf(f->label, sizeof f->label, "Re %.0f, M %.2g, N#dcrit#u %.3g (band %.3g-%.3g)",
                 res[k % nre], machs[k / nre], vp.ncrit, nc_lo, nc_hi);
      } else {
        snprintf(f->label, sizeof f->label, "Re %.0f, M %.2g, N#dcrit#u %.3g", res[k % nre],
                 machs[k / nre], vp.ncrit);
      }
    }
    if (rc == 0) rc = fig_polars(plotdir, name, fp2, nk);
    free(fp2);
    free(buf);
    if (rc != 0) goto fail;
    if (nre > 1) {
      fig_re_series *fs = calloc(nmach, sizeof *fs);
      double *rb = calloc(8 * nk, sizeof *rb);
      if (fs == NULL || rb == NULL) {
        cli_error("out of memory");
        rc = CLI_EXIT_INTERNAL;
      }
      for (size_t im = 0; rc == 0 && im < nmach; im++) {
        double *b = rb + 8 * nre * im;
        for (size_t ir = 0; ir < nre; ir++) {
          const ascr_polar_re_summary *q = &rsum[im * nre + ir];
          b[ir] = res[ir];
          b[nre + ir] = q->cd_min;
          b[2 * nre + ir] = q->ld_max;
          b[3 * nre + ir] = q->cl_max;
          b[4 * nre + ir] = q->alpha_zero_lift_deg;
          b[5 * nre + ir] = q->lift_slope_per_deg;
          b[6 * nre + ir] = q->x_separation_upper;
          b[7 * nre + ir] = q->bubble_status > 0 ? q->x_reattach_upper : NAN;
        }
        fig_re_series_bind(&fs[im], machs[im], nre, b);
      }
      if (rc == 0) rc = fig_re_study(plotdir, name, bubble_cl, fs, nmach);
      free(fs);
      free(rb);
      if (rc != 0) goto fail;
    }
  }
  free(pts);
  free(sums);
  free(rsum);
  free(pts_end);
  free(bands);
  cli_analysis_close(&an);
  return cli_output_commit(&out);

fail: /* an error was printed: nothing is written */
  free(pts);
  free(sums);
  free(rsum);
  free(pts_end);
  free(bands);
  cli_analysis_close(&an);
  cli_output_discard(&out);
  return rc;
}
