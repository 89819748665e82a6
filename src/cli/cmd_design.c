/* src/cli/cmd_design.c
 * "airscrew design": the minimum-induced-loss blade for a design specification (library:
 * ascr_design.h), written as a blade file, with its predicted performance.
 */
#define _GNU_SOURCE
#include "cli.h"
#include "cli_rotor_opts.h"
#include "cli_tables.h"
#include "commands.h"

#include <getopt.h>
#include <jansson.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

static void design_help(FILE *fp)
{
  fputs("usage: airscrew design SPEC.json -o BLADE.json [options]\n"
        "\n"
        "The minimum-induced-loss blade (Betz condition with Prandtl's tip factor, after Adkins &\n"
        "Liebeck) for the design point of the specification: chord and twist at each station,\n"
        "with the lift coefficient given or chosen where the section's computed polar has its\n"
        "best L/D at the station's own Reynolds number. Written as a blade file for 'rotor' and\n"
        "'drive', and analysed by the BEMT at the design point (the predicted performance).\n"
        "\n"
        "  -o, --output FILE       the blade file to write (required)\n"
        "      --force             replace it if it exists\n"
        "      --json              print the result as JSON (design_point, blade_file, stations)\n"
        CLI_ROTOR_OPTS_HELP
        "  -h, --help              this help\n"
        "\n"
        "Predictions are estimates. Test a new blade on a guarded thrust stand; a spinning\n"
        "propeller cuts and a blade can fail at speed.\n",
        fp);
}

