/* src/cli/cli_plot.c
 * Figures through PLplot's cairo drivers (svgcairo, pngcairo). Our look: white page, grey grid,
 * a colour-blind-safe palette (Okabe & Ito 2008), labelled axes with units, a legend per panel.
 */
#define _POSIX_C_SOURCE 200809L
#include "cli_plot.h"
#include "cli.h"

#include <errno.h>
#include <math.h>
#include <plplot.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

/* Okabe-Ito: blue, vermillion, bluish green, orange, reddish purple, sky blue, yellow, black */
static const int palette[8][3] = {{0, 114, 178},  {213, 94, 0},  {0, 158, 115}, {230, 159, 0},
                                  {204, 121, 167}, {86, 180, 233}, {200, 170, 0}, {60, 60, 60}};

static void data_range(const plot_panel *p, double *x0, double *x1, double *y0, double *y1)
{
  *x0 = *y0 = HUGE_VAL;
  *x1 = *y1 = -HUGE_VAL;
  for (size_t s = 0; s < p->n_series; s++) {
    const plot_series *q = &p->series[s];
    for (size_t i = 0; i < q->n; i++) {
      if (!isfinite(q->x[i]) || !isfinite(q->y[i])) continue;
      *x0 = fmin(*x0, q->x[i]);
      *x1 = fmax(*x1, q->x[i]);
      *y0 = fmin(*y0, q->y[i]);
      *y1 = fmax(*y1, q->y[i]);
    }
  }
  if (!(*x1 >= *x0)) {
    *x0 = 0.0;
    *x1 = 1.0;
  }
  if (!(*y1 >= *y0)) {
    *y0 = 0.0;
    *y1 = 1.0;
  }
  double dx = *x1 - *x0, dy = *y1 - *y0;
  if (dx <= 0.0) dx = fabs(*x0) > 0.0 ? 0.1 * fabs(*x0) : 1.0;
  if (dy <= 0.0) dy = fabs(*y0) > 0.0 ? 0.1 * fabs(*y0) : 1.0;
  *x0 -= 0.04 * dx;
  *x1 += 0.04 * dx;
  *y0 -= 0.06 * dy;
  *y1 += 0.06 * dy;
}

/* Points of the panel's curves (vertices and, for lines, 8 samples per segment) that fall in the
 * box [bx0, bx1] x [by0, by1] of world coordinates. */
static size_t crowding(const plot_panel *p, double bx0, double bx1, double by0, double by1)
{
  size_t count = 0;
  for (size_t s = 0; s < p->n_series; s++) {
    const plot_series *q = &p->series[s];
    for (size_t i = 0; i < q->n; i++) {
      if (!isfinite(q->x[i]) || !isfinite(q->y[i])) continue;
      int seg = !q->marker && i + 1 < q->n && isfinite(q->x[i + 1]) && isfinite(q->y[i + 1]);
      int nsub = seg ? 8 : 1;
      for (int k = 0; k < nsub; k++) {
        double t = (double)k / nsub;
        double x = seg ? q->x[i] + t * (q->x[i + 1] - q->x[i]) : q->x[i];
        double y = seg ? q->y[i] + t * (q->y[i + 1] - q->y[i]) : q->y[i];
        if (x >= bx0 && x <= bx1 && y >= by0 && y <= by1) count++;
      }
    }
  }
  return count;
}

/* The inside corner where a legend of nleg entries covers the fewest curve points (top right
 * first on ties), as a PLplot position. */
static PLINT legend_corner(const plot_panel *p, int nleg, double x0, double x1, double y0,
                           double y1)
{
  static const PLINT pos[4] = {PL_POSITION_TOP | PL_POSITION_RIGHT, PL_POSITION_TOP | PL_POSITION_LEFT,
                               PL_POSITION_BOTTOM | PL_POSITION_RIGHT,
                               PL_POSITION_BOTTOM | PL_POSITION_LEFT};
  double w = 0.45 * (x1 - x0), h = fmin(0.9, 0.02 + 0.075 * nleg) * (y1 - y0);
  size_t best = (size_t)-1;
  PLINT where = pos[0];
  for (int k = 0; k < 4; k++) {
    int right = k == 0 || k == 2, top = k < 2;
    double bx0 = right ? x1 - w : x0, by0 = top ? y1 - h : y0;
    size_t c = crowding(p, bx0, bx0 + w, by0, by0 + h);
    if (c < best) {
      best = c;
      where = pos[k];
    }
  }
  return where;
}

