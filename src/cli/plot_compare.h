/* src/cli/plot_compare.h
 * Several saved results compared (plot_compare.c): one figure set with every candidate and a
 * table of their key numbers side by side.
 */
#ifndef ASCR_PLOT_COMPARE_H
#define ASCR_PLOT_COMPARE_H

#include <stddef.h>

#include "plot_read.h"

/* Most candidates compared at once. */
#define PLOT_MAX_CANDIDATES 8

/* Draw DIR/compare-polar or DIR/compare-rotor from the n results pd (all polars or all rotor
 * maps; files[k] names pd[k]) and print the table on standard output; hover_thrust_N (NaN:
 * none) is the thrust at which rotor candidates' hover rpm and power are compared. Returns 0 or
 * a CLI exit code (message printed). */
int plot_compare(const char *dir, int force, double hover_thrust_N, const char *const *files,
                 const plot_data *pd, size_t n);

#endif
