/* tests/support/ascr_test.c
 * Test helpers (the exact Karman-Trefftz solution is in karman_trefftz.c).
 */
#include "ascr_test.h"

#include <math.h>
#include <stdio.h>

void ascr_assert_close_impl(double obs, double exp, double epsrel, double epsabs,
                            const char *desc, const char *file, int line)
{
  double tol = epsabs + epsrel * fabs(exp);
  if (!(fabs(obs - exp) <= tol)) {
    char msg[512];
    snprintf(msg, sizeof msg, "%s: observed %.10g, expected %.10g (|diff| %.3g > tol %.3g)",
             desc, obs, exp, fabs(obs - exp), tol);
    print_error("%s\n", msg);
    _fail(file, line);
  }
}

