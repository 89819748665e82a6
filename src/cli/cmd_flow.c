/* src/cli/cmd_flow.c
 * "airscrew flow": one section at one condition: viscous (--re; integral boundary layer coupled
 * to the panel solution) or inviscid (--inviscid; panels with optional Karman-Tsien).
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

#define FLOW_PI 3.14159265358979323846

static void flow_help(FILE *fp)
{
  fputs("usage: airscrew flow SECTION --alpha DEG (--re RE | --inviscid) [options]\n"
        "\n"
        "Analyse one section at one angle of attack.\n"
        "SECTION is a coordinate file or a generator spec (see airscrew section --help).\n"
        "A viscous point is reached as a polar sweep reaches it: from a fresh start at the\n"
        "zero-lift angle, continued to the angle asked (so it agrees with 'polar').\n"
        "\n"
        "options:\n"
        "  -a, --alpha DEG       angle of attack, degrees (-90 .. 90; viscous -60 .. 60)\n"
        "  -r, --re RE           chord Reynolds number: viscous analysis (1e3 .. 1e8)\n"
        "      --inviscid        potential flow only\n"
        "  -m, --mach M          free-stream Mach number (inviscid 0 .. 0.95, viscous 0 .. 0.7)\n"
        "      --ncrit N         critical amplification exponent (default 9)\n"
        "      --turbulence PCT  free-stream turbulence in percent; sets N_crit (Mack 1977)\n"
        "      --transition NAME  N_crit of a named condition: quiet-air 11, tunnel 9, sanded 7,\n"
        "                         rotor-inflow 5, printed-rough 3 (common practice; user guide)\n"
        "      --trip-upper X    forced transition at x/c = X on the upper surface\n"
        "      --trip-lower X    forced transition at x/c = X on the lower surface\n"
        "  -p, --panels N        panels on the contour (default 160; viscous above Re 1e6\n"
        "                        240, above 6.5e6 320)\n"
        "      --json         JSON output\n"
        "      --csv          CSV output (surface table; summary in '#' lines)\n"
        "  -o, --output FILE  write to FILE (whole or not at all) instead of standard output\n"
        "      --history      viscous: also list every Newton step of every start the solver\n"
        "                     made (residual, update, step length, transition points), also\n"
        "                     when it does not converge (table or JSON, not with --csv)\n"
        "      --plot DIR     viscous: also draw -Cp (with the inviscid curve, transition and\n"
        "                     separation marked) and the boundary layer, DIR/flow-cp and flow-bl\n"
        "      --force        replace FILE if it exists\n"
        "  -h, --help         this help\n",
        fp);
}

#define FLOW_NOTE "inviscid potential flow: no drag, no stall, no Reynolds-number effect"

typedef struct flow_out {
  const ascr_geom_section *s;
  const ascr_panel_result *r;
  const double *cp, *q;
  double alpha_deg;
  size_t n_panels;
  const char *warning; /* NULL or one warning */
} flow_out;

static void write_json(FILE *fp, const flow_out *f)
{
  size_t n = ascr_geom_section_size(f->s);
  const double *x = ascr_geom_section_x(f->s), *y = ascr_geom_section_y(f->s);
  json_t *o = json_object();
  json_object_set_new(o, "section", json_string(ascr_geom_section_name(f->s)));
  json_object_set_new(o, "analysis", json_string("inviscid"));
  json_object_set_new(o, "alpha_deg", json_real(f->alpha_deg));
  json_object_set_new(o, "mach", json_real(f->r->mach));
  json_object_set_new(o, "n_panels", json_integer((json_int_t)f->n_panels));
  json_object_set_new(o, "cl", json_real(f->r->cl));
  json_object_set_new(o, "cl_circulation", json_real(f->r->cl_circ));
  json_object_set_new(o, "cm", json_real(f->r->cm));
  json_object_set_new(o, "cp_min", json_real(f->r->cp_min));
  if (f->r->mach > 0.0) {
    json_object_set_new(o, "cp_critical", json_real(f->r->cp_critical));
  }
  json_t *sf = json_object(), *xa = json_array(), *ya = json_array(), *ca = json_array(),
         *qa = json_array();
  for (size_t i = 0; i < n; i++) {
    json_array_append_new(xa, json_real(x[i]));
    json_array_append_new(ya, json_real(y[i]));
    json_array_append_new(ca, json_real(f->cp[i]));
    json_array_append_new(qa, json_real(f->q[i]));
  }
  json_object_set_new(sf, "x", xa);
  json_object_set_new(sf, "y", ya);
  json_object_set_new(sf, "cp", ca);
  json_object_set_new(sf, "q", qa);
  json_object_set_new(o, "surface", sf);
  json_t *w = json_array();
  if (f->warning) json_array_append_new(w, json_string(f->warning));
  json_object_set_new(o, "warnings", w);
  json_object_set_new(o, "note", json_string(FLOW_NOTE));
  json_dumpf(o, fp, JSON_REAL_PRECISION(12) | JSON_COMPACT);
  fputc('\n', fp);
  json_decref(o);
}

