/* src/cli/plot_compare.c
 * "airscrew plot A.json B.json ...": candidates compared. Rotor maps: CT, CP, efficiency, static
 * thrust and power overlaid, and a table of hover rpm and power at a thrust, the best figure of
 * merit and the best efficiency at each airspeed (library: ascr_rotor_summarize). Polars: every
 * curve of every candidate overlaid, and a table of the Reynolds-number study's figures
 * (library: ascr_polar_re_summary_compute). Presentation only.
 */
#include "plot_compare.h"
#include "cli.h"

#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define COL 24 /* width of a candidate's column */

static void row_head(const char *what) { printf("%-28.28s", what); }

static void cell(const char *fmt, ...) __attribute__((format(printf, 1, 2)));
static void cell(const char *fmt, ...)
{
  char b[64];
  va_list ap;
  va_start(ap, fmt);
  vsnprintf(b, sizeof b, fmt, ap);
  va_end(ap);
  printf(" %-*.*s", COL - 1, COL - 1, b);
}

/* a figure label without the plotting library's escapes (#d, #u, #g: sub-, superscript, Greek) */
static void plain(const char *in, char *out, size_t n)
{
  size_t j = 0;
  for (size_t i = 0; in[i] != '\0' && j + 1 < n; i++) {
    if (in[i] == '#' && in[i + 1] != '\0') {
      i += in[i + 1] == 'g' && in[i + 2] != '\0' ? 1 : 0; /* #gX: the Greek letter's Latin key */
      if (in[i + 1] == 'd' || in[i + 1] == 'u') i++;
      continue;
    }
    out[j++] = in[i];
  }
  out[j] = '\0';
}

/* a number in a field of width w with p decimals, or "-" where there is none */
static void num_or_dash(char *b, size_t n, int w, int p, double v)
{
  if (isfinite(v)) snprintf(b, n, "%*.*f", w, p, v);
  else snprintf(b, n, "%*s", w, "-");
}

/* the saved points as the library's results (the fields the summary reads) */
static ascr_rotor_result *as_results(const plot_data *d)
{
  ascr_rotor_result *r = calloc(d->n_rot + 1, sizeof *r);
  for (size_t i = 0; r != NULL && i < d->n_rot; i++) {
    const fig_rotor_point *p = &d->rot[i];
    r[i].rpm = p->rpm;
    r[i].speed_m_s = p->speed;
    r[i].thrust_N = p->thrust;
    r[i].power_W = p->power;
    r[i].CT = p->CT;
    r[i].CP = p->CP;
    r[i].J = p->J;
    r[i].efficiency = p->eta;
    r[i].converged = isfinite(p->thrust) && isfinite(p->power) && isfinite(p->rpm);
  }
  return r;
}

