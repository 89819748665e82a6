/* src/core/brent.c
 * Brent's method on a bracketed root with GSL's solver, shared by the searches of the rotor and
 * powertrain stages (the rpm for a thrust, the torque balance, the climb rate).
 */
#include "core/core_impl.h"

#include <gsl/gsl_errno.h>
#include <gsl/gsl_roots.h>
#include <math.h>

ascr_status core_brent(double (*f)(double, void *), void *ctx, const int *stop, double lo,
                       double hi, double epsabs, double epsrel, int maxit, double *root)
{
  *root = NAN;
  gsl_function fn = {f, ctx};
  gsl_root_fsolver *s = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
  if (s == NULL) {
    return ASCR_ENOMEM;
  }
  if (gsl_root_fsolver_set(s, &fn, lo, hi) == GSL_SUCCESS) {
    for (int it = 0; it < maxit && !*stop; it++) {
      if (gsl_root_fsolver_iterate(s) != GSL_SUCCESS) {
        break;
      }
      if (gsl_root_test_interval(gsl_root_fsolver_x_lower(s), gsl_root_fsolver_x_upper(s), epsabs,
                                 epsrel) == GSL_SUCCESS) {
        *root = gsl_root_fsolver_root(s);
        break;
      }
    }
  }
  gsl_root_fsolver_free(s);
  return isnan(*root) || *stop ? ASCR_EMAXITER : ASCR_OK;
}