static void write_csv(FILE *fp, const flow_out *f)
{
  size_t n = ascr_geom_section_size(f->s);
  const double *x = ascr_geom_section_x(f->s), *y = ascr_geom_section_y(f->s);
  fprintf(fp, "# section: %s\n# analysis: inviscid\n# alpha_deg: %.6f\n# mach: %.4f\n",
          ascr_geom_section_name(f->s), f->alpha_deg, f->r->mach);
  fprintf(fp, "# cl: %.8f\n# cl_circulation: %.8f\n# cm: %.8f\n", f->r->cl, f->r->cl_circ,
          f->r->cm);
  if (f->warning) fprintf(fp, "# warning: %s\n", f->warning);
  fputs("x,y,cp,q\n", fp);
  for (size_t i = 0; i < n; i++) {
    fprintf(fp, "%.8f,%.8f,%.8f,%.8f\n", x[i], y[i], f->cp[i], f->q[i]);
  }
}

static void write_table(FILE *fp, const flow_out *f)
{
  size_t n = ascr_geom_section_size(f->s), ile = ascr_geom_section_le_index(f->s);
  const double *x = ascr_geom_section_x(f->s), *y = ascr_geom_section_y(f->s);
  size_t imin = 0;
  for (size_t i = 1; i < n; i++) {
    if (f->cp[i] < f->cp[imin]) imin = i;
  }
  fprintf(fp, "section   %s  (%zu panels)\n", ascr_geom_section_name(f->s), f->n_panels);
  fprintf(fp, "alpha     %.3f deg   Mach %.3f\n", f->alpha_deg, f->r->mach);
  fprintf(fp, "cl        %.5f  (pressure integral)   %.5f  (circulation)\n", f->r->cl,
          f->r->cl_circ);
  fprintf(fp, "cm        %.5f  (about x/c = 0.25, nose up positive)\n", f->r->cm);
  fprintf(fp, "Cp min    %.4f at x/c = %.4f, %s surface", f->cp[imin], x[imin],
          imin <= ile ? "upper" : "lower");
  if (f->r->mach > 0.0) fprintf(fp, "   (critical Cp %.4f)", f->r->cp_critical);
  fputc('\n', fp);
  if (f->warning) fprintf(fp, "warning   %s\n", f->warning);
  fprintf(fp, "note      %s\n\n", FLOW_NOTE);
  fprintf(fp, "%6s %10s %10s %10s %10s\n", "node", "x/c", "y/c", "Cp", "q/V");
  for (size_t i = 0; i < n; i++) {
    fprintf(fp, "%6zu %10.5f %10.5f %10.4f %10.4f\n", i, x[i], y[i], f->cp[i], f->q[i]);
  }
}


static json_t *darray(const double *v, size_t n)
{
  json_t *a = json_array();
  for (size_t i = 0; i < n; i++) json_array_append_new(a, isfinite(v[i]) ? json_real(v[i]) : json_null());
  return a;
}

/* The Newton steps of a solve (--history), collected from the solver's trace. */
typedef struct flow_history {
  ascr_visc_step *steps;
  size_t n, cap;
  int failed; /* out of memory */
} flow_history;

