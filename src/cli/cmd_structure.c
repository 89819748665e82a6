/* src/cli/cmd_structure.c
 * "airscrew structure": a blade's mass, stiffness, stresses under its centrifugal and air loads,
 * and its rotating modes over an rpm range with their crossings of the engine orders (library:
 * ascr_structure.h).
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

#define STRUCT_MAX_RPM 64
#define STRUCT_MAX_CROSS 256

static void structure_help(FILE *fp)
{
  fputs("usage: airscrew structure BLADE.json MATERIAL.json --rpm VALUES [options]\n"
        "\n"
        "The blade as a solid part of the material: its mass and centre of mass, section\n"
        "properties and stiffness along the span, the centrifugal force and the air loads of\n"
        "one operating point (BEMT) with the largest combined stress, the safety factor against\n"
        "the material's strength and the static tip deflection; and the flap, lag and torsion\n"
        "frequencies of the rotating blade at every rpm asked, with their crossings of the\n"
        "engine orders 1P .. (2 x blades)P inside the range (a Campbell diagram with --plot).\n"
        "\n"
        "  -r, --rpm VALUES        rpm of the modes: a list or START:END:STEP (at most 64)\n"
        "  -v, --speed V           axial airspeed of the load point, m/s (default 0)\n"
        "      --load-rpm N        rpm of the load point (default the highest of --rpm)\n"
        "      --stations N        structural stations, root to tip (default 41; 3 .. 401)\n"
        "      --json              JSON output        -o, --output FILE   write to FILE\n"
        "      --plot DIR          the Campbell diagram as DIR/structure.svg and .png\n"
        "      --force             replace FILE or the figures if they exist\n"
        CLI_ROTOR_OPTS_HELP
        "  -h, --help              this help\n"
        "\n"
        "Estimates: a solid, isotropic blade clamped at its first station, uncoupled modes, the\n"
        "material's typical values. Printed parts vary with orientation, layer bonding and cure:\n"
        "test a new blade on a guarded stand before flight, behind a shield at full rpm.\n",
        fp);
}

static const char *const fam_name[3] = {"flap", "lag", "torsion"};

static json_t *hz_list(const double *v, size_t n)
{
  json_t *a = json_array();
  for (size_t i = 0; i < n; i++) json_array_append_new(a, cli_json_num(isfinite(v[i]), v[i]));
  return a;
}

int cmd_structure(int argc, char **argv)
{
  static const struct option opts[] = {
    {"rpm", required_argument, NULL, 'r'},       {"speed", required_argument, NULL, 'v'},
    {"load-rpm", required_argument, NULL, 'R'},  {"stations", required_argument, NULL, 'n'},
    CLI_ROTOR_LONGOPTS,
    {"json", no_argument, NULL, 'J'},            {"output", required_argument, NULL, 'o'},
    {"force", no_argument, NULL, 'F'},           {"plot", required_argument, NULL, 'G'},
    {"help", no_argument, NULL, 'h'},            {NULL, 0, NULL, 0}};
  double rpms[STRUCT_MAX_RPM], speed = 0.0, load_rpm = NAN;
  size_t nrpm = 0, nst = 41;
  int json = 0, force = 0, c;
  const char *outpath = NULL, *plotdir = NULL;
  cli_rotor_opts ro;
  cli_rotor_opts_init(&ro);
  opterr = 0;
  cli_getopt_reset();
  while ((c = getopt_long(argc, argv, ":r:v:i:p:e:o:h", opts, NULL)) != -1) {
    switch (c) {
    case 'r': if (cli_parse_values("--rpm", optarg, 1.0, 1e6, STRUCT_MAX_RPM, rpms, &nrpm)) return CLI_EXIT_USAGE; break;
    case 'v': if (cli_parse_double("--speed", optarg, 0.0, 300.0, &speed)) return CLI_EXIT_USAGE; break;
    case 'R': if (cli_parse_double("--load-rpm", optarg, 1.0, 1e6, &load_rpm)) return CLI_EXIT_USAGE; break;
    case 'n': if (cli_parse_size("--stations", optarg, 3, ASCR_STRUCTURE_MAX_STATIONS, &nst)) return CLI_EXIT_USAGE; break;
    case 'J': json = 1; break;
    case 'o': outpath = optarg; break;
    case 'F': force = 1; break;
    case 'G': plotdir = optarg; break;
    case 'h': structure_help(stdout); return CLI_EXIT_OK;
    case ':': cli_error("structure: option %s needs a value", argv[optind - 1]); return CLI_EXIT_USAGE;
    default: {
      int r = cli_rotor_opts_parse(&ro, c, optarg);
      if (r == 0) break;
      if (r < 0) cli_error("structure: unknown option '%s' (see airscrew structure --help)", argv[optind - 1]);
      return CLI_EXIT_USAGE;
    }
    }
  }
  if (optind != argc - 2) {
    cli_error("structure: give a BLADE file and a MATERIAL file; see airscrew structure --help");
    return CLI_EXIT_USAGE;
  }
  if (nrpm == 0) {
    cli_error("structure: --rpm VALUES is required (the rpm of the modes)");
    return CLI_EXIT_USAGE;
  }
  for (size_t i = 1; i < nrpm; i++) {
    if (!(rpms[i] > rpms[i - 1])) {
      cli_error("structure: --rpm: give the values in ascending order");
      return CLI_EXIT_USAGE;
    }
  }
  if (cli_rotor_opts_model(&ro) != ASCR_INFLOW_BEMT) {
    cli_error("structure: the load point is computed with the BEMT; --inflow does not apply");
    return CLI_EXIT_USAGE;
  }
  int rc = cli_rotor_opts_finish(&ro, "structure");
  if (rc) return rc;
  if (isnan(load_rpm)) load_rpm = rpms[nrpm - 1];
  if (cli_check_options_only) return CLI_EXIT_OK;
  if (outpath != NULL && (rc = cli_output_check(outpath, force)) != 0) return rc;
  if (plotdir != NULL && (rc = fig_prepare_dir(plotdir, (const char *const[]){"structure", NULL}, force)) != 0) {
    return rc;
  }
  cli_output out;
  if ((rc = cli_output_open(&out, outpath, force)) != 0) return rc;
  const char *bfile = argv[optind], *mfile = argv[optind + 1];
  ascr_blade *blade = NULL;
  ascr_material mat;
  ascr_errbuf err;
  ascr_geom_section **secs = NULL;
  size_t nsec = 0;
  ascr_structure_station *st = calloc(nst, sizeof *st);
  ascr_rotor_element *el = NULL;
  ascr_blade_modes md[STRUCT_MAX_RPM];
  ascr_campbell_crossing cross[STRUCT_MAX_CROSS];
  cli_tables tabs;
  memset(&tabs, 0, sizeof tabs);
  ascr_status s = ascr_blade_read(bfile, &blade, &err);
  if (s == ASCR_OK) s = ascr_material_read(mfile, &mat, &err);
  if (s == ASCR_OK) {
    nsec = blade->n_sections;
    secs = calloc(nsec + 1, sizeof *secs);
    if (secs == NULL) s = ASCR_ENOMEM;
  }
  for (size_t i = 0; s == ASCR_OK && i < nsec; i++) {
    s = ascr_geom_section_open(blade->section_source[i], &secs[i], &err);
  }
  if (s != ASCR_OK || st == NULL) {
    cli_error("%s", st == NULL || s == ASCR_ENOMEM ? "out of memory" : err.msg);
    rc = st == NULL || s == ASCR_ENOMEM ? CLI_EXIT_INTERNAL : CLI_EXIT_INPUT;
    goto done;
  }
  /* the load point: the BEMT's spanwise loads */
  rc = cli_tables_prepare(blade, &ro.rp, load_rpm, load_rpm, speed, speed, &ro.to, &tabs);
  if (rc) goto done;
  el = calloc(ro.rp.n_elements, sizeof *el);
  if (el == NULL) {
    cli_error("out of memory");
    rc = CLI_EXIT_INTERNAL;
    goto done;
  }
  ascr_rotor_result lp;
  s = ascr_rotor_bemt(blade, (const ascr_polar_table *const *)tabs.tables, &ro.rp, load_rpm, speed, &lp, el, &err);
  if (s != ASCR_OK || !lp.converged) {
    cli_error("structure: the load point (%g rpm, %g m/s) did not converge%s%s", load_rpm, speed,
              s != ASCR_OK ? ": " : "", s != ASCR_OK ? err.msg : "");
    rc = CLI_EXIT_ANALYSIS;
    goto done;
  }
  ascr_structure_summary sum;
  s = ascr_blade_structure(blade, (const ascr_geom_section *const *)secs, &mat, load_rpm, el,
                           ro.rp.n_elements, nst, st, &sum, &err);
  for (size_t k = 0; s == ASCR_OK && k < nrpm; k++) s = ascr_blade_modes_at(st, nst, rpms[k], NULL, &md[k], &err);
  if (s != ASCR_OK) {
    cli_error("%s", err.msg);
    rc = s == ASCR_EINVAL || s == ASCR_EGEOM ? CLI_EXIT_INPUT : cli_exit_for(s);
    goto done;
  }
  int max_order = 2 * blade->n_blades;
  size_t ncross = ascr_campbell_crossings(md, nrpm, max_order, cross, STRUCT_MAX_CROSS);
  if (ncross > STRUCT_MAX_CROSS) ncross = STRUCT_MAX_CROSS;
  const char *bname = blade->name != NULL ? blade->name : bfile;
  if (plotdir != NULL && (rc = fig_campbell(plotdir, bname, md, nrpm, max_order)) != 0) goto done;
  FILE *fp = out.fp;
  if (json) {
    json_t *o = json_object(), *sa = json_array(), *ma = json_array(), *ca = json_array();
    json_object_set_new(o, "blade", json_string(bname));
    json_object_set_new(o, "material", json_string(mat.name));
    json_object_set_new(o, "mass_kg", json_real(sum.mass_kg));
    json_object_set_new(o, "volume_m3", json_real(sum.volume_m3));
    json_object_set_new(o, "cg_r_m", json_real(sum.cg_r_m));
    json_object_set_new(o, "load_point", json_pack("{s:f, s:f, s:f, s:f}", "rpm", load_rpm, "speed_m_s",
                                                   speed, "thrust_N", lp.thrust_N, "power_W", lp.power_W));
    json_object_set_new(o, "root_centrifugal_N", json_real(sum.root_centrifugal_N));
    json_object_set_new(o, "max_stress_Pa", json_real(sum.max_stress_pa));
    json_object_set_new(o, "max_stress_r_m", json_real(sum.max_stress_r_m));
    json_object_set_new(o, "safety_factor", json_real(sum.safety_factor));
    json_object_set_new(o, "fatigue_factor", cli_json_num(isfinite(sum.fatigue_factor), sum.fatigue_factor));
    json_object_set_new(o, "tip_deflection_m", json_real(sum.tip_deflection_m));
    json_object_set_new(o, "tip_pitch_change_deg", json_real(sum.tip_pitch_change_deg));
    json_object_set_new(o, "tip_pitch_change_air_deg", json_real(sum.tip_pitch_change_air_deg));
    for (size_t i = 0; i < nst; i++) {
      const ascr_structure_station *q = &st[i];
      json_t *so = json_object();
      json_object_set_new(so, "r_m", json_real(q->r_m));
      json_object_set_new(so, "chord_m", json_real(q->chord_m));
      json_object_set_new(so, "area_m2", json_real(q->props.area));
      json_object_set_new(so, "EI_flap_Nm2", json_real(q->ei_flap_nm2));
      json_object_set_new(so, "EI_lag_Nm2", json_real(q->ei_lag_nm2));
      json_object_set_new(so, "GJ_Nm2", json_real(q->gj_nm2));
      json_object_set_new(so, "mass_per_length_kg_m", json_real(q->mass_per_length_kg_m));
      json_object_set_new(so, "centrifugal_N", json_real(q->centrifugal_force_N));
      json_object_set_new(so, "moment_flap_Nm", json_real(q->moment_flap_Nm));
      json_object_set_new(so, "moment_lag_Nm", json_real(q->moment_lag_Nm));
      json_object_set_new(so, "moment_twist_Nm", json_real(q->moment_twist_Nm));
      json_object_set_new(so, "stress_Pa", json_real(q->stress_pa));
      json_array_append_new(sa, so);
    }
    json_object_set_new(o, "stations", sa);
    for (size_t k = 0; k < nrpm; k++) {
      json_t *mo = json_object();
      json_object_set_new(mo, "rpm", json_real(md[k].rpm));
      json_object_set_new(mo, "flap_hz", hz_list(md[k].flap_hz, md[k].n_modes));
      json_object_set_new(mo, "lag_hz", hz_list(md[k].lag_hz, md[k].n_modes));
      json_object_set_new(mo, "torsion_hz", hz_list(md[k].torsion_hz, md[k].n_modes));
      json_array_append_new(ma, mo);
    }
    json_object_set_new(o, "modes", ma);
    for (size_t k = 0; k < ncross; k++) {
      json_array_append_new(ca, json_pack("{s:s, s:i, s:i, s:f, s:f}", "family", fam_name[cross[k].family],
                                          "mode", (int)cross[k].mode + 1, "order", cross[k].order,
                                          "rpm", cross[k].rpm, "hz", cross[k].hz));
    }
    json_object_set_new(o, "crossings", ca);
    json_dumpf(o, fp, JSON_REAL_PRECISION(10) | JSON_COMPACT);
    fputc('\n', fp);
    json_decref(o);
  } else {
    fprintf(fp, "blade      %s (%d blades)\nmaterial   %s\n", bname, blade->n_blades, mat.name);
    fprintf(fp, "           E %.3g GPa (%s), strength %.3g MPa, density %.0f kg/m3\n",
            1e-9 * mat.elastic_modulus_pa.value, mat.elastic_modulus_pa.source,
            1e-6 * mat.tensile_strength_pa.value, mat.density_kg_m3.value);
    fprintf(fp, "mass       %.3f g a blade (solid), volume %.1f mm3, centre of mass at r = %.2f mm\n",
            1e3 * sum.mass_kg, 1e9 * sum.volume_m3, 1e3 * sum.cg_r_m);
    fprintf(fp, "load point %.0f rpm, %.3g m/s: thrust %.4f N, power %.3f W (BEMT)\n", load_rpm, speed,
            lp.thrust_N, lp.power_W);
    fprintf(fp, "\n%8s %8s %10s %12s %12s %10s %10s %10s\n", "r mm", "chord mm", "area mm2",
            "EI flap Nm2", "EI lag Nm2", "F cent N", "M flap Nmm", "stress MPa");
    size_t step = nst > 21 ? (nst - 1) / 20 : 1;
    for (size_t i = 0; i < nst; i += step) {
      const ascr_structure_station *q = &st[i];
      fprintf(fp, "%8.2f %8.3f %10.4f %12.4e %12.4e %10.3f %10.4f %10.3f\n", 1e3 * q->r_m,
              1e3 * q->chord_m, 1e6 * q->props.area, q->ei_flap_nm2, q->ei_lag_nm2,
              q->centrifugal_force_N, 1e3 * q->moment_flap_Nm, 1e-6 * q->stress_pa);
    }
    fprintf(fp, "\nlargest stress %.3f MPa at r = %.2f mm: safety factor %.2f against the strength",
            1e-6 * sum.max_stress_pa, 1e3 * sum.max_stress_r_m, sum.safety_factor);
    if (isfinite(sum.fatigue_factor)) fprintf(fp, ", %.2f against the fatigue limit", sum.fatigue_factor);
    fprintf(fp, "\nflap tip deflection %.3f mm (static, without centrifugal stiffening)\n",
            1e3 * sum.tip_deflection_m);
    fprintf(fp, "tip pitch change %+.3f deg under the twisting moment (%+.3f deg of it from the "
            "air's pitching moment, the rest centrifugal)\n", sum.tip_pitch_change_deg,
            sum.tip_pitch_change_air_deg);
    if (fabs(sum.tip_pitch_change_deg) > 5.0) {
      fprintf(fp, "  caution: beyond a few degrees this static, linear estimate no longer holds (the\n"
                  "  twist changes the loads that cause it): the blade is too soft in torsion here\n");
    }
    fprintf(fp, "\n%8s  %-26s %-26s %-26s\n", "rpm", "flap Hz", "lag Hz", "torsion Hz");
    for (size_t k = 0; k < nrpm; k++) {
      char b[3][64];
      for (int f = 0; f < 3; f++) {
        const double *v = f == 0 ? md[k].flap_hz : f == 1 ? md[k].lag_hz : md[k].torsion_hz;
        int w = 0;
        for (size_t j = 0; j < md[k].n_modes && w < 60; j++) {
          w += isfinite(v[j]) ? snprintf(b[f] + w, sizeof b[f] - (size_t)w, "%s%.0f", j ? " " : "", v[j])
                              : snprintf(b[f] + w, sizeof b[f] - (size_t)w, "%s-", j ? " " : "");
        }
      }
      fprintf(fp, "%8.0f  %-26s %-26s %-26s\n", md[k].rpm, b[0], b[1], b[2]);
    }
    if (ncross == 0) {
      fprintf(fp, "\nno mode crosses an engine order 1P .. %dP between %.0f and %.0f rpm\n", max_order,
              rpms[0], rpms[nrpm - 1]);
    } else {
      fprintf(fp, "\ncrossings of the engine orders inside the range (resonance risk: keep the\n"
                  "operating rpm away from them or change the blade):\n");
      for (size_t k = 0; k < ncross; k++) {
        fprintf(fp, "  %s mode %zu meets %dP at %.0f rpm (%.1f Hz)\n", fam_name[cross[k].family],
                cross[k].mode + 1, cross[k].order, cross[k].rpm, cross[k].hz);
      }
    }
    fputs("\ncaution: a solid, isotropic blade clamped at its first station; printed and moulded "
          "parts vary with orientation and process. Spin-test a new blade behind a guard before "
          "flight.\n", fp);
  }
  if (ncross > 0) cli_warn("structure: %zu crossing%s of a mode with an engine order inside the rpm range",
                           ncross, ncross == 1 ? "" : "s");
done:
  for (size_t i = 0; secs != NULL && i < nsec; i++) ascr_geom_section_free(secs[i]);
  free(secs);
  free(el);
  free(st);
  cli_tables_free(&tabs);
  ascr_blade_free(blade);
  if (rc != 0) {
    cli_output_discard(&out);
    return rc;
  }
  return cli_output_commit(&out);
}
