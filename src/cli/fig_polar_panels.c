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

void fig_polar_panels(const char *title, const fig_polar *p, size_t np, fig_polar_work *w,
                      plot_panel pan[4])
{
  for (size_t k = 0; k < np; k++) {
    const fig_polar *q = &p[k];
    for (size_t i = 0; i < q->n; i++) w->ld[k][i] = q->cl[i] / q->cd[i];
    /* a curve without a converged point draws nothing: its legend says so */
    if (any_finite(q)) snprintf(w->label[k], sizeof w->label[k], "%s", q->label);
    else snprintf(w->label[k], sizeof w->label[k], "%s: no converged points", q->label);
    w->sr[k] = (plot_series){w->label[k], q->n, q->alpha, q->cl, 0};
    /* the drag polar as the trade draws it: drag across, lift up */
    w->sr[np + k] = (plot_series){NULL, q->n, q->cd, q->cl, 0};
    w->sr[2 * np + k] = (plot_series){NULL, q->n, q->alpha, q->cm, 0};
    w->sr[3 * np + k] = (plot_series){NULL, q->n, q->alpha, w->ld[k], 0};
  }
  pan[0] = (plot_panel){title, "angle of attack #ga (deg)", "lift coefficient c#dl#u", w->sr, np};
  pan[1] = (plot_panel){"drag polar", "drag coefficient c#dd#u", "lift coefficient c#dl#u",
                        w->sr + np, np};
  pan[2] = (plot_panel){"pitching moment", "angle of attack #ga (deg)", "c#dm#u (quarter chord)",
                        w->sr + 2 * np, np};
  pan[3] = (plot_panel){"lift-to-drag ratio", "angle of attack #ga (deg)", "c#dl#u / c#dd#u",
                        w->sr + 3 * np, np};
}