/* A shaded band (plot_series marker 2) in a translucent version of palette colour pc. */
static void draw_band(const plot_series *q, int pc)
{
  size_t m = q->n / 2;
  PLFLT *px = malloc((2 * m + 1) * sizeof *px), *py = malloc((2 * m + 1) * sizeof *py);
  if (px == NULL || py == NULL) {
    free(px);
    free(py);
    return;
  }
  plscol0a(14, palette[pc][0], palette[pc][1], palette[pc][2], 0.22);
  plcol0(14);
  size_t i = 0;
  while (i < m) {
    while (i < m && !(isfinite(q->x[i]) && isfinite(q->y[i]) && isfinite(q->x[m + i]) &&
                      isfinite(q->y[m + i]))) {
      i++;
    }
    size_t j = i;
    while (j < m && isfinite(q->x[j]) && isfinite(q->y[j]) && isfinite(q->x[m + j]) &&
           isfinite(q->y[m + j])) {
      j++;
    }
    if (j >= i + 2) {
      size_t k = 0;
      for (size_t t = i; t < j; t++, k++) {
        px[k] = q->x[t];
        py[k] = q->y[t];
      }
      for (size_t t = j; t-- > i; k++) {
        px[k] = q->x[m + t];
        py[k] = q->y[m + t];
      }
      plfill((PLINT)k, px, py);
    }
    i = j;
  }
  free(px);
  free(py);
}

static void draw_panel(const plot_panel *p, int logx)
{
  double x0, x1, y0, y1;
  data_range(p, &x0, &x1, &y0, &y1);
  if (logx) {
    /* whole decades, so that the axis has at least two labelled ticks */
    x0 = floor(x0 + 0.02);
    x1 = ceil(x1 - 0.02);
    if (x1 <= x0) x1 = x0 + 1.0;
  }
  plvsta();
  plwind(x0, x1, y0, y1);
  plcol0(15);
  plwidth(0.5);
  plbox(logx ? "gl" : "g", 0.0, 0, "g", 0.0, 0);
  plcol0(1);
  plwidth(1.0);
  plbox(logx ? "bcnstl" : "bcnst", 0.0, 0, "bcnstv", 0.0, 0);
  pllab(p->xlabel, p->ylabel, p->title);
  PLINT opt[16], tcol[16], lcol[16], lsty[16], mcol[16], mnum[16];
  PLFLT lw[16], msc[16];
  const char *txt[16], *msym[16];
  int nleg = 0;
  int ci = 0; /* colours count the curves; a band takes the colour of the curve after it */
  for (size_t s = 0; s < p->n_series; s++) {
    const plot_series *q = &p->series[s];
    int c = 2 + ci % 8;
    if (q->marker == 2) {
      draw_band(q, ci % 8);
      continue;
    }
    ci++;
    plcol0(c);
    plwidth(1.6);
    if (q->marker) {
      for (size_t i = 0; i < q->n; i++) {
        if (isfinite(q->x[i]) && isfinite(q->y[i])) {
          PLFLT xx = q->x[i], yy = q->y[i];
          plstring(1, &xx, &yy, "#(840)");
        }
      }
    } else {
      size_t i = 0;
      while (i < q->n) {
        while (i < q->n && !(isfinite(q->x[i]) && isfinite(q->y[i]))) i++;
        size_t j = i;
        while (j < q->n && isfinite(q->x[j]) && isfinite(q->y[j])) j++;
        if (j > i + 1) plline((PLINT)(j - i), (PLFLT *)q->x + i, (PLFLT *)q->y + i);
        i = j;
      }
    }
    if (q->label != NULL && nleg < 16) {
      opt[nleg] = q->marker ? PL_LEGEND_SYMBOL : PL_LEGEND_LINE;
      tcol[nleg] = 1;
      lcol[nleg] = c;
      lsty[nleg] = 1;
      lw[nleg] = 1.6;
      mcol[nleg] = c;
      mnum[nleg] = 1;
      msc[nleg] = 1.0;
      msym[nleg] = "#(840)";
      txt[nleg] = q->label;
      nleg++;
    }
  }
  if (nleg > 0) {
    PLFLT w, h;
    plwidth(1.0);
    pllegend(&w, &h, PL_LEGEND_BACKGROUND | PL_LEGEND_BOUNDING_BOX,
             legend_corner(p, nleg, x0, x1, y0, y1) | PL_POSITION_INSIDE, 0.01, 0.01, 0.08, 0, 1, 1,
             0, 0, nleg, opt, 0.8, 0.7, 1.6, 1.0, tcol, txt, NULL, NULL, NULL, NULL, lcol, lsty,
             lw, mcol, msc, mnum, msym);
  }
}

