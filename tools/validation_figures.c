/* tools/validation_figures.c
 * Figures of the validation report: for each comparison table written by the validation tests
 * (AIRSCREW_VALIDATION_OUT, see tools/validation-report.sh), the published values as markers and
 * airscrew's as lines, through the CLI's plotting code (PLplot, cairo drivers).
 * usage: validation_figures DATA_DIR OUT_DIR   (writes OUT_DIR/<table>.svg and .png)
 */
#define _POSIX_C_SOURCE 200809L
#include "cli.h"
#include "cli_csv.h"
#include "cli_plot.h"

#include <errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>

typedef struct vf_series {
  const char *col, *label;
  int marker;
} vf_series;

typedef struct vf_panel {
  const char *title, *ylabel;
  vf_series s[3];
} vf_panel;

typedef struct vf_figure {
  const char *table;  /* data file <table>.csv */
  const char *group;  /* column whose values split the rows into curves, or NULL */
  const char *x, *xlabel;
  int n_panels;
  vf_panel p[3];
} vf_figure;

/* One figure per comparison table that has a curve (the single-number lift-slope check has
 * none). Column names are those the validation tests write. */
static const vf_figure figures[] = {
  {"da4002_9in_5000rpm", NULL, "J", "advance ratio J", 3,
   {{"thrust coefficient", "C#dT#u", {{"CT_measured", "measured", 1}, {"CT_bemt", "airscrew BEMT", 0}, {"CT_vortex", "airscrew vortex", 0}}},
    {"power coefficient", "C#dP#u", {{"CP_measured", "measured", 1}, {"CP_bemt", "airscrew BEMT", 0}, {"CP_vortex", "airscrew vortex", 0}}},
    {"efficiency", "η", {{"eta_measured", "measured", 1}, {"eta_bemt", "airscrew BEMT", 0}, {NULL, NULL, 0}}}}},
  /* closed form: one curve per section lift slope (2pi, 5.73 per rad) */
  {"closed_form_hover", "lift_slope", "theta_deg", "collective pitch #gh (deg)", 2,
   {{"thrust coefficient", "C#dT#u", {{"CT_reference", "closed form", 1}, {"CT_airscrew", "airscrew", 0}, {NULL, NULL, 0}}},
    {"power coefficient", "C#dP#u", {{"CPi_reference", "closed form (induced)", 1}, {"CP_airscrew", "airscrew", 0}, {NULL, NULL, 0}}}}},
  {"naca0012_re6e6_smooth", NULL, "cl", "lift coefficient c#dl#u", 1,
   {{"NACA 0012, Re 6e6, smooth", "drag coefficient c#dd#u", {{"cd_reference", "Abbott & von Doenhoff", 1}, {"cd_airscrew", "airscrew", 0}, {NULL, NULL, 0}}}}},
  {"naca0012_re6e6_tripped", NULL, "cl", "lift coefficient c#dl#u", 1,
   {{"NACA 0012, Re 6e6, tripped", "drag coefficient c#dd#u", {{"cd_reference", "Ladson, NASA TM-4074", 1}, {"cd_airscrew", "airscrew", 0}, {NULL, NULL, 0}}}}},
  {"sd7003_re1e5", NULL, "cl", "lift coefficient c#dl#u", 1,
   {{"SD7003, Re 1.0e5", "drag coefficient c#dd#u", {{"cd_reference", "UIUC tunnel", 1}, {"cd_airscrew", "airscrew", 0}, {NULL, NULL, 0}}}}},
};

static double cell_num(const cli_csv *t, size_t r, int c)
{
  double v;
  const char *s = c >= 0 ? t->cell[r * t->ncol + (size_t)c] : NULL;
  return (s != NULL && cli_parse_number(s, &v) == 0) ? v : NAN;
}

enum { VF_MAX_GROUPS = 4, VF_MAX_SERIES = 12 };

