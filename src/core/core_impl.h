/* src/core/core_impl.h
 * Private helpers shared by every stage: error-message formatting and checked allocation.
 * Not installed; functions carry the core_ prefix and hidden visibility.
 */
#ifndef ASCR_CORE_IMPL_H
#define ASCR_CORE_IMPL_H

#include <stddef.h>
#include "airscrew/ascr_errno.h"

#if defined(__GNUC__)
#define ASCR_PRINTF(a, b) __attribute__((format(printf, a, b)))
#else
#define ASCR_PRINTF(a, b)
#endif

/* Write a formatted message into err (if not NULL) and return code. */
ascr_status core_fail(ascr_errbuf *err, ascr_status code, const char *fmt, ...) ASCR_PRINTF(3, 4);

/* calloc of n elements of size sz with overflow check; NULL on failure or n == 0. */
void *core_calloc(size_t n, size_t sz);

/* Solve a x = b for a small dense system, n <= 3 (a row-major n x n, destroyed; b receives x).
 * Returns 1, or 0 if a is singular to working precision. solve_small.c. */
int core_solve_small(double *a, double *b, int n);
/* The same for nrhs right-hand sides at once (b row-major n x nrhs; each column takes the
 * operations core_solve_small takes alone, in the same order). solve_small.c. */
int core_solve_small_multi(double *a, double *b, int n, int nrhs);

/* Brent's method (GSL's solver) for a root of f in [lo, hi], where f changes sign: until the
 * bracket is within epsabs + epsrel |x|, for at most maxit steps, or until *stop is set (by f,
 * after an evaluation that failed; f must still return a finite value, or GSL calls its error
 * handler). ASCR_OK with *root; ASCR_EMAXITER (no convergence, or stopped: *root NaN or the
 * last estimate); ASCR_ENOMEM. brent.c. */
ascr_status core_brent(double (*f)(double, void *), void *ctx, const int *stop, double lo,
                       double hi, double epsabs, double epsrel, int maxit, double *root);

/* pi to double precision (M_PI is not part of ISO C). */
#define ASCR_PI 3.14159265358979323846

#endif
