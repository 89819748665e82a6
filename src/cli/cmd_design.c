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
        "With an \"optimize\" object in the specification the MIL blade is the start of a\n"
        "multi-point design: chord and twist on a few control points, optimised for the\n"
        "weighted shaft power of the listed operating points (each trimmed in rpm to its\n"
        "thrust) under the chord, thickness and tip-Mach limits it states; the optimised\n"
        "blade is written, with how the optimiser converged and every limit's margin.\n"
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

static json_t *opt_point_json(const ascr_opt_point_result *q)
{
  json_t *o = json_object();
  json_object_set_new(o, "rpm", cli_json_num(q->trimmed, q->rpm));
  json_object_set_new(o, "power_W", cli_json_num(q->trimmed, q->power_W));
  json_object_set_new(o, "thrust_N", cli_json_num(q->trimmed, q->thrust_N));
  json_object_set_new(o, "tip_mach", cli_json_num(q->trimmed, q->tip_mach));
  json_object_set_new(o, "efficiency", cli_json_num(q->trimmed, q->efficiency));
  json_object_set_new(o, "figure_of_merit", cli_json_num(q->trimmed, q->figure_of_merit));
  json_object_set_new(o, "flagged_thrust_share", cli_json_num(q->trimmed, q->flagged_thrust_share));
  json_object_set_new(o, "confidence", json_string(q->low_confidence ? "low" : "normal"));
  return o;
}

/* the "optimization" object of design --json */
static json_t *design_opt_json(const ascr_design_spec *spec, const ascr_opt_result *r)
{
  const ascr_opt_spec *q = &spec->opt;
  json_t *o = json_object(), *pts = json_array(), *cps = json_array(), *lim = json_object();
  json_object_set_new(o, "objective_W", cli_json_num(1, r->objective_W));
  json_object_set_new(o, "start_objective_W", json_real(r->start_objective_W));
  json_object_set_new(o, "start_feasible", json_boolean(r->start_feasible));
  json_object_set_new(o, "converged", json_boolean(r->converged));
  json_object_set_new(o, "feasible", json_boolean(r->feasible));
  json_object_set_new(o, "iterations", json_integer(r->iterations));
  json_object_set_new(o, "evaluations", json_integer(r->evaluations));
  json_object_set_new(o, "simplex_size", cli_json_num(1, r->simplex_size));
  json_object_set_new(lim, "chord_range_m", json_pack("[f, f]", q->chord_min_m, q->chord_max_m));
  json_object_set_new(lim, "chord_margin_m", json_real(r->chord_margin_m));
  json_object_set_new(lim, "min_thickness_m", json_real(q->min_thickness_m));
  json_object_set_new(lim, "thickness_margin_m", cli_json_num(1, r->thickness_margin_m));
  json_object_set_new(lim, "max_tip_mach", cli_json_num(1, q->max_tip_mach > 0.0 ? q->max_tip_mach : NAN));
  json_object_set_new(lim, "allow_extended_polars", json_boolean(q->allow_extended));
  json_object_set_new(o, "limits", lim);
  for (size_t j = 0; j < q->n_points; j++) {
    json_t *p = json_object();
    json_object_set_new(p, "speed_m_s", json_real(q->points[j].speed_m_s));
    json_object_set_new(p, "thrust_N", json_real(q->points[j].thrust_N));
    json_object_set_new(p, "weight", json_real(q->points[j].weight));
    json_object_set_new(p, "start", opt_point_json(&r->start_points[j]));
    json_object_set_new(p, "optimized", opt_point_json(&r->points[j]));
    json_object_set_new(p, "tip_mach_margin", cli_json_num(1, r->points[j].tip_mach_margin));
    json_array_append_new(pts, p);
  }
  json_object_set_new(o, "points", pts);
  for (size_t k = 0; k < r->n_control; k++) {
    json_array_append_new(cps, json_pack("{s:f, s:f, s:f}", "r_m", r->control_r_m[k], "chord_m",
                                         r->control_chord_m[k], "twist_deg", r->control_twist_deg[k]));
  }
  json_object_set_new(o, "control_points", cps);
  return o;
}

