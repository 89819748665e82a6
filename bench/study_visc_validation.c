/* bench/study_visc_validation.c
 * Section polars against the UIUC low-speed airfoil tests (Selig et al.; reference/sd7003_*,
 * sd8000_*, clarky_*: every Reynolds number the drag files hold). Figures only (the issue-12 baseline); per (section, Re):
 *   - drag: mean and largest |cd error| at the measured cl, over the measured low-drag range
 *     (points whose cd is at most 1.5 times the run's smallest cd: our definition of "attached"),
 *     and the mean signed error (bias, + = computed high);
 *   - lift: mean and largest |cl error| at the measured angle, -2 to 6 deg, from the lift run of
 *     the nearest Re (within 5 %; the up-going branch of the loop only), and the signed mean;
 *   - cl_max: measured (up-going branch) against the sweep's largest cl, -4 to 16 deg;
 *   - converged points of the sweep.
 * Polars: 160 panels, N_crit 9, -4 to 16 deg by 0.5 deg, at the run's average Re.
 * Arguments: [reference folder] (default: reference). Reading: libcsv after the '#' lines.
 */
#include <airscrew/airscrew.h>
#include <csv.h>
#include <gsl/gsl_errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

void openblas_set_num_threads(int num_threads);

#define MAXROWS 400
#define MAXCOLS 10

typedef struct table {
  double v[MAXROWS][MAXCOLS];
  size_t nrow;
  size_t col;
  int header_done;
} table;

static void on_field(void *s, size_t len, void *ctx)
{
  table *t = ctx;
  if (!t->header_done || t->nrow >= MAXROWS || t->col >= MAXCOLS) {
    t->col++;
    return;
  }
  char buf[64];
  size_t n = len < sizeof buf - 1 ? len : sizeof buf - 1;
  memcpy(buf, s, n);
  buf[n] = '\0';
  char *end = NULL;
  double x = strtod(buf, &end);
  t->v[t->nrow][t->col++] = end != buf ? x : NAN;
}

static void on_row(int c, void *ctx)
{
  (void)c;
  table *t = ctx;
  if (!t->header_done) t->header_done = 1;
  else if (t->nrow < MAXROWS) t->nrow++;
  t->col = 0;
}

/* Read a reference CSV: '#' lines skipped, the header row skipped, numeric fields kept
 * (non-numeric as NaN). 0 on success. */
static int read_table(const char *path, table *t)
{
  memset(t, 0, sizeof *t);
  FILE *fp = fopen(path, "r");
  if (fp == NULL) return 1;
  struct csv_parser p;
  if (csv_init(&p, CSV_APPEND_NULL) != 0) {
    fclose(fp);
    return 1;
  }
  char line[1024];
  while (fgets(line, sizeof line, fp)) {
    if (line[0] == '#') continue;
    csv_parse(&p, line, strlen(line), on_field, on_row, t);
  }
  csv_fini(&p, on_field, on_row, t);
  csv_free(&p);
  fclose(fp);
  return 0;
}

typedef struct polar {
  ascr_polar_point p[64];
  size_t n, n_conv;
} polar;

/* cd of the converged polar at cl (on the branch below the largest cl), NaN outside */
static double cd_at_cl(const polar *pl, double cl)
{
  for (size_t i = 0; i + 1 < pl->n; i++) {
    const ascr_polar_point *a = &pl->p[i], *b = &pl->p[i + 1];
    if (!a->converged || !b->converged || b->cl < a->cl) continue;
    if (a->cl <= cl && cl <= b->cl) {
      double f = b->cl > a->cl ? (cl - a->cl) / (b->cl - a->cl) : 0.0;
      return a->cd + f * (b->cd - a->cd);
    }
  }
  return NAN;
}

static void run_polar(ascr_visc_solver *v, ascr_panel_solver *w, double re, polar *pl)
{
  ascr_visc_params p = ascr_visc_params_defaults();
  p.re = re;
  ascr_visc_solver_set(v, w, &p, NULL);
  pl->n = ascr_polar_grid_size(-4.0, 16.0, 0.5);
  ascr_polar_summary sum;
  ascr_polar_sweep(v, -4.0, 16.0, 0.5, pl->p, &sum, NULL, NULL, NULL);
  pl->n_conv = sum.n_converged;
}

