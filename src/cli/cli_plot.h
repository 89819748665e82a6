/* src/cli/cli_plot.h
 * Figures for the CLI through PLplot (cairo drivers): one figure of one or more panels, each
 * panel a set of labelled line series, written as SVG and PNG. Presentation only.
 */
#ifndef ASCR_CLI_PLOT_H
#define ASCR_CLI_PLOT_H

#include <stddef.h>

typedef struct plot_series {
  const char *label;      /* legend text (NULL: not in the legend) */
  size_t n;
  const double *x, *y;    /* non-finite points break the line */
  int marker;             /* 1: draw points as markers, not a line; 2: a shaded band in the colour
                             of the series that follows it: n = 2 m, the first m points its lower
                             (or left) edge, the next m its upper edge, both in the same order;
                             a point where either edge is not finite breaks the band */
} plot_series;

typedef struct plot_panel {
  const char *title, *xlabel, *ylabel;
  const plot_series *series;
  size_t n_series;
} plot_panel;

/* Write base.svg and base.png (each through a temporary file renamed into place) of a figure
 * of nx x ny panels. Returns 0, or nonzero with a message printed. */
int plot_figure(const char *base, const char *title, int nx, int ny, const plot_panel *panels,
                size_t n_panels);

/* The same with a decade x axis (10^n ticks) on the panels whose logx entry is 1: their x values
 * are log10 of the quantity. */
int plot_figure_logx(const char *base, const char *title, int nx, int ny,
                     const plot_panel *panels, size_t n_panels, const int *logx);

#endif