static void design_opt_text(FILE *fp, const ascr_design_spec *spec, const ascr_opt_result *r)
{
  const ascr_opt_spec *q = &spec->opt;
  fprintf(fp, "\nmulti-point design: chord and twist on %zu control points, Nelder-Mead simplex (GSL)\n",
          r->n_control);
  fprintf(fp, "%8s %8s %6s %10s %10s %10s %10s %7s %8s  %s\n", "speed", "thrust N", "weight",
          "start rpm", "start W", "rpm", "power W", "tip M", "margin", "confidence");
  for (size_t j = 0; j < q->n_points; j++) {
    const ascr_opt_point_result *s0 = &r->start_points[j], *s1 = &r->points[j];
    fprintf(fp, "%8.2f %8.4f %6.3g %10.0f %10.3f %10.0f %10.3f %7.3f %8.4f  %s\n",
            q->points[j].speed_m_s, q->points[j].thrust_N, q->points[j].weight, s0->rpm,
            s0->power_W, s1->rpm, s1->power_W, s1->tip_mach, s1->tip_mach_margin,
            s1->low_confidence ? "low (extended polars)" : "normal");
  }
  fprintf(fp, "objective (weighted power): %.4f W%s -> %.4f W (%+.2f %%); %d iterations, %d "
          "evaluations, %s (simplex size %.2g)\n", r->start_objective_W,
          r->start_feasible ? "" : " (the start breaks a limit)", r->objective_W,
          100.0 * (r->objective_W / r->start_objective_W - 1.0), r->iterations, r->evaluations,
          r->converged ? "converged" : "NOT converged", r->simplex_size);
  fprintf(fp, "limits: chord %.2f .. %.2f mm (margin %.3f mm)", 1e3 * q->chord_min_m,
          1e3 * q->chord_max_m, 1e3 * r->chord_margin_m);
  if (q->min_thickness_m > 0.0) {
    fprintf(fp, "; thickness >= %.2f mm (margin %.3f mm)", 1e3 * q->min_thickness_m,
            1e3 * r->thickness_margin_m);
  }
  if (q->max_tip_mach > 0.0) fprintf(fp, "; tip Mach <= %.3f", q->max_tip_mach);
  fprintf(fp, "; %s\n", q->allow_extended ? "extended polars allowed"
                                          : "thrust on flagged polars <= 10 % a point");
  fprintf(fp, "control points:");
  for (size_t k = 0; k < r->n_control; k++) {
    fprintf(fp, " (%.2f mm: %.3f mm, %.2f deg)", 1e3 * r->control_r_m[k],
            1e3 * r->control_chord_m[k], r->control_twist_deg[k]);
  }
  fputc('\n', fp);
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
  static ascr_opt_result opt;
  ascr_rotor_result opt_analysis;
  ascr_blade *blade = NULL;
  char *text = NULL;
  size_t len = 0;
  /* the tables' range: the design point, and for an optimisation its points at half to twice
   * the design rpm (a trim outside that leans on extended polars: flagged, penalised) */
  double rlo = m->rpm, rhi = m->rpm, vlo = m->speed_m_s, vhi = m->speed_m_s;
  if (spec->optimize) {
    rlo = 0.5 * m->rpm;
    rhi = 2.0 * m->rpm;
    for (size_t j = 0; j < spec->opt.n_points; j++) {
      vlo = fmin(vlo, spec->opt.points[j].speed_m_s);
      vhi = fmax(vhi, spec->opt.points[j].speed_m_s);
    }
  }
  rc = cli_tables_prepare(spec->layout, &ro.rp, rlo, rhi, vlo, vhi, &ro.to, &tabs);
  if (rc) goto done;
  const ascr_polar_table *const *tt = (const ascr_polar_table *const *)tabs.tables;
  st = ascr_mil_design(m, tt, &ro.rp, &res, &err);
  if (st == ASCR_OK) st = ascr_design_blade(spec, &res, &blade, &err);
  if (st == ASCR_OK && spec->optimize) {
    st = ascr_design_optimize(blade, tt, &ro.rp, &spec->opt, &opt, &err);
    if (st == ASCR_OK) {
      memcpy(blade->stations, opt.st, opt.n * sizeof *opt.st);
      blade->pitch_offset_deg = 0.0;
      st = ascr_rotor_bemt(blade, tt, &ro.rp, m->rpm, m->speed_m_s, &opt_analysis, NULL, &err);
    }
  }
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
  if (spec->optimize && !opt.feasible) {
    cli_error("design: the optimiser found no blade that keeps every limit of 'optimize' (the "
              "best it found below); no blade file written");
    design_opt_text(stderr, spec, &opt);
    rc = CLI_EXIT_ANALYSIS;
    goto done;
  }
  if (spec->optimize && !opt.converged) {
    cli_warn("design: the optimiser stopped after %d iterations before its simplex shrank to "
             "the tolerance (size %.2g): the blade written is the best found", opt.iterations,
             opt.simplex_size);
  }
  const ascr_rotor_result *a = spec->optimize ? &opt_analysis : &res.analysis;
  if (!a->converged) {
    /* the optimised blade (its own points were trimmed and converged) at the spec's design rpm */
    cli_warn("design: the optimised blade's BEMT analysis did not converge at the design point "
             "(%g rpm, %g m/s): its numbers there are left out", m->rpm, m->speed_m_s);
  }
  FILE *fp = out.fp;
  if (json) {
    json_t *o = json_object(), *dp = json_object(), *mil = json_object(), *sa = json_array();
    json_object_set_new(dp, "rpm", json_real(m->rpm));
    json_object_set_new(dp, "speed_m_s", json_real(m->speed_m_s));
    json_object_set_new(dp, "thrust_N", cli_json_num(a->converged, a->thrust_N));
    json_object_set_new(dp, "power_W", cli_json_num(a->converged, a->power_W));
    json_object_set_new(dp, "efficiency", cli_json_num(a->converged, a->efficiency));
    json_object_set_new(dp, "figure_of_merit", cli_json_num(a->converged, a->figure_of_merit));
    json_object_set_new(dp, "confidence", json_string(a->low_confidence ? "low" : "normal"));
    json_object_set_new(o, "design_point", dp);
    json_object_set_new(o, "blade_file", json_string(outpath));
    json_object_set_new(mil, "displacement_velocity_m_s", json_real(res.v_displacement_m_s));
    json_object_set_new(mil, "thrust_N", json_real(res.thrust_N));
    json_object_set_new(mil, "power_W", json_real(res.power_W));
    json_object_set_new(mil, "efficiency", cli_json_num(1, res.efficiency));
    json_object_set_new(o, "design_equations", mil);
    for (size_t i = 0; i < blade->n_stations; i++) {
      const ascr_blade_station *b = &blade->stations[i];
      const ascr_mil_station *s = &res.st[i];
      json_t *so = json_object();
      json_object_set_new(so, "r_m", json_real(b->r_m));
      json_object_set_new(so, "chord_m", json_real(b->chord_m));
      json_object_set_new(so, "twist_deg", json_real(b->twist_deg));
      if (!spec->optimize) { /* the design equations' station values */
        json_object_set_new(so, "alpha_deg", json_real(s->alpha_deg));
        json_object_set_new(so, "cl", json_real(s->cl));
        json_object_set_new(so, "cd", json_real(s->cd));
        json_object_set_new(so, "re", json_real(s->re));
        json_object_set_new(so, "chord_raised", json_boolean(s->chord_raised));
      }
      json_object_set_new(so, "section", json_string(blade->section_name[b->section]));
      json_array_append_new(sa, so);
    }
    if (spec->optimize) json_object_set_new(o, "optimization", design_opt_json(spec, &opt));
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
    if (spec->optimize) {
      fprintf(fp, "BEMT analysis:    %.4f N, %.3f W (the MIL blade)\n", res.analysis.thrust_N,
              res.analysis.power_W);
      design_opt_text(fp, spec, &opt);
    }
    if (!a->converged) fprintf(fp, "BEMT analysis:    not converged at the design point");
    else fprintf(fp, "BEMT analysis:    %.4f N, %.3f W, ", a->thrust_N, a->power_W);
    if (!a->converged) {
      /* nothing more to say of it */
    } else if (isfinite(a->efficiency)) {
      fprintf(fp, "efficiency %.4f", a->efficiency);
    } else {
      fprintf(fp, "figure of merit %.4f", a->figure_of_merit);
    }
    fprintf(fp, "%s%s\nblade file:       %s\n\n", a->low_confidence ? " (low confidence)" : "",
            spec->optimize ? " (the optimised blade at the design point)" : "", outpath);
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