int main(int argc, char **argv)
{
  gsl_set_error_handler_off();
  openblas_set_num_threads(1);
  const char *dir = argc > 1 ? argv[1] : "reference";
  const char *names[] = {"sd7003", "sd8000", "clarky"};
  printf("%-7s %7s %5s | %-30s | %-29s | %-13s\n", "section", "Re", "conv",
         "cd err % mean / max / bias (n)", "cl err mean / max / bias (n)", "cl_max calc/meas");
  for (int is = 0; is < 3; is++) {
    char path[512];
    table drag, lift;
    snprintf(path, sizeof path, "%s/%s_uiuc_lsat_drag.csv", dir, names[is]);
    if (read_table(path, &drag) != 0) {
      fprintf(stderr, "cannot read %s\n", path);
      return 1;
    }
    snprintf(path, sizeof path, "%s/%s_uiuc_lsat_lift.csv", dir, names[is]);
    if (read_table(path, &lift) != 0) {
      fprintf(stderr, "cannot read %s\n", path);
      return 1;
    }
    snprintf(path, sizeof path, "%s/%s_coords_uiuc.csv", dir, names[is]);
    ascr_geom_section *raw = NULL, *s = NULL;
    if (ascr_geom_section_read(path, &raw, NULL, NULL) != ASCR_OK ||
        ascr_geom_section_repanel(raw, NULL, &s, NULL) != ASCR_OK) {
      fprintf(stderr, "cannot load %s\n", path);
      return 1;
    }
    size_t n = ascr_geom_section_size(s);
    ascr_panel_solver *w = ascr_panel_solver_alloc(n);
    ascr_panel_solver_set(w, s, NULL);
    ascr_visc_solver *v = ascr_visc_solver_alloc(n, ascr_visc_default_wake_nodes(n));
    /* the distinct Reynolds numbers of the drag file (column 0), in file order */
    double res[16];
    size_t nre = 0;
    for (size_t r = 0; r < drag.nrow && nre < 16; r++) {
      int seen = 0;
      for (size_t k = 0; k < nre; k++) seen |= res[k] == drag.v[r][0];
      if (!seen) res[nre++] = drag.v[r][0];
    }
    for (size_t ir = 0; ir < nre; ir++) {
      double re = res[ir];
      /* measured: smallest cd of the run, the lift run of the nearest Re */
      double cdmin = INFINITY;
      for (size_t r = 0; r < drag.nrow; r++) {
        if (drag.v[r][0] == re) cdmin = fmin(cdmin, drag.v[r][3]);
      }
      double re_lift = NAN;
      for (size_t r = 0; r < lift.nrow; r++) {
        double x = lift.v[r][0];
        if (fabs(x - re) <= 0.05 * re && (isnan(re_lift) || fabs(x - re) < fabs(re_lift - re))) re_lift = x;
      }
      {
        polar pl;
        run_polar(v, w, re, &pl);
        double sd = 0.0, md = 0.0, bd = 0.0;
        size_t nd = 0;
        for (size_t r = 0; r < drag.nrow; r++) {
          if (drag.v[r][0] != re || drag.v[r][3] > 1.5 * cdmin) continue;
          double c = cd_at_cl(&pl, drag.v[r][2]);
          if (!isfinite(c)) continue;
          double e = fabs(c - drag.v[r][3]) / drag.v[r][3];
          bd += (c - drag.v[r][3]) / drag.v[r][3];
          sd += e;
          md = fmax(md, e);
          nd++;
        }
        double sl = 0.0, ml = 0.0, bl = 0.0, clmax_meas = -INFINITY, aprev = -INFINITY;
        size_t nl = 0;
        int up = 1;
        for (size_t r = 0; r < lift.nrow; r++) {
          if (lift.v[r][0] != re_lift) continue;
          double a = lift.v[r][1], clm = lift.v[r][2];
          if (a < aprev - 0.05) up = 0; /* the return branch of the loop */
          aprev = a;
          if (!up) continue;
          clmax_meas = fmax(clmax_meas, clm);
          if (a < -2.0 || a > 6.0) continue;
          double c = ascr_polar_cl_at_alpha(pl.p, pl.n, a);
          if (!isfinite(c)) continue;
          sl += fabs(c - clm);
          bl += c - clm;
          ml = fmax(ml, fabs(c - clm));
          nl++;
        }
        double clmax = -INFINITY;
        for (size_t i = 0; i < pl.n; i++) {
          if (pl.p[i].converged) clmax = fmax(clmax, pl.p[i].cl);
        }
        printf("%-7s %7.0f %2zu/%-2zu | %6.1f / %6.1f / %+6.1f (%2zu) | %.3f / %.3f / %+.3f (%2zu) | %5.2f / %5.2f\n",
               names[is], re, pl.n_conv, pl.n,
               nd ? 100.0 * sd / (double)nd : NAN, nd ? 100.0 * md : NAN,
               nd ? 100.0 * bd / (double)nd : NAN, nd,
               nl ? sl / (double)nl : NAN, nl ? ml : NAN, nl ? bl / (double)nl : NAN, nl,
               clmax, clmax_meas);
        fflush(stdout);
      }
    }
    ascr_visc_solver_free(v);
    ascr_panel_solver_free(w);
    ascr_geom_section_free(s);
    ascr_geom_section_free(raw);
  }
  return 0;
}
