/* src/cli/plot_read.c
 * The plot command's reading of a saved result (a JSON object, or a CSV file already turned into
 * the same form) into the figure data of cli_figures.h. No drawing here, so that a fuzz target
 * can run every check on hostile input (fuzz/fuzz_result_json.c).
 */
#include "plot_read.h"
#include "cli.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

static double jnum(json_t *o, const char *k)
{
  json_t *v = json_object_get(o, k);
  return json_is_number(v) ? json_number_value(v) : NAN;
}

/* The numeric fields of an object: absent or null read as NaN (an unconverged point), a
 * number as itself, anything else is an error naming the file, the place and the field.
 * Returns 0 or CLI_EXIT_INPUT (message printed). */
static int jnums(const char *file, const char *where, size_t i, json_t *o, const char *const *keys,
                 double *const *out, size_t nk)
{
  if (!json_is_object(o)) {
    cli_error("%s: %s[%zu]: expected an object", file, where, i);
    return CLI_EXIT_INPUT;
  }
  for (size_t k = 0; k < nk; k++) {
    json_t *v = json_object_get(o, keys[k]);
    if (v != NULL && !json_is_null(v) && !json_is_number(v)) {
      cli_error("%s: %s[%zu].%s: expected a number", file, where, i, keys[k]);
      return CLI_EXIT_INPUT;
    }
    *out[k] = json_is_number(v) ? json_number_value(v) : NAN;
  }
  return 0;
}

/* The Reynolds-number study of a polar result (its "re_summary", issue 12): one series per Mach
 * number, kept where the result holds at least two Reynolds numbers. */
static int read_re_summary(const char *file, json_t *root, plot_data *d)
{
  enum { MAXM = PLOT_MAX_MACH };
  json_t *rs = json_object_get(root, "re_summary");
  size_t n = json_array_size(rs);
  if (n < 2) return 0;
  if (n > 4096) {
    cli_error("%s: re_summary: too many entries", file);
    return CLI_EXIT_INPUT;
  }
  double *v = calloc(11 * n, sizeof *v);
  double *b = calloc(8 * n, sizeof *b);
  fig_re_series *fs = d->re;
  if (v == NULL || b == NULL) {
    free(v);
    free(b);
    return CLI_EXIT_INTERNAL;
  }
  static const char *const keys[7] = {"re", "mach", "cd_min", "ld_max", "cl_max",
                                      "alpha_zero_lift_deg", "lift_slope_per_deg"};
  static const char *const bkeys[3] = {"cl", "x_separation_upper", "x_reattach_upper"};
  int rc = 0;
  for (size_t i = 0; i < n && rc == 0; i++) {
    json_t *o = json_array_get(rs, i);
    double *row = v + 11 * i;
    double *out[7] = {row, row + 1, row + 2, row + 3, row + 4, row + 5, row + 6};
    rc = jnums(file, "re_summary", i, o, keys, out, 7);
    if (rc != 0) break;
    json_t *bo = json_object_get(o, "bubble");
    double *bout[3] = {row + 7, row + 8, row + 9};
    if (bo != NULL) {
      char where[40];
      snprintf(where, sizeof where, "re_summary[%zu].bubble", i);
      rc = jnums(file, where, 0, bo, bkeys, bout, 3);
      json_t *st = json_object_get(bo, "status");
      row[10] = json_is_string(st) && strcmp(json_string_value(st), "closed") == 0;
    } else {
      row[7] = row[8] = row[9] = NAN;
      row[10] = 0.0;
    }
  }
  /* group by Mach number, in the order met */
  double machs[MAXM];
  size_t nm = 0, used = 0, distinct_re = 0;
  for (size_t i = 0; i < n && rc == 0; i++) {
    double m = v[11 * i + 1];
    size_t k = 0;
    while (k < nm && !(machs[k] == m || (isnan(machs[k]) && isnan(m)))) k++;
    if (k == nm && nm < MAXM) machs[nm++] = m;
  }
  for (size_t k = 0; k < nm && rc == 0; k++) {
    fig_re_series *f = &fs[k];
    double *c = b + used;
    size_t cnt = 0;
    for (size_t i = 0; i < n; i++) {
      double m = v[11 * i + 1];
      if (!(m == machs[k] || (isnan(m) && isnan(machs[k])))) continue;
      cnt++;
    }
    for (size_t i = 0, j = 0; i < n; i++) {
      const double *row = v + 11 * i;
      if (!(row[1] == machs[k] || (isnan(row[1]) && isnan(machs[k])))) continue;
      c[j] = row[0];
      for (int q = 0; q < 5; q++) c[(size_t)(q + 1) * cnt + j] = row[2 + q];
      c[6 * cnt + j] = row[8];
      c[7 * cnt + j] = row[10] > 0.0 ? row[9] : NAN;
      j++;
    }
    fig_re_series_bind(f, machs[k], cnt, c);
    used += 8 * cnt;
    distinct_re = cnt > distinct_re ? cnt : distinct_re;
  }
  if (rc == 0 && distinct_re >= 2) {
    d->n_re = nm;
    d->bubble_cl = v[7];
    d->re_buf = b;
    b = NULL;
  }
  free(v);
  free(b);
  return rc;
}

