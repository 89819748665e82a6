/* bench/bench_util.h
 * Small helpers shared by the benchmark programs: a monotonic clock and a median.
 */
#ifndef ASCR_BENCH_UTIL_H
#define ASCR_BENCH_UTIL_H

#include <stdlib.h>
#include <time.h>

static inline double bench_now(void)
{
  struct timespec t;
  clock_gettime(CLOCK_MONOTONIC, &t);
  return (double)t.tv_sec + 1e-9 * (double)t.tv_nsec;
}

static inline int bench_cmp(const void *a, const void *b)
{
  double x = *(const double *)a, y = *(const double *)b;
  return (x > y) - (x < y);
}

/* Median of v[0..n-1] (v is sorted in place). */
static inline double bench_median(double *v, size_t n)
{
  qsort(v, n, sizeof *v, bench_cmp);
  return n % 2 ? v[n / 2] : 0.5 * (v[n / 2 - 1] + v[n / 2]);
}

#endif
