/* tests/support/ascr_test.c
 * Test helpers (the exact Karman-Trefftz solution is in karman_trefftz.c).
 */
#include "ascr_test.h"

#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>

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


void ascr_validation_row(const char *name, const char *source, const char *header,
                         const char *fmt, ...)
{
  const char *dir = getenv("AIRSCREW_VALIDATION_OUT");
  if (dir == NULL || dir[0] == '\0') return;
  char path[1024];
  snprintf(path, sizeof path, "%s/%s.csv", dir, name);
  FILE *f = fopen(path, "r");
  int fresh = f == NULL;
  if (f != NULL) fclose(f);
  f = fopen(path, "a");
  if (f == NULL) return;
  if (fresh) fprintf(f, "# source: %s\n%s\n", source, header);
  va_list ap;
  va_start(ap, fmt);
  vfprintf(f, fmt, ap);
  va_end(ap);
  fputc('\n', f);
  fclose(f);
}