static void history_add(void *ctx, const ascr_visc_step *st)
{
  flow_history *hh = ctx;
  if (hh->failed) return;
  if (hh->n == hh->cap) {
    size_t cap = hh->cap ? 2 * hh->cap : 256;
    ascr_visc_step *p = realloc(hh->steps, cap * sizeof *p);
    if (p == NULL) {
      hh->failed = 1;
      return;
    }
    hh->steps = p;
    hh->cap = cap;
  }
  hh->steps[hh->n++] = *st;
}

static const char *start_name(int start)
{
  return start == ASCR_VISC_START_PREVIOUS ? "previous" :
         start == ASCR_VISC_START_MARCH ? "march" : "coupled-march";
}

static json_t *history_json(const flow_history *hh)
{
  json_t *a = json_array();
  for (size_t i = 0; i < hh->n; i++) {
    const ascr_visc_step *st = &hh->steps[i];
    json_t *o = json_object();
    json_object_set_new(o, "start", json_string(start_name(st->start)));
    json_object_set_new(o, "alpha_deg", json_real(st->alpha_rad * 180.0 / FLOW_PI));
    json_object_set_new(o, "re", json_real(st->re));
    json_object_set_new(o, "iteration", json_integer(st->iteration));
    json_object_set_new(o, "residual_max", cli_json_num(isfinite(st->residual_max), st->residual_max));
    json_object_set_new(o, "update", cli_json_num(isfinite(st->update), st->update));
    json_object_set_new(o, "relax", json_real(st->relax));
    json_object_set_new(o, "transition_moved", json_boolean(st->transition_moved));
    json_object_set_new(o, "stagnation_moved", json_boolean(st->stagnation_moved));
    json_object_set_new(o, "exact_rule", json_boolean(st->exact_rule));
    json_object_set_new(o, "x_transition_upper", cli_json_num(isfinite(st->x_transition_upper), st->x_transition_upper));
    json_object_set_new(o, "x_transition_lower", cli_json_num(isfinite(st->x_transition_lower), st->x_transition_lower));
    json_array_append_new(a, o);
  }
  return a;
}

static void history_table(FILE *fp, const flow_history *hh)
{
  fprintf(fp, "Newton steps (%zu), a run per start; rule * while the coupled march's look-ahead\n"
          "places transition, blank once the exact rule does; T transition moved, S stagnation\n"
          "point moved\n", hh->n);
  fprintf(fp, "%-13s %7s %9s %4s %10s %10s %7s %2s %2s %4s %7s %7s\n", "start", "alpha", "Re", "it",
          "residual", "update", "relax", "tr", "st", "rule", "xtr_up", "xtr_lo");
  for (size_t i = 0; i < hh->n; i++) {
    const ascr_visc_step *st = &hh->steps[i];
    char xu[16], xl[16];
    snprintf(xu, sizeof xu, isfinite(st->x_transition_upper) ? "%.4f" : "none", st->x_transition_upper);
    snprintf(xl, sizeof xl, isfinite(st->x_transition_lower) ? "%.4f" : "none", st->x_transition_lower);
    fprintf(fp, "%-13s %7.3f %9.4g %4d %10.3e %10.3e %7.4f %2s %2s %4s %7s %7s\n",
            start_name(st->start), st->alpha_rad * 180.0 / FLOW_PI, st->re, st->iteration,
            st->residual_max, st->update, st->relax, st->transition_moved ? "T" : "",
            st->stagnation_moved ? "S" : "", st->exact_rule ? "" : "*", xu, xl);
  }
  fputc('\n', fp);
}

