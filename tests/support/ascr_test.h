/* tests/support/ascr_test.h
 * Shared test helpers: a mixed relative/absolute closeness assertion for cmocka, and the
 * exact Karman-Trefftz flow used as the inviscid reference.
 */
#ifndef ASCR_TEST_H
#define ASCR_TEST_H

#include <stdarg.h>
#include <stddef.h>
#include <setjmp.h>
#include <stdint.h>
#include <cmocka.h>

/* Pass if |obs - exp| <= epsabs + epsrel |exp|; otherwise fail printing desc and both values. */
void ascr_assert_close_impl(double obs, double exp, double epsrel, double epsabs,
                            const char *desc, const char *file, int line);
#define ascr_assert_close(obs, exp, epsrel, epsabs, desc) \
  ascr_assert_close_impl((obs), (exp), (epsrel), (epsabs), (desc), __FILE__, __LINE__)

#include "karman_trefftz.h"

#endif
