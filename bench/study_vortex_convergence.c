/* bench/study_vortex_convergence.c
 * Convergence study of the vortex (helical-wake lifting-line) model: thrust and power
 * coefficients of a test rotor (two blades, rectangular, linear twist, cl = 2 pi alpha,
 * cd = 0) against the number of elements, the wake length, the near-wake azimuth step and the
 * core size, beside the BEMT values. The defaults in ascr_vortex_params_defaults() come from
 * this study (docs/theory/rotor.md). Run: ./build/bench/study_vortex_convergence
 */
#define _POSIX_C_SOURCE 200809L
#include "airscrew/ascr_rotor.h"
#include "bench_util.h"

#include <stdio.h>
#include <string.h>

#define PI 3.14159265358979323846

void openblas_set_num_threads(int num_threads);

static ascr_blade_station st[2];

static ascr_blade rotor(double pitch75)
{
  ascr_blade b;
  memset(&b, 0, sizeof b);
  b.n_blades = 2;
  b.r_tip_m = 0.1;
  b.r_hub_m = 0.015;
  b.rotation = 1;
  b.n_stations = 2;
  b.stations = st;
  b.n_sections = 1;
  st[0] = (ascr_blade_station){0.02, 0.012, pitch75 + 0.55 * 12.0, 0};
  st[1] = (ascr_blade_station){0.10, 0.012, pitch75 - 0.25 * 12.0, 0};
  return b;
}

typedef struct cond {
  double pitch, rpm, v;
} cond;

static void run(const ascr_blade *b, const ascr_polar_table *const *t, const cond *c,
                size_t nel, ascr_vortex_params vp, const char *label)
{
  ascr_rotor_params p = ascr_rotor_params_defaults();
  p.hub_loss = 0;
  p.n_elements = nel;
  ascr_rotor_result r;
  double t0 = bench_now();
  ascr_status s = ascr_rotor_vortex(b, t, &p, &vp, c->rpm, c->v, &r, NULL, NULL);
  double dt = bench_now() - t0;
  if (s != ASCR_OK || !r.converged) {
    printf("  %-28s not converged\n", label);
    return;
  }
  printf("  %-28s CT %.6f  CP %.6f  (%.1f ms)\n", label, r.CT, r.CP, 1e3 * dt);
}

int main(void)
{
  openblas_set_num_threads(1);
  ascr_polar_table *tab;
  ascr_polar_table_linear(2.0 * PI, 0.0, 0.0, &tab, NULL);
  const ascr_polar_table *tabs[1] = {tab};
  const cond conds[3] = {{6.0, 6000.0, 0.0}, {8.0, 6000.0, 5.0}, {16.0, 6000.0, 10.0}};
  for (int k = 0; k < 3; k++) {
    const cond *c = &conds[k];
    ascr_blade b = rotor(c->pitch);
    ascr_rotor_params p = ascr_rotor_params_defaults();
    p.hub_loss = 0;
    ascr_rotor_result rb;
    p.n_elements = 200;
    ascr_rotor_bemt(&b, tabs, &p, c->rpm, c->v, &rb, NULL, NULL);
    printf("pitch %.0f deg at 0.75R, %.0f rpm, V %.0f m/s: BEMT (200 elements) CT %.6f CP %.6f\n",
           c->pitch, c->rpm, c->v, rb.CT, rb.CP);
    ascr_vortex_params d = ascr_vortex_params_defaults();
    char lab[64];
    const size_t nels[5] = {20, 30, 40, 60, 80};
    for (int i = 0; i < 5; i++) {
      snprintf(lab, sizeof lab, "elements %zu", nels[i]);
      run(&b, tabs, c, nels[i], d, lab);
    }
    const double lens[5] = {3, 6, 12, 24, 48};
    for (int i = 0; i < 5; i++) {
      ascr_vortex_params v = d;
      v.wake_length_radii = lens[i];
      snprintf(lab, sizeof lab, "wake %.0f radii", lens[i]);
      run(&b, tabs, c, 40, v, lab);
    }
    const double steps[4] = {20, 10, 5, 2.5};
    for (int i = 0; i < 4; i++) {
      ascr_vortex_params v = d;
      v.near_step_deg = steps[i];
      snprintf(lab, sizeof lab, "near step %.1f deg", steps[i]);
      run(&b, tabs, c, 40, v, lab);
    }
    const double cores[4] = {0.05, 0.1, 0.25, 0.5};
    for (int i = 0; i < 4; i++) {
      ascr_vortex_params v = d;
      v.core_widths = cores[i];
      snprintf(lab, sizeof lab, "core %.2f widths", cores[i]);
      run(&b, tabs, c, 40, v, lab);
    }
  }
  ascr_polar_table_free(tab);
  return 0;
}
