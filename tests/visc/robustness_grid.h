/* tests/visc/robustness_grid.h
 * The robustness grids of test_visc_robustness and their summary (sections, Reynolds numbers,
 * angle range, the converged share required per band of Reynolds numbers): one place for both
 * programs. "main": issue 3's grid (issue 11: 98 % at Re >= 30k). "lowre": issue 11's
 * low-Reynolds-number extension, thin cambered plates 2-4 % thick with 3-6 % camber in the
 * generator's form and the sample coordinate file at Re 5k, 10k and 20k, -6 to 14 deg (issue
 * 11: 95 % at 10k-20k, 85 % at 5k; the same grid as bench/study_visc_convergence with
 * STUDY_LOWRE, about 210 s on one core since the nineteenth session's speed-ups).
 */
#ifndef ROBUSTNESS_GRID_H
#define ROBUSTNESS_GRID_H

#include <stddef.h>
#include <string.h>

#define ROBUST_STEP 0.5 /* deg */

/* a band of Reynolds numbers [re_lo, re_hi] and the share of its points that must converge */
typedef struct robust_band {
  double re_lo, re_hi, share;
} robust_band;

typedef struct robust_grid {
  const char *name;
  const char *sections[5];
  size_t n_sections;
  double re[5];
  size_t n_re;
  double alpha0, alpha1;
  robust_band bands[2];
  size_t n_bands;
  size_t n_points; /* the grid's points: sections x Re x angles */
} robust_grid;

static const robust_grid robust_grids[] = {
  {"main",
   {"airfoils/microprop-plate-t25-f45.dat", "airfoils/naca4412.dat", "naca0012", "naca2412",
    "naca4412"},
   5, {3e4, 6e4, 1e5, 2e5, 1e6}, 5, -6.0, 16.0,
   {{3e4, 1e6, 0.98}}, 1, 1125},
  {"lowre",
   {"airfoils/microprop-plate-t25-f45.dat", "plate:t=2,f=3", "plate:t=3,f=4.5,xf=45",
    "plate:t=4,f=6,xf=40", "plate:t=2,f=6,xf=40"},
   5, {5e3, 1e4, 2e4}, 3, -6.0, 14.0,
   {{1e4, 2e4, 0.95}, {5e3, 5e3, 0.85}}, 2, 615},
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