static int draw(const vf_figure *f, const char *data_dir, const char *out_dir)
{
  char path[4096], base[4096];
  snprintf(path, sizeof path, "%s/%s.csv", data_dir, f->table);
  snprintf(base, sizeof base, "%s/%s", out_dir, f->table);
  struct stat sb;
  if (stat(path, &sb) != 0) return 0; /* that test did not run or wrote nothing */
  cli_csv t;
  if (cli_csv_read(path, &t) != 0) return 1;
  int xc = cli_csv_col(&t, f->x), gc = f->group != NULL ? cli_csv_col(&t, f->group) : -1;
  if (xc < 0 || (f->group != NULL && gc < 0)) {
    cli_error("%s: column '%s' missing", path, xc < 0 ? f->x : f->group);
    cli_csv_free(&t);
    return 1;
  }
  /* groups in order of first appearance */
  const char *gname[VF_MAX_GROUPS];
  size_t ng = 0;
  for (size_t r = 0; r < t.nrow; r++) {
    const char *g = gc >= 0 && t.cell[r * t.ncol + (size_t)gc] ? t.cell[r * t.ncol + (size_t)gc] : "";
    size_t k = 0;
    while (k < ng && strcmp(gname[k], g) != 0) k++;
    if (k == ng && ng < VF_MAX_GROUPS) gname[ng++] = g;
  }
  double *buf = calloc(2 * t.nrow * VF_MAX_SERIES * 3 + 1, sizeof *buf);
  char labels[3][VF_MAX_SERIES][96];
  plot_series ser[3][VF_MAX_SERIES];
  plot_panel pan[3];
  if (buf == NULL) {
    cli_csv_free(&t);
    return 1;
  }
  double *b = buf;
  for (int p = 0; p < f->n_panels; p++) {
    size_t ns = 0;
    for (size_t g = 0; g < ng; g++) {
      for (int s = 0; s < 3 && f->p[p].s[s].col != NULL; s++) {
        int yc = cli_csv_col(&t, f->p[p].s[s].col);
        double *x = b, *y = b + t.nrow;
        size_t n = 0;
        for (size_t r = 0; r < t.nrow; r++) {
          const char *gv = gc >= 0 && t.cell[r * t.ncol + (size_t)gc] ? t.cell[r * t.ncol + (size_t)gc] : "";
          if (strcmp(gv, gname[g]) != 0) continue;
          x[n] = cell_num(&t, r, xc);
          y[n] = cell_num(&t, r, yc);
          n++;
        }
        b += 2 * t.nrow;
        if (gc >= 0) {
          snprintf(labels[p][ns], sizeof labels[p][ns], "%s (%s)", f->p[p].s[s].label, gname[g]);
        } else {
          snprintf(labels[p][ns], sizeof labels[p][ns], "%s", f->p[p].s[s].label);
        }
        ser[p][ns] = (plot_series){labels[p][ns], n, x, y, f->p[p].s[s].marker};
        ns++;
      }
    }
    pan[p] = (plot_panel){f->p[p].title, f->xlabel, f->p[p].ylabel, ser[p], ns};
  }
  int nx = f->n_panels > 1 ? 2 : 1, ny = f->n_panels > 2 ? 2 : 1;
  int rc = plot_figure(base, f->table, nx, ny, pan, (size_t)f->n_panels);
  free(buf);
  cli_csv_free(&t);
  return rc;
}

int main(int argc, char **argv)
{
  if (argc != 3) {
    fprintf(stderr, "usage: validation_figures DATA_DIR OUT_DIR\n");
    return 2;
  }
  if (mkdir(argv[2], 0755) != 0 && errno != EEXIST) {
    fprintf(stderr, "validation_figures: %s: %s\n", argv[2], strerror(errno));
    return 5;
  }
  int fail = 0;
  for (size_t i = 0; i < sizeof figures / sizeof figures[0]; i++) {
    if (draw(&figures[i], argv[1], argv[2]) != 0) fail = 1;
  }
  return fail;
}