int cmd_design(int argc, char **argv)
{
  static const struct option opts[] = {
    {"output", required_argument, NULL, 'o'}, {"force", no_argument, NULL, 'F'},
    {"json", no_argument, NULL, 'J'},         CLI_ROTOR_LONGOPTS,
    {"help", no_argument, NULL, 'h'},         {NULL, 0, NULL, 0}};
  const char *outpath = NULL;
  int force = 0, json = 0, c;
  cli_rotor_opts ro;
  cli_rotor_opts_init(&ro);
  opterr = 0;
  cli_getopt_reset();
  while ((c = getopt_long(argc, argv, ":o:i:p:e:h", opts, NULL)) != -1) {
    switch (c) {
    case 'o': outpath = optarg; break;
    case 'F': force = 1; break;
    case 'J': json = 1; break;
    case 'h': design_help(stdout); return CLI_EXIT_OK;
    case ':': cli_error("design: option %s needs a value", argv[optind - 1]); return CLI_EXIT_USAGE;
    default: {
      int r = cli_rotor_opts_parse(&ro, c, optarg);
      if (r == 0) break;
      if (r < 0) cli_error("design: unknown option '%s' (see airscrew design --help)", argv[optind - 1]);
      return CLI_EXIT_USAGE;
    }
    }
  }
  if (optind != argc - 1) {
    cli_error("design: give exactly one SPEC file; see airscrew design --help");
    return CLI_EXIT_USAGE;
  }
  if (outpath == NULL) {
    cli_error("design: -o BLADE.json is required (the designed blade file)");
    return CLI_EXIT_USAGE;
  }
  if (cli_rotor_opts_model(&ro) != ASCR_INFLOW_BEMT) {
    cli_error("design: the design is checked with the BEMT; --inflow does not apply");
    return CLI_EXIT_USAGE;
  }
  int rc = cli_rotor_opts_finish(&ro, "design");
  if (rc) return rc;
  if (cli_check_options_only) return CLI_EXIT_OK;
  if ((rc = cli_output_check(outpath, force)) != 0) return rc;
  cli_output out;
  if ((rc = cli_output_open(&out, NULL, 0)) != 0) return rc;
  const char *sfile = argv[optind];
  ascr_design_spec *spec = NULL;
  ascr_errbuf err;
  ascr_status st = ascr_design_spec_read(sfile, &spec, &err);
  if (st != ASCR_OK) {
    cli_error("%s", err.msg);
    cli_output_discard(&out);
    return st == ASCR_ENOMEM ? CLI_EXIT_INTERNAL : CLI_EXIT_INPUT;
  }
  const ascr_mil_spec *m = &spec->mil;
  cli_tables tabs;
  memset(&tabs, 0, sizeof tabs);
  static ascr_mil_result res;
  ascr_blade *blade = NULL;
  char *text = NULL;
  size_t len = 0;
  rc = cli_tables_prepare(spec->layout, &ro.rp, m->rpm, m->rpm, m->speed_m_s, m->speed_m_s, &ro.to, &tabs);
  if (rc) goto done;
  st = ascr_mil_design(m, (const ascr_polar_table *const *)tabs.tables, &ro.rp, &res, &err);
  if (st == ASCR_OK) st = ascr_design_blade(spec, &res, &blade, &err);
  if (st == ASCR_OK) st = ascr_blade_to_json(blade, &text, &len, &err);
  if (st != ASCR_OK) {
    cli_error("%s", err.msg);
    rc = st == ASCR_EDOM || st == ASCR_EMAXITER ? CLI_EXIT_ANALYSIS : cli_exit_for(st);
    goto done;
  }
  if (!res.converged) {
    cli_error("design: the designed blade's BEMT analysis did not converge at the design point");
    rc = CLI_EXIT_ANALYSIS;
    goto done;
  }
  const ascr_rotor_result *a = &res.analysis;
  FILE *fp = out.fp;
  if (json) {
    json_t *o = json_object(), *dp = json_object(), *mil = json_object(), *sa = json_array();
    json_object_set_new(dp, "rpm", json_real(m->rpm));
    json_object_set_new(dp, "speed_m_s", json_real(m->speed_m_s));
    json_object_set_new(dp, "thrust_N", json_real(a->thrust_N));
    json_object_set_new(dp, "power_W", json_real(a->power_W));
    json_object_set_new(dp, "efficiency", cli_json_num(1, a->efficiency));
    json_object_set_new(dp, "figure_of_merit", cli_json_num(1, a->figure_of_merit));
    json_object_set_new(dp, "confidence", json_string(a->low_confidence ? "low" : "normal"));
    json_object_set_new(o, "design_point", dp);
    json_object_set_new(o, "blade_file", json_string(outpath));
    json_object_set_new(mil, "displacement_velocity_m_s", json_real(res.v_displacement_m_s));
    json_object_set_new(mil, "thrust_N", json_real(res.thrust_N));
    json_object_set_new(mil, "power_W", json_real(res.power_W));
    json_object_set_new(mil, "efficiency", cli_json_num(1, res.efficiency));
    json_object_set_new(o, "design_equations", mil);
    for (size_t i = 0; i < res.n; i++) {
      const ascr_mil_station *s = &res.st[i];
      json_t *so = json_object();
      json_object_set_new(so, "r_m", json_real(s->r_m));
      json_object_set_new(so, "chord_m", json_real(s->chord_m));
      json_object_set_new(so, "twist_deg", json_real(s->twist_deg));
      json_object_set_new(so, "alpha_deg", json_real(s->alpha_deg));
      json_object_set_new(so, "cl", json_real(s->cl));
      json_object_set_new(so, "cd", json_real(s->cd));
      json_object_set_new(so, "re", json_real(s->re));
      json_object_set_new(so, "section", json_string(blade->section_name[s->section]));
      json_object_set_new(so, "chord_raised", json_boolean(s->chord_raised));
      json_array_append_new(sa, so);
    }
    json_object_set_new(o, "stations", sa);
    json_dumpf(o, fp, JSON_REAL_PRECISION(10) | JSON_COMPACT);
    fputc('\n', fp);
    json_decref(o);
  } else {
    fprintf(fp, "design     %s\n", blade->name);
    fprintf(fp, "point      %g rpm, %g m/s, %s %g %s; %d blades, diameter %.1f mm\n", m->rpm, m->speed_m_s,
            m->thrust_N > 0.0 ? "thrust" : "shaft power", m->thrust_N > 0.0 ? m->thrust_N : m->power_W,
            m->thrust_N > 0.0 ? "N" : "W", m->n_blades, 2000.0 * m->r_tip_m);
    fprintf(fp, "lift       %s\n", isnan(m->cl_design) ? "each station at its section's best L/D (its own Re)"
                                                      : "given cl at every station");
    fprintf(fp, "\n%8s %8s %8s %7s %7s %7s %8s %8s  %s\n", "r mm", "chord mm", "twist", "phi", "alpha", "cl",
            "cd", "Re", "section");
    for (size_t i = 0; i < res.n; i++) {
      const ascr_mil_station *s = &res.st[i];
      fprintf(fp, "%8.2f %8.3f %8.3f %7.3f %7.3f %7.4f %8.5f %8.0f  %s%s\n", 1000.0 * s->r_m, 1000.0 * s->chord_m,
              s->twist_deg, s->phi_deg, s->alpha_deg, s->cl, s->cd, s->re, blade->section_name[s->section],
              s->chord_raised ? " (chord raised to the minimum)" : "");
    }
    fprintf(fp, "\ndesign equations: %.4f N, %.3f W%s\n", res.thrust_N, res.power_W, "");
    fprintf(fp, "BEMT analysis:    %.4f N, %.3f W, ", a->thrust_N, a->power_W);
    if (isfinite(a->efficiency)) fprintf(fp, "efficiency %.4f", a->efficiency);
    else fprintf(fp, "figure of merit %.4f", a->figure_of_merit);
    fprintf(fp, "%s\nblade file:       %s\n\n", a->low_confidence ? " (low confidence)" : "", outpath);
    fputs("caution: a new blade is an estimate until tested: use a guarded thrust stand; a spinning "
          "propeller cuts and blades can fail at high rpm.\n", fp);
  }
  rc = cli_write_atomic(outpath, text, len, force);
done:
  free(text);
  ascr_blade_free(blade);
  cli_tables_free(&tabs);
  ascr_design_spec_free(spec);
  if (rc != 0) {
    cli_output_discard(&out);
    return rc;
  }
  return cli_output_commit(&out);
}
