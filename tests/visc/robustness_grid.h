/* tests/visc/robustness_grid.h
 * The robustness grid of test_visc_robustness and its summary (sections, Reynolds numbers,
 * angle range): one place for both programs. issue 11's low-Reynolds-number extension (thin
 * plates at Re 5k-20k) costs more than the suite's time allows (about 630 s on one core): its
 * figures come from bench/study_visc_convergence (STUDY_LOWRE), in docs/theory/viscous.md.
 */
#ifndef ROBUSTNESS_GRID_H
#define ROBUSTNESS_GRID_H

#include <stddef.h>
#include <string.h>

#define ROBUST_STEP 0.5 /* deg */

typedef struct robust_grid {
  const char *name;
  const char *sections[5];
  size_t n_sections;
  double re[5];
  size_t n_re;
  double alpha0, alpha1;
} robust_grid;

static const robust_grid robust_grids[] = {
  {"main",
   {"airfoils/microprop-plate-t25-f45.dat", "airfoils/naca4412.dat", "naca0012", "naca2412",
    "naca4412"},
   5, {3e4, 6e4, 1e5, 2e5, 1e6}, 5, -6.0, 16.0},
};

static inline const robust_grid *robust_grid_find(const char *name)
{
  for (size_t i = 0; i < sizeof robust_grids / sizeof robust_grids[0]; i++) {
    if (strcmp(robust_grids[i].name, name) == 0) return &robust_grids[i];
  }
  return NULL;
}

static inline size_t robust_grid_points(const robust_grid *g)
{
  return (size_t)((g->alpha1 - g->alpha0) / ROBUST_STEP + 0.5) + 1;
}

#endif