static int compare_rotors(const char *dir, double hover_thrust_N, const char *const *files,
                          const plot_data *pd, size_t n)
{
  ascr_rotor_summary sm[PLOT_MAX_CANDIDATES];
  const char *names[PLOT_MAX_CANDIDATES] = {NULL};
  const fig_rotor_point *pts[PLOT_MAX_CANDIDATES] = {NULL};
  size_t np[PLOT_MAX_CANDIDATES] = {0};
  double speeds[ASCR_SUMMARY_MAX_SPEEDS];
  size_t nsp = 0;
  for (size_t k = 0; k < n; k++) {
    ascr_rotor_result *r = as_results(&pd[k]);
    ascr_errbuf err;
    if (r == NULL) {
      cli_error("out of memory");
      return CLI_EXIT_INTERNAL;
    }
    ascr_status st = ascr_rotor_summarize(r, pd[k].n_rot, hover_thrust_N, &sm[k], &err);
    free(r);
    if (st != ASCR_OK) {
      cli_error("%s", err.msg);
      return CLI_EXIT_USAGE;
    }
    names[k] = pd[k].title;
    pts[k] = pd[k].rot;
    np[k] = pd[k].n_rot;
    for (size_t v = 0; v < sm[k].n_speeds; v++) {
      size_t q = 0;
      while (q < nsp && speeds[q] != sm[k].speed_m_s[v]) q++;
      if (q == nsp && nsp < ASCR_SUMMARY_MAX_SPEEDS) speeds[nsp++] = sm[k].speed_m_s[v];
    }
  }
  int rc = fig_rotor_compare(dir, names, pts, np, n);
  if (rc) return rc;
  printf("rotor candidates compared (BEMT or vortex results as saved; best values among the "
         "points each file holds)\n\n");
  row_head("");
  for (size_t k = 0; k < n; k++) cell("%s", files[k]);
  printf("\n");
  row_head("blade");
  for (size_t k = 0; k < n; k++) cell("%s", pd[k].title);
  printf("\n");
  row_head("converged points");
  for (size_t k = 0; k < n; k++) cell("%zu of %zu", sm[k].n_used, pd[k].n_rot);
  printf("\n");
  if (!isnan(hover_thrust_N)) {
    char h[64];
    snprintf(h, sizeof h, "hover at %.4g N: rpm", hover_thrust_N);
    row_head(h);
    for (size_t k = 0; k < n; k++) {
      if (isnan(sm[k].hover_rpm)) cell("outside the map");
      else cell("%.0f%s", sm[k].hover_rpm, sm[k].hover_interpolated ? " (interpolated)" : "");
    }
    printf("\n");
    row_head("                 power W");
    for (size_t k = 0; k < n; k++) {
      if (isnan(sm[k].hover_power_W)) cell("-");
      else cell("%.4g", sm[k].hover_power_W);
    }
    printf("\n");
  }
  row_head("best static figure of merit");
  for (size_t k = 0; k < n; k++) {
    if (isnan(sm[k].fm_max)) cell("-");
    else cell("%.4f at %.0f rpm", sm[k].fm_max, sm[k].fm_max_rpm);
  }
  printf("\n");
  for (size_t v = 0; v < nsp; v++) {
    char h[64];
    snprintf(h, sizeof h, "best efficiency at %.3g m/s", speeds[v]);
    row_head(h);
    for (size_t k = 0; k < n; k++) {
      size_t q = 0;
      while (q < sm[k].n_speeds && sm[k].speed_m_s[q] != speeds[v]) q++;
      if (q == sm[k].n_speeds || isnan(sm[k].eta_max[q])) cell("-");
      else cell("%.4f at %.0f rpm", sm[k].eta_max[q], sm[k].eta_max_rpm[q]);
    }
    printf("\n");
  }
  printf("\nfigures written to %s/ (compare-rotor.svg, .png)\n", dir);
  return 0;
}

