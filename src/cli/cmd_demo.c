/* src/cli/cmd_demo.c
 * "airscrew demo": the built-in demonstration. For now it analyses sample sections: shape
 * metrics, an inviscid sweep of cl, cm and the suction peak, and viscous polars at two
 * Reynolds numbers typical of small propeller blades. With no arguments it uses built-in
 * generator specs (our own thin cambered plate for an indoor micro-drone propeller, and two
 * NACA references); otherwise the sections named on the command line.
 */
#include "cli.h"
#include "commands.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

#define DEMO_PI 3.14159265358979323846

static const char *const demo_builtin[] = {
  "plate:t=2.5,f=4.5,xf=42,nose=1.2,taper=25,te=0.3", "naca4412", "naca0012"};

static int demo_one(FILE *fp, const char *arg)
{
  ascr_geom_section *raw = NULL, *s = NULL;
  ascr_panel_solver *w = NULL;
  ascr_geom_load_info li;
  int from_file = 0;
  int rc = cli_load_section(arg, &raw, &li, &from_file);
  if (rc) return rc;
  ascr_errbuf err;
  ascr_status st = ascr_geom_section_repanel(raw, NULL, &s, &err);
  ascr_geom_metrics m;
  if (st == ASCR_OK) st = ascr_geom_section_metrics(s, &m, &err);
  if (st == ASCR_OK) {
    w = ascr_panel_solver_alloc(ascr_geom_section_size(s));
    st = w ? ascr_panel_solver_set(w, s, &err) : ASCR_ENOMEM;
  }
  if (st != ASCR_OK) {
    cli_error("%s", st == ASCR_ENOMEM ? "out of memory" : err.msg);
    rc = cli_exit_for(st);
    goto done;
  }
  fprintf(fp, "\n== %s  (%s)\n", ascr_geom_section_name(s), arg);
  fprintf(fp, "   t/c %.2f %% at %.2f, camber %.2f %% at %.2f, LE radius %.4f, TE gap %.4f, "
          "TE angle %.1f deg\n", 100 * m.thickness, m.thickness_x, 100 * m.camber, m.camber_x,
          m.le_radius, m.te_gap, m.te_angle_deg);
  fprintf(fp, "   %8s %9s %9s %9s %8s\n", "alpha", "cl", "cl_circ", "cm_c/4", "Cp min");
  for (int a = -4; a <= 10; a += 2) {
    ascr_panel_result r;
    st = ascr_panel_solver_solve(w, a * DEMO_PI / 180.0, 0.0, &r, NULL, NULL, &err);
    if (st != ASCR_OK) {
      cli_error("%s", err.msg);
      rc = cli_exit_for(st);
      goto done;
    }
    fprintf(fp, "   %8d %9.4f %9.4f %9.4f %8.3f\n", a, r.cl, r.cl_circ, r.cm, r.cp_min);
  }
  {
    /* viscous polars at blade Reynolds numbers of a small propeller */
    const double res[2] = {6e4, 2e5};
    ascr_visc_solver *v = ascr_visc_solver_alloc(ascr_geom_section_size(s),
                                                 ascr_visc_default_wake_nodes(ascr_geom_section_size(s)));
    ascr_polar_point pts[6];
    ascr_polar_summary sum;
    if (v == NULL) {
      cli_error("out of memory");
      rc = CLI_EXIT_INTERNAL;
      goto done;
    }
    fprintf(fp, "   viscous (N_crit 9):\n   %8s", "alpha");
    for (int k = 0; k < 2; k++) fprintf(fp, "   %-9s %8s %6s", k == 0 ? "cl 60k" : "cl 200k", "cd", "L/D");
    fputc('\n', fp);
    ascr_polar_point all[2][6];
    for (int k = 0; k < 2; k++) {
      ascr_visc_params vp = ascr_visc_params_defaults();
      vp.re = res[k];
      if (ascr_visc_solver_set(v, w, &vp, &err) != ASCR_OK ||
          ascr_polar_sweep(v, -2.0, 8.0, 2.0, pts, &sum, NULL, NULL, &err) != ASCR_OK) {
        cli_error("%s", err.msg);
        rc = CLI_EXIT_ANALYSIS;
        ascr_visc_solver_free(v);
        goto done;
      }
      for (int i = 0; i < 6; i++) all[k][i] = pts[i];
    }
    for (int i = 0; i < 6; i++) {
      fprintf(fp, "   %8.1f", all[0][i].alpha_deg);
      for (int k = 0; k < 2; k++) {
        const ascr_polar_point *q = &all[k][i];
        if (q->converged) fprintf(fp, "   %9.4f %8.5f %6.1f", q->cl, q->cd, q->cl / q->cd);
        else fprintf(fp, "   %-25s", "   (not converged)");
      }
      fputc('\n', fp);
    }
    ascr_visc_solver_free(v);
  }
done:
  ascr_panel_solver_free(w);
  ascr_geom_section_free(s);
  ascr_geom_section_free(raw);
  return rc;
}

static int demo_sections(int argc, char **argv)
{
  for (int i = 1; i < argc; i++) {
    if (argv[i][0] == '-') {
      cli_error("demo: unknown option '%s' (see airscrew demo --help)", argv[i]);
      return CLI_EXIT_USAGE;
    }
  }
  if (cli_check_options_only) return CLI_EXIT_OK;
  cli_output out;
  int rc = cli_output_open(&out, NULL, 0);
  if (rc) return rc;
  fprintf(out.fp, "airscrew %s demo: section shape, inviscid lift, viscous polars (%d panels)\n",
          ascr_version(), ASCR_GEOM_DEFAULT_PANELS);
  fprintf(out.fp, "The inviscid table has no drag and no stall; the viscous polars are estimates\n"
          "from an integral boundary-layer method.\n");
  if (argc > 1) {
    for (int i = 1; i < argc && rc == 0; i++) rc = demo_one(out.fp, argv[i]);
  } else {
    for (size_t i = 0; i < sizeof demo_builtin / sizeof demo_builtin[0] && rc == 0; i++) {
      rc = demo_one(out.fp, demo_builtin[i]);
    }
  }
  if (rc) {
    cli_output_discard(&out);
    return rc;
  }
  fprintf(out.fp, "\nPredictions are estimates. Spinning propellers cut and blades can fail at "
          "speed:\ntest on a guarded thrust stand and follow local rules and qualified practice.\n");
  return cli_output_commit(&out);
}

int cmd_demo(int argc, char **argv)
{
  for (int i = 1; i < argc; i++) {
    if (strcmp(argv[i], "--help") == 0 || strcmp(argv[i], "-h") == 0) {
      fputs("usage: airscrew demo [--out DIR] [--force] [--cache-dir DIR | --no-cache]\n"
            "       airscrew demo --sections [SECTION...]\n\n"
            "Built-in demonstration. By default: a three-inch, three-blade propeller of our own\n"
            "for an indoor inspection micro-drone, from its thin-plate sections to polars at the\n"
            "blade Reynolds numbers, the rotor map over rpm and speed with both inflow models,\n"
            "and the hover point for the craft's weight; written to DIR (default airscrew-demo)\n"
            "as CSV/JSON, SVG and PNG plots and a one-page report (report.html).\n"
            "With --sections: shape, inviscid lift and viscous polars (Re 60k and 200k) of\n"
            "sample sections (built-in ones without SECTION arguments), printed.\n",
            stdout);
      return CLI_EXIT_OK;
    }
  }
  if (argc > 1 && strcmp(argv[1], "--sections") == 0) {
    return demo_sections(argc - 1, argv + 1);
  }
  return demo_prop(argc, argv);
}