/* Viscous analysis of one point; output to fp. Returns an exit code. */
static int flow_viscous(FILE *fp, const char *arg, double alpha_deg, const ascr_visc_params *vp,
                        size_t panels, int json, int csv, const char *plotdir, int history)
{
  cli_analysis an;
  int rc = cli_analysis_open(&an, arg, panels);
  if (rc) return rc;
  ascr_errbuf err;
  ascr_status st = ascr_visc_solver_set(an.visc, an.panel, vp, &err);
  ascr_visc_result r;
  memset(&r, 0, sizeof r);
  flow_history hh = {NULL, 0, 0, 0};
  if (history) ascr_visc_solver_set_trace(an.visc, history_add, &hh);
  if (st == ASCR_OK) st = ascr_polar_solve_point(an.visc, alpha_deg, &r, &err);
  ascr_visc_solver_set_trace(an.visc, NULL, NULL);
  if (st != ASCR_OK && st != ASCR_EMAXITER) {
    cli_error("%s", err.msg);
    free(hh.steps);
    cli_analysis_close(&an);
    return cli_exit_for(st);
  }
  if (hh.failed) {
    cli_error("out of memory");
    free(hh.steps);
    cli_analysis_close(&an);
    return CLI_EXIT_INTERNAL;
  }
  int ok = r.converged;
  size_t ns = ascr_visc_solver_stations(an.visc), n = ascr_geom_section_size(an.section);
  int *side = calloc(ns, sizeof *side), *turb = calloc(ns, sizeof *turb);
  double *buf = calloc(10 * ns + n, sizeof *buf);
  if (side == NULL || turb == NULL || buf == NULL) {
    free(side); free(turb); free(buf); free(hh.steps);
    cli_analysis_close(&an);
    cli_error("out of memory");
    return CLI_EXIT_INTERNAL;
  }
  double *ss = buf, *x = buf + ns, *y = buf + 2 * ns, *ue = buf + 3 * ns, *ds = buf + 4 * ns;
  double *th = buf + 5 * ns, *h = buf + 6 * ns, *cf = buf + 7 * ns, *am = buf + 8 * ns;
  double *cps = buf + 9 * ns, *cp = buf + 10 * ns;
  ascr_visc_solver_distributions(an.visc, side, ss, x, y, ue, ds, th, h, cf, am, turb);
  ascr_visc_solver_cp(an.visc, cp);
  for (size_t k = 0; k < ns; k++) cps[k] = 1.0 - ue[k] * ue[k];
  const char *name = ascr_geom_section_name(an.section);
  if (ok && plotdir != NULL) {
    double *cpi = calloc(n, sizeof *cpi);
    ascr_panel_result pr;
    ascr_errbuf perr;
    if (cpi == NULL || ascr_panel_solver_solve(an.panel, alpha_deg * FLOW_PI / 180.0, vp->mach, &pr,
                                               cpi, NULL, &perr) != ASCR_OK) {
      cli_error("flow --plot: the inviscid Cp for the figure could not be computed");
      rc = CLI_EXIT_INTERNAL;
    } else {
      char title[200];
      snprintf(title, sizeof title, "%.40s: #ga %.2f deg, Re %.0f", name, alpha_deg, vp->re);
      rc = fig_flow(plotdir, title, ns, side, x, cps, ds, h, cf, turb, n,
                    ascr_geom_section_x(an.section), cpi);
    }
    free(cpi);
    if (rc != 0) {
      free(side); free(turb); free(buf); free(hh.steps);
      cli_analysis_close(&an);
      return rc;
    }
  }
  if (!ok) {
    cli_error("flow: %s at alpha %.2f deg, Re %.0f did not converge after %d iterations "
              "(largest relative update %.2e); no result is reported", name, alpha_deg, vp->re,
              r.iterations, r.residual);
    rc = CLI_EXIT_ANALYSIS;
  }
  if (json) {
    json_t *o = json_object();
    json_object_set_new(o, "section", json_string(name));
    json_object_set_new(o, "analysis", json_string("viscous"));
    json_object_set_new(o, "alpha_deg", json_real(alpha_deg));
    json_object_set_new(o, "re", json_real(vp->re));
    json_object_set_new(o, "mach", json_real(vp->mach));
    json_object_set_new(o, "ncrit", json_real(vp->ncrit));
    json_object_set_new(o, "trip_upper", vp->trip_upper <= 1.0 ? json_real(vp->trip_upper) : json_null());
    json_object_set_new(o, "trip_lower", vp->trip_lower <= 1.0 ? json_real(vp->trip_lower) : json_null());
    json_object_set_new(o, "n_panels", json_integer((json_int_t)panels));
    json_object_set_new(o, "converged", json_boolean(ok));
    json_object_set_new(o, "iterations", json_integer(r.iterations));
    json_object_set_new(o, "residual", json_real(r.residual));
    json_object_set_new(o, "cl", cli_json_num(ok, r.cl));
    json_object_set_new(o, "cm", cli_json_num(ok, r.cm));
    json_object_set_new(o, "cd", cli_json_num(ok, r.cd));
    json_object_set_new(o, "cdf", cli_json_num(ok, r.cdf));
    json_object_set_new(o, "cdp", cli_json_num(ok, r.cdp));
    json_object_set_new(o, "x_transition_upper", cli_json_num(ok, r.x_transition_upper));
    json_object_set_new(o, "x_transition_lower", cli_json_num(ok, r.x_transition_lower));
    json_object_set_new(o, "x_separation_upper", cli_json_num(ok, r.x_separation_upper));
    json_object_set_new(o, "x_reattachment_upper", cli_json_num(ok, r.x_reattach_upper));
    json_object_set_new(o, "x_separation_lower", cli_json_num(ok, r.x_separation_lower));
    json_object_set_new(o, "x_reattachment_lower", cli_json_num(ok, r.x_reattach_lower));
    if (ok) {
      json_t *sf = json_object();
      json_object_set_new(sf, "x", darray(ascr_geom_section_x(an.section), n));
      json_object_set_new(sf, "y", darray(ascr_geom_section_y(an.section), n));
      json_object_set_new(sf, "cp", darray(cp, n));
      json_object_set_new(o, "surface", sf);
      json_t *bl = json_object(), *sa = json_array(), *ta = json_array();
      for (size_t k = 0; k < ns; k++) {
        json_array_append_new(sa, json_string(side[k] == 0 ? "upper" : side[k] == 1 ? "lower" : "wake"));
        json_array_append_new(ta, json_boolean(turb[k]));
      }
      json_object_set_new(bl, "side", sa);
      json_object_set_new(bl, "s", darray(ss, ns));
      json_object_set_new(bl, "x", darray(x, ns));
      json_object_set_new(bl, "y", darray(y, ns));
      json_object_set_new(bl, "ue", darray(ue, ns));
      json_object_set_new(bl, "dstar", darray(ds, ns));
      json_object_set_new(bl, "theta", darray(th, ns));
      json_object_set_new(bl, "shape_factor", darray(h, ns));
      json_object_set_new(bl, "cf", darray(cf, ns));
      json_object_set_new(bl, "n_or_sqrt_ctau", darray(am, ns));
      /* the same split by regime (issue 17): N where laminar, sqrt(Ctau) where turbulent, null
       * elsewhere; and the displacement thickness under its full name */
      json_t *na = json_array(), *ca = json_array();
      for (size_t k = 0; k < ns; k++) {
        json_array_append_new(na, turb[k] ? json_null() : cli_json_num(1, am[k]));
        json_array_append_new(ca, turb[k] ? cli_json_num(1, am[k]) : json_null());
      }
      json_object_set_new(bl, "n_amp", na);
      json_object_set_new(bl, "sqrt_ctau", ca);
      json_object_set_new(bl, "delta_star", darray(ds, ns));
      json_object_set_new(bl, "turbulent", ta);
      json_object_set_new(o, "boundary_layer", bl);
    }
    if (history) json_object_set_new(o, "history", history_json(&hh));
    json_object_set_new(o, "note", json_string(CLI_ESTIMATE_NOTE));
    json_dumpf(o, fp, JSON_REAL_PRECISION(10) | JSON_COMPACT);
    fputc('\n', fp);
    json_decref(o);
  } else if (ok && csv) {
    fprintf(fp, "# section: %s\n# analysis: viscous\n# alpha_deg: %.6f\n# re: %.6g\n# mach: %.4f\n"
            "# ncrit: %.4g\n# cl: %.6f\n# cd: %.6f\n# cdf: %.6f\n# cdp: %.6f\n# cm: %.6f\n",
            name, alpha_deg, vp->re, vp->mach, vp->ncrit, r.cl, r.cd, r.cdf, r.cdp, r.cm);
    /* N where laminar and sqrt(Ctau) where turbulent, each in its own column, blank where the
     * other regime holds (issue 17) */
    fputs("side,s,x,y,ue,cp,delta_star,theta,shape_factor,cf,n_amp,sqrt_ctau,turbulent\n", fp);
    for (size_t k = 0; k < ns; k++) {
      fprintf(fp, "%s,%.6f,%.6f,%.6f,%.6f,%.6f,%.6e,%.6e,%.5f,%.6e,",
              side[k] == 0 ? "upper" : side[k] == 1 ? "lower" : "wake", ss[k], x[k], y[k], ue[k],
              cps[k], ds[k], th[k], h[k], cf[k]);
      if (turb[k]) fprintf(fp, ",%.5f,1\n", am[k]);
      else fprintf(fp, "%.5f,,0\n", am[k]);
    }
  } else if (!ok && history) {
    history_table(fp, &hh);
  } else if (ok) {
    char tu[16], tl[16];
    snprintf(tu, sizeof tu, isfinite(r.x_transition_upper) ? "%.4f" : "none", r.x_transition_upper);
    snprintf(tl, sizeof tl, isfinite(r.x_transition_lower) ? "%.4f" : "none", r.x_transition_lower);
    fprintf(fp, "section   %s  (%zu panels)\n", name, panels);
    fprintf(fp, "alpha     %.3f deg   Re %.0f   Mach %.3f   N_crit %.3g\n", alpha_deg, vp->re,
            vp->mach, vp->ncrit);
    fprintf(fp, "cl        %.5f\ncd        %.6f  (friction %.6f, pressure %.6f)\n", r.cl, r.cd,
            r.cdf, r.cdp);
    fprintf(fp, "cm        %.5f  (about x/c = 0.25, nose up positive)\n", r.cm);
    fprintf(fp, "L/D       %.2f\n", r.cl / r.cd);
    fprintf(fp, "transition x/c   upper %s   lower %s\n", tu, tl);
    if (isfinite(r.x_separation_upper)) {
      fprintf(fp, "separation upper surface at x/c %.4f", r.x_separation_upper);
      if (isfinite(r.x_reattach_upper)) fprintf(fp, ", reattachment at %.4f", r.x_reattach_upper);
      fputc('\n', fp);
    }
    if (isfinite(r.x_separation_lower)) {
      fprintf(fp, "separation lower surface at x/c %.4f", r.x_separation_lower);
      if (isfinite(r.x_reattach_lower)) fprintf(fp, ", reattachment at %.4f", r.x_reattach_lower);
      fputc('\n', fp);
    }
    fprintf(fp, "converged in %d iterations\nnote      %s\n\n", r.iterations, CLI_ESTIMATE_NOTE);
    if (history) history_table(fp, &hh);
    fprintf(fp, "%6s %9s %9s %8s %10s %10s %7s %9s %7s %9s %s\n", "side", "s", "x/c", "ue/V",
            "delta*/c", "theta/c", "H", "cf", "N", "Ctau^1/2", "state");
    for (size_t k = 0; k < ns; k++) {
      char na[16] = "", ca[16] = ""; /* N where laminar, sqrt(Ctau) where turbulent */
      if (turb[k]) snprintf(ca, sizeof ca, "%.4f", am[k]);
      else snprintf(na, sizeof na, "%.3f", am[k]);
      fprintf(fp, "%6s %9.5f %9.5f %8.4f %10.3e %10.3e %7.3f %9.5f %7s %9s %s\n",
              side[k] == 0 ? "upper" : side[k] == 1 ? "lower" : "wake", ss[k], x[k], ue[k], ds[k],
              th[k], h[k], cf[k], na, ca, turb[k] ? "turbulent" : "laminar");
    }
  }
  free(side);
  free(turb);
  free(buf);
  free(hh.steps);
  cli_analysis_close(&an);
  return rc;
}