static int render(const char *dev, const char *path, const char *title, int nx, int ny,
                  const plot_panel *panels, size_t n_panels, const int *logx)
{
  PLINT strm, old;
  plgstrm(&old);
  plmkstrm(&strm);
  plsdev(dev);
  plsfnam(path);
  plspage(0, 0, 420 * nx + 80, 330 * ny + 90, 0, 0);
  plscol0(0, 255, 255, 255);
  plscol0(1, 20, 20, 20);
  for (int c = 0; c < 8; c++) plscol0(2 + c, palette[c][0], palette[c][1], palette[c][2]);
  plscol0(15, 215, 215, 215);
  plinit();
  plssub(nx, ny);
  plschr(0.0, 0.85);
  for (size_t i = 0; i < n_panels; i++) {
    pladv((PLINT)i + 1);
    draw_panel(&panels[i], logx != NULL && logx[i]);
  }
  if (title != NULL) {
    pladv(1);
    plvpor(0.0, 1.0, 0.0, 1.0);
    plcol0(1);
  }
  plend1();
  plsstrm(old);
  FILE *f = fopen(path, "rb");
  if (f == NULL) {
    cli_error("%s: the plot was not written", path);
    return 1;
  }
  fclose(f);
  return 0;
}

int plot_figure(const char *base, const char *title, int nx, int ny, const plot_panel *panels,
                size_t n_panels)
{
  return plot_figure_logx(base, title, nx, ny, panels, n_panels, NULL);
}

int plot_figure_logx(const char *base, const char *title, int nx, int ny,
                     const plot_panel *panels, size_t n_panels, const int *logx)
{
  static const char *const dev[2] = {"svgcairo", "pngcairo"};
  static const char *const ext[2] = {"svg", "png"};
  for (int k = 0; k < 2; k++) {
    char tmp[4200], fin[4200];
    snprintf(fin, sizeof fin, "%s.%s", base, ext[k]);
    /* the temporary: an unpredictable name in the figure's folder, created exclusively before
     * the plotting library opens it (a fixed name could be planted as a link) */
    const char *slash = strrchr(base, '/');
    int dl = slash != NULL ? (int)(slash - base) + 1 : 0;
    snprintf(tmp, sizeof tmp, "%.*s.airscrew-fig-%s-XXXXXX", dl, base, ext[k]);
    int fd = mkstemp(tmp);
    if (fd < 0) {
      cli_error("%s: cannot create a temporary file beside it: %s", fin, strerror(errno));
      return 1;
    }
    mode_t um = umask(0); /* a figure gets the permissions a new file would get */
    umask(um);
    fchmod(fd, 0666 & ~um);
    close(fd);
    cli_temp_begin(tmp);
    if (render(dev[k], tmp, title, nx, ny, panels, n_panels, logx) != 0) {
      remove(tmp);
      cli_temp_end();
      return 1;
    }
    struct stat sb;
    if (lstat(fin, &sb) == 0 && !S_ISREG(sb.st_mode)) {
      cli_error("%s: exists and is not a regular file; not replaced", fin);
      remove(tmp);
      cli_temp_end();
      return 1;
    }
    if (rename(tmp, fin) != 0) {
      cli_error("%s: cannot rename the plot into place", fin);
      remove(tmp);
      cli_temp_end();
      return 1;
    }
    cli_temp_end();
  }
  return 0;
}