static int read_polars(const char *file, json_t *root, plot_data *d)
{
  json_t *pl = json_object_get(root, "polars");
  size_t np = json_array_size(pl);
  if (np == 0 || np > 256) {
    cli_error("%s: polars: empty or too many", file);
    return CLI_EXIT_INPUT;
  }
  fig_polar *f = calloc(np, sizeof *f);
  if (f == NULL) return CLI_EXIT_INTERNAL;
  d->pol = f;
  d->n_pol = np;
  int rc = 0;
  for (size_t k = 0; k < np && rc == 0; k++) {
    json_t *po = json_array_get(pl, k), *pts = json_object_get(po, "points");
    size_t n = json_array_size(pts);
    if (!json_is_object(po) || n == 0 || n > 100000) {
      cli_error("%s: polars[%zu].points: missing or empty", file, k);
      rc = CLI_EXIT_INPUT;
      break;
    }
    double *b = calloc(4 * n, sizeof *b);
    if (b == NULL) {
      rc = CLI_EXIT_INTERNAL;
      break;
    }
    f[k].n = n;
    f[k].alpha = b;
    f[k].cl = b + n;
    f[k].cd = b + 2 * n;
    f[k].cm = b + 3 * n;
    char where[48];
    snprintf(where, sizeof where, "polars[%zu].points", k);
    static const char *const keys[4] = {"alpha_deg", "cl", "cd", "cm"};
    for (size_t i = 0; i < n && rc == 0; i++) {
      double *out[4] = {&f[k].alpha[i], &f[k].cl[i], &f[k].cd[i], &f[k].cm[i]};
      rc = jnums(file, where, i, json_array_get(pts, i), keys, out, 4);
    }
    if (rc != 0) break;
    json_t *sec = json_object_get(po, "section");
    double re = jnum(po, "re"), mach = jnum(po, "mach"), ncrit = jnum(po, "ncrit");
    char r[32], m[32] = "", nc[40] = "";
    snprintf(r, sizeof r, fabs(re) < 1e15 ? "%.0f" : "%.3g", re);
    if (isfinite(mach) && mach > 0.0) snprintf(m, sizeof m, ", M %.2g", mach);
    if (isfinite(ncrit)) snprintf(nc, sizeof nc, ", N#dcrit#u %.3g", ncrit);
    /* one bounded write: whatever the file holds, the label is cut, never overrun */
    snprintf(f[k].label, sizeof f[k].label, "%.40s%sRe %s%s%s", json_is_string(sec) ? json_string_value(sec) : "",
             json_is_string(sec) ? ", " : "", r, m, nc);
  }
  return rc;
}

