/* src/cli/plot_read.h
 * A saved polar or rotor result read into figure data (plot_read.c); the plot command draws it.
 */
#ifndef ASCR_PLOT_READ_H
#define ASCR_PLOT_READ_H

#include <jansson.h>
#include <stddef.h>

#include "cli_figures.h"

#define PLOT_MAX_MACH 8

enum { PLOT_POLARS = 1, PLOT_ROTOR = 2 };

typedef struct plot_data {
  int kind;                      /* PLOT_POLARS or PLOT_ROTOR */
  const char *title;             /* section or blade name (in the JSON object), else the file */
  fig_polar *pol;                /* polars: n_pol curves */
  size_t n_pol;
  fig_re_series re[PLOT_MAX_MACH]; /* the Reynolds-number study: n_re series (0: none) */
  size_t n_re;
  double bubble_cl;
  double *re_buf;
  fig_rotor_point *rot;          /* rotor: n_rot points */
  size_t n_rot;
} plot_data;

/* Read root (the result of file) into d. Returns 0, or a CLI exit code with a message naming
 * the file, the place and the field; d is to be freed either way. */
int plot_data_read(const char *file, json_t *root, plot_data *d);
void plot_data_free(plot_data *d);

#endif