int cmd_flow(int argc, char **argv)
{
  static const struct option opts[] = {
    {"alpha", required_argument, NULL, 'a'},  {"inviscid", no_argument, NULL, 'I'},
    {"mach", required_argument, NULL, 'm'},   {"panels", required_argument, NULL, 'p'},
    {"json", no_argument, NULL, 'J'},         {"csv", no_argument, NULL, 'C'},
    {"output", required_argument, NULL, 'o'}, {"force", no_argument, NULL, 'F'},
    {"re", required_argument, NULL, 'R'},     {"help", no_argument, NULL, 'h'},
    {"ncrit", required_argument, NULL, 'N'},  {"turbulence", required_argument, NULL, 'T'},
    {"transition", required_argument, NULL, 'W'},
    {"trip-upper", required_argument, NULL, 'U'}, {"trip-lower", required_argument, NULL, 'L'},
    {"plot", required_argument, NULL, 'G'},   {"history", no_argument, NULL, 'H'},
    {NULL, 0, NULL, 0}};
  cli_visc_opts vo;
  cli_visc_opts_init(&vo);
  double re = NAN;
  int have_visc_opt = 0;
  double alpha_deg = NAN, mach = 0.0;
  size_t panels = 0; /* 0: the default (by Re in a viscous analysis) */
  int inviscid = 0, json = 0, csv = 0, force = 0, have_re = 0, history = 0;
  const char *outpath = NULL, *plotdir = NULL;
  int c;
  opterr = 0;
  cli_getopt_reset();
  while ((c = getopt_long(argc, argv, ":a:m:p:o:r:h", opts, NULL)) != -1) {
    switch (c) {
    case 'a':
      if (cli_parse_double("--alpha", optarg, -90.0, 90.0, &alpha_deg)) return CLI_EXIT_USAGE;
      break;
    case 'm':
      if (cli_parse_double("--mach", optarg, 0.0, 0.95, &mach)) return CLI_EXIT_USAGE;
      break;
    case 'p':
      if (cli_parse_size("--panels", optarg, 20, 2000, &panels)) return CLI_EXIT_USAGE;
      break;
    case 'I': inviscid = 1; break;
    case 'r':
    case 'R':
      if (cli_parse_double("--re", optarg, 1e3, 1e8, &re)) return CLI_EXIT_USAGE;
      have_re = 1;
      break;
    case 'N': case 'T': case 'W': case 'U': case 'L':
      if (cli_visc_opts_parse(&vo, c, optarg)) return CLI_EXIT_USAGE;
      have_visc_opt = 1;
      break;
    case 'J': json = 1; break;
    case 'C': csv = 1; break;
    case 'o': outpath = optarg; break;
    case 'G': plotdir = optarg; break;
    case 'H': history = 1; break;
    case 'F': force = 1; break;
    case 'h': flow_help(stdout); return CLI_EXIT_OK;
    case ':': cli_error("flow: option %s needs a value", argv[optind - 1]); return CLI_EXIT_USAGE;
    default: cli_error("flow: unknown option '%s' (see airscrew flow --help)", argv[optind - 1]); return CLI_EXIT_USAGE;
    }
  }
  if (optind != argc - 1) {
    cli_error("flow: give exactly one SECTION (file or spec); see airscrew flow --help");
    return CLI_EXIT_USAGE;
  }
  if (isnan(alpha_deg)) {
    cli_error("flow: --alpha DEG is required");
    return CLI_EXIT_USAGE;
  }
  if (inviscid && (have_re || have_visc_opt)) {
    cli_error("flow: --inviscid excludes --re and the transition options");
    return CLI_EXIT_USAGE;
  }
  if (!inviscid && !have_re) {
    cli_error("flow: give --re RE for the viscous analysis, or --inviscid for potential flow");
    return CLI_EXIT_USAGE;
  }
  if (json && csv) {
    cli_error("flow: --json and --csv exclude each other");
    return CLI_EXIT_USAGE;
  }
  if (history && inviscid) {
    cli_error("flow: --history lists the viscous solver's steps (give --re)");
    return CLI_EXIT_USAGE;
  }
  if (history && csv) {
    cli_error("flow: --history and --csv exclude each other (the history is a second table: "
              "use the table output or --json)");
    return CLI_EXIT_USAGE;
  }
  if (plotdir != NULL && inviscid) {
    cli_error("flow: --plot draws viscous solutions (give --re)");
    return CLI_EXIT_USAGE;
  }
  if (!inviscid) {
    if (mach > 0.7) {
      cli_error("flow: --mach %g is outside the viscous range 0 .. 0.7", mach);
      return CLI_EXIT_USAGE;
    }
    if (fabs(alpha_deg) > 60.0) {
      cli_error("flow: --alpha %g is outside the viscous range -60 .. 60", alpha_deg);
      return CLI_EXIT_USAGE;
    }
    if (panels == 0) panels = ascr_geom_panels_for_re(re);
    if (panels < 40 || panels > 400) {
      cli_error("flow: --panels %zu is outside the viscous range 40 .. 400", panels);
      return CLI_EXIT_USAGE;
    }
  }
  if (cli_check_options_only) return CLI_EXIT_OK;
  /* the output file checked before the plot folder is created (nothing left behind) */
  if (outpath != NULL) {
    int orc = cli_output_check(outpath, force);
    if (orc) return orc;
  }
  if (plotdir != NULL) {
    int prc = fig_prepare_dir(plotdir, (const char *const[]){"flow-cp", "flow-bl", NULL}, force);
    if (prc) return prc;
  }
  if (!inviscid) {
    cli_output vout;
    int vrc = cli_output_open(&vout, outpath, force);
    if (vrc) return vrc;
    ascr_visc_params vp = cli_visc_params(&vo, re, mach);
    vrc = flow_viscous(vout.fp, argv[optind], alpha_deg, &vp, panels, json, csv, plotdir, history);
    /* an unconverged point: its JSON record (converged false, no numbers) or the history of
     * the steps that did not converge is still written */
    if (vrc != 0 && !(vrc == CLI_EXIT_ANALYSIS && (json || history))) {
      cli_output_discard(&vout);
      return vrc;
    }
    int wrc = cli_output_commit(&vout);
    return vrc ? vrc : wrc;
  }
  cli_output out;
  int rc = cli_output_open(&out, outpath, force);
  if (rc) return rc;
  ascr_geom_section *raw = NULL, *s = NULL;
  ascr_panel_solver *w = NULL;
  double *cp = NULL, *q = NULL;
  int from_file = 0;
  rc = cli_load_section(argv[optind], &raw, NULL, &from_file);
  if (rc) goto done;
  ascr_errbuf err;
  ascr_geom_repanel_params rp = ascr_geom_repanel_defaults();
  if (panels == 0) panels = ASCR_GEOM_DEFAULT_PANELS;
  rp.n_panels = panels;
  ascr_status st = ascr_geom_section_repanel(raw, &rp, &s, &err);
  if (st == ASCR_OK) {
    size_t n = ascr_geom_section_size(s);
    w = ascr_panel_solver_alloc(n);
    cp = calloc(n, sizeof *cp);
    q = calloc(n, sizeof *q);
    if (w == NULL || cp == NULL || q == NULL) {
      cli_error("out of memory");
      rc = CLI_EXIT_INTERNAL;
      goto done;
    }
    st = ascr_panel_solver_set(w, s, &err);
  }
  ascr_panel_result res;
  if (st == ASCR_OK) {
    st = ascr_panel_solver_solve(w, alpha_deg * FLOW_PI / 180.0, mach, &res, cp, q, &err);
  }
  if (st != ASCR_OK) {
    cli_error("%s", err.msg);
    rc = cli_exit_for(st);
    goto done;
  }
  char warnbuf[200];
  flow_out f = {s, &res, cp, q, alpha_deg, panels, NULL};
  if (mach > 0.0 && res.cp_min < res.cp_critical) {
    snprintf(warnbuf, sizeof warnbuf,
             "the local flow is supersonic (Cp min %.3f below the critical %.3f): the "
             "Karman-Tsien correction is outside its range",
             res.cp_min, res.cp_critical);
    f.warning = warnbuf;
    cli_warn("%s", warnbuf);
  }
  if (json) write_json(out.fp, &f);
  else if (csv) write_csv(out.fp, &f);
  else write_table(out.fp, &f);
  rc = cli_output_commit(&out);
  out.fp = NULL;
done:
  if (out.fp != NULL) cli_output_discard(&out);
  free(cp);
  free(q);
  ascr_panel_solver_free(w);
  ascr_geom_section_free(s);
  ascr_geom_section_free(raw);
  return rc;
}
