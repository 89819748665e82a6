/* src/cli/fig_polar_panels.c
 * The four panels of a polar figure (lift against angle, the drag polar, pitching moment, lift
 * to drag), built from plain arrays: the one place where the CLI's polar figures (`polar
 * --plot`, `plot`, the demo's section figures) are laid out. No drawing here (cli_plot.c draws).
 */
#include "cli_figures.h"

#include <math.h>
#include <stdio.h>

static int any_finite(const fig_polar *p)
{
  for (size_t i = 0; i < p->n; i++) {
    if (isfinite(p->cl[i]) && isfinite(p->cd[i])) return 1;
  }
  return 0;
}

static int has_band(const fig_polar *q)
{
  return q->cl_lo != NULL && q->cl_hi != NULL && q->cd_lo != NULL && q->cd_hi != NULL &&
         q->cm_lo != NULL && q->cm_hi != NULL && q->ld_lo != NULL && q->ld_hi != NULL;
}

/* a band outline of n points into b (4 n): x edges then y edges */
static plot_series band(double *b, size_t n, const double *xl, const double *xh,
                        const double *yl, const double *yh)
{
  for (size_t i = 0; i < n; i++) {
    b[i] = xl[i];
    b[n + i] = xh[i];
    b[2 * n + i] = yl[i];
    b[3 * n + i] = yh[i];
  }
  return (plot_series){NULL, 2 * n, b, b + 2 * n, 2};
}

void fig_polar_panels(const char *title, const fig_polar *p, size_t np, fig_polar_work *w,
                      plot_panel pan[4])
{
  size_t ns[4] = {0, 0, 0, 0};
  plot_series *sr[4] = {w->sr, w->sr + 2 * np, w->sr + 4 * np, w->sr + 6 * np};
  for (size_t k = 0; k < np; k++) {
    const fig_polar *q = &p[k];
    size_t n = q->n;
    for (size_t i = 0; i < n; i++) w->ld[k][i] = q->cl[i] / q->cd[i];
    /* a curve without a converged point draws nothing: its legend says so */
    if (any_finite(q)) snprintf(w->label[k], sizeof w->label[k], "%s", q->label);
    else snprintf(w->label[k], sizeof w->label[k], "%s: no converged points", q->label);
    if (has_band(q)) {
      /* the band under its curve: lift, drag (across, at the curve's cl), moment, L/D */
      double *b = w->ld[k] + n;
      sr[0][ns[0]++] = band(b, n, q->alpha, q->alpha, q->cl_lo, q->cl_hi);
      sr[1][ns[1]++] = band(b + 4 * n, n, q->cd_lo, q->cd_hi, q->cl, q->cl);
      sr[2][ns[2]++] = band(b + 8 * n, n, q->alpha, q->alpha, q->cm_lo, q->cm_hi);
      sr[3][ns[3]++] = band(b + 12 * n, n, q->alpha, q->alpha, q->ld_lo, q->ld_hi);
    }
    sr[0][ns[0]++] = (plot_series){w->label[k], n, q->alpha, q->cl, 0};
    /* the drag polar as the trade draws it: drag across, lift up */
    sr[1][ns[1]++] = (plot_series){NULL, n, q->cd, q->cl, 0};
    sr[2][ns[2]++] = (plot_series){NULL, n, q->alpha, q->cm, 0};
    sr[3][ns[3]++] = (plot_series){NULL, n, q->alpha, w->ld[k], 0};
  }
  pan[0] = (plot_panel){title, "angle of attack #ga (deg)", "lift coefficient c#dl#u", sr[0], ns[0]};
  pan[1] = (plot_panel){"drag polar", "drag coefficient c#dd#u", "lift coefficient c#dl#u",
                        sr[1], ns[1]};
  pan[2] = (plot_panel){"pitching moment", "angle of attack #ga (deg)", "c#dm#u (quarter chord)",
                        sr[2], ns[2]};
  pan[3] = (plot_panel){"lift-to-drag ratio", "angle of attack #ga (deg)", "c#dl#u / c#dd#u",
                        sr[3], ns[3]};
}
