/* src/polar/interp.c
 * Reading a swept polar between its converged points (validation checks and studies).
 */
#include "airscrew/ascr_polar.h"

#include <math.h>

double ascr_polar_cl_at_alpha(const ascr_polar_point *pts, size_t n, double alpha_deg)
{
  if (pts == NULL) return NAN;
  for (size_t i = 0; i + 1 < n; i++) {
    const ascr_polar_point *a = &pts[i], *b = &pts[i + 1];
    if (!a->converged || !b->converged || !(b->alpha_deg > a->alpha_deg)) continue;
    if (a->alpha_deg <= alpha_deg && alpha_deg <= b->alpha_deg) {
      double f = (alpha_deg - a->alpha_deg) / (b->alpha_deg - a->alpha_deg);
      return a->cl + f * (b->cl - a->cl);
    }
  }
  return NAN;
}