static int compare_polars(const char *dir, const plot_data *pd, size_t n)
{
  size_t tot = 0;
  for (size_t k = 0; k < n; k++) tot += pd[k].n_pol;
  fig_polar *all = calloc(tot + 1, sizeof *all);
  ascr_polar_re_summary *sm = calloc(tot + 1, sizeof *sm);
  size_t *owner = calloc(tot + 1, sizeof *owner);
  const char **curve = calloc(tot + 1, sizeof *curve);
  if (all == NULL || sm == NULL || owner == NULL || curve == NULL) {
    free(all);
    free(sm);
    free(owner);
    free(curve);
    cli_error("out of memory");
    return CLI_EXIT_INTERNAL;
  }
  size_t q = 0;
  int rc = 0;
  for (size_t k = 0; k < n && rc == 0; k++) {
    for (size_t c = 0; c < pd[k].n_pol && rc == 0; c++, q++) {
      const fig_polar *f = &pd[k].pol[c];
      all[q] = *f;
      owner[q] = k;
      curve[q] = f->label;
      snprintf(all[q].label, sizeof all[q].label, "%.40s: %.50s", pd[k].title, f->label);
      ascr_polar_point *pts = calloc(f->n + 1, sizeof *pts);
      if (pts == NULL) {
        cli_error("out of memory");
        rc = CLI_EXIT_INTERNAL;
        break;
      }
      for (size_t i = 0; i < f->n; i++) {
        ascr_polar_point *p = &pts[i];
        p->alpha_deg = f->alpha[i];
        p->cl = f->cl[i];
        p->cd = f->cd[i];
        p->cm = f->cm[i];
        p->converged = isfinite(f->cl[i]) && isfinite(f->cd[i]);
        p->x_transition_upper = p->x_transition_lower = NAN;
        p->x_separation_upper = p->x_reattach_upper = NAN;
        p->x_separation_lower = p->x_reattach_lower = NAN;
        p->other_cl = p->other_cd = p->other_cm = NAN;
      }
      if (ascr_polar_re_summary_compute(pts, f->n, 0.5, &sm[q], NULL) != ASCR_OK) sm[q].n_converged = 0;
      free(pts);
    }
  }
  if (rc == 0) {
    char base[4200];
    snprintf(base, sizeof base, "%s/compare-polar", dir);
    rc = fig_polar_set(base, "lift, candidates compared", all, q);
  }
  if (rc == 0) {
    printf("polar candidates compared (each curve's figures as in the Reynolds-number study)\n\n");
    printf("%-30s %-24s %9s %8s %8s %8s %8s %8s %9s\n", "candidate", "curve", "cd_min", "cl there",
           "L/D max", "cl there", "cl_max", "alpha_0", "slope/deg");
    for (size_t i = 0; i < q; i++) {
      const ascr_polar_re_summary *s = &sm[i];
      char lab[96], f[7][24];
      plain(curve[i], lab, sizeof lab);
      num_or_dash(f[0], sizeof f[0], 9, 5, s->cd_min);
      num_or_dash(f[1], sizeof f[1], 8, 4, s->cl_at_cd_min);
      num_or_dash(f[2], sizeof f[2], 8, 2, s->ld_max);
      num_or_dash(f[3], sizeof f[3], 8, 4, s->cl_at_ld_max);
      num_or_dash(f[4], sizeof f[4], 8, 4, s->cl_max);
      num_or_dash(f[5], sizeof f[5], 8, 3, s->alpha_zero_lift_deg);
      num_or_dash(f[6], sizeof f[6], 9, 4, s->lift_slope_per_deg);
      printf("%-30.30s %-24.24s %s %s %s %s %s %s %s\n", pd[owner[i]].title, lab, f[0], f[1], f[2],
             f[3], f[4], f[5], f[6]);
    }
    printf("\nfigures written to %s/ (compare-polar.svg, .png)\n", dir);
  }
  free(all);
  free(sm);
  free(owner);
  free(curve);
  return rc;
}

int plot_compare(const char *dir, int force, double hover_thrust_N, const char *const *files,
                 const plot_data *pd, size_t n)
{
  for (size_t k = 1; k < n; k++) {
    if (pd[k].kind != pd[0].kind) {
      cli_error("plot: %s is a %s result and %s a %s result: compare results of one kind", files[0],
                pd[0].kind == PLOT_POLARS ? "polar" : "rotor", files[k],
                pd[k].kind == PLOT_POLARS ? "polar" : "rotor");
      return CLI_EXIT_USAGE;
    }
  }
  if (pd[0].kind == PLOT_POLARS && !isnan(hover_thrust_N)) {
    cli_error("plot: --hover-thrust compares two or more rotor results; these are polars");
    return CLI_EXIT_USAGE;
  }
  const char *name = pd[0].kind == PLOT_POLARS ? "compare-polar" : "compare-rotor";
  int rc = fig_prepare_dir(dir, (const char *const[]){name, NULL}, force);
  if (rc) return rc;
  return pd[0].kind == PLOT_POLARS ? compare_polars(dir, pd, n)
                                   : compare_rotors(dir, hover_thrust_N, files, pd, n);
}