static int read_rotor(const char *file, json_t *root, plot_data *d)
{
  json_t *pts = json_object_get(root, "points");
  size_t np = json_array_size(pts);
  if (np == 0 || np > 100000) {
    cli_error("%s: points: empty", file);
    return CLI_EXIT_INPUT;
  }
  fig_rotor_point *f = calloc(np, sizeof *f);
  if (f == NULL) return CLI_EXIT_INTERNAL;
  d->rot = f;
  d->n_rot = np;
  int rc = 0;
  for (size_t k = 0; k < np && rc == 0; k++) {
    json_t *p = json_array_get(pts, k);
    static const char *const keys[8] = {"rpm", "speed_m_s", "J", "CT", "CP", "efficiency",
                                        "thrust_N", "power_W"};
    double *out[8] = {&f[k].rpm, &f[k].speed, &f[k].J, &f[k].CT, &f[k].CP, &f[k].eta,
                      &f[k].thrust, &f[k].power};
    rc = jnums(file, "points", k, p, keys, out, 8);
    if (rc != 0) break;
    f[k].re_075 = jnum(p, "re_075"); /* NaN where absent (results before 2026-12-03) */
    /* the N_crit band, where the result has one (a list of two numbers; anything else: none) */
    const char *bk[2] = {"thrust_band_N", "power_band_W"};
    double *bd[2] = {f[k].thrust_band, f[k].power_band};
    for (int q = 0; q < 2; q++) {
      json_t *a = json_object_get(p, bk[q]);
      int okb = json_is_array(a) && json_array_size(a) == 2 && json_is_number(json_array_get(a, 0)) &&
                json_is_number(json_array_get(a, 1));
      bd[q][0] = okb ? json_number_value(json_array_get(a, 0)) : NAN;
      bd[q][1] = okb ? json_number_value(json_array_get(a, 1)) : NAN;
    }
    json_t *st = json_object_get(p, "stations");
    size_t ns = json_array_size(st);
    if (ns > 0 && ns <= 4000) {
      double *b = calloc(2 * ns, sizeof *b);
      if (b == NULL) {
        rc = CLI_EXIT_INTERNAL;
        break;
      }
      f[k].ns = ns;
      f[k].r_over_R = b;
      f[k].dT_dr = b + ns;
      for (size_t i = 0; i < ns; i++) {
        json_t *e = json_array_get(st, i);
        b[i] = jnum(e, "r_over_R");
        b[ns + i] = jnum(e, "dT_dr_N_per_m");
      }
    }
  }
  return rc;
}

int plot_data_read(const char *file, json_t *root, plot_data *d)
{
  memset(d, 0, sizeof *d);
  d->title = file;
  if (json_is_array(json_object_get(root, "polars"))) {
    d->kind = PLOT_POLARS;
    json_t *sec = json_object_get(root, "section");
    if (json_is_string(sec)) d->title = json_string_value(sec);
    int rc = read_polars(file, root, d);
    if (rc == 0) rc = read_re_summary(file, root, d);
    return rc;
  }
  if (json_is_array(json_object_get(root, "points")) && json_object_get(root, "blade") != NULL) {
    d->kind = PLOT_ROTOR;
    json_t *bl = json_object_get(root, "blade");
    if (json_is_string(bl)) d->title = json_string_value(bl);
    return read_rotor(file, root, d);
  }
  cli_error("%s: neither a polar result (\"polars\") nor a rotor result (\"points\", \"blade\")", file);
  return CLI_EXIT_INPUT;
}

void plot_data_free(plot_data *d)
{
  for (size_t k = 0; d->pol != NULL && k < d->n_pol; k++) free(d->pol[k].alpha);
  free(d->pol);
  for (size_t k = 0; d->rot != NULL && k < d->n_rot; k++) free(d->rot[k].r_over_R);
  free(d->rot);
  free(d->re_buf);
  memset(d, 0, sizeof *d);
}
