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

/* Validation report: when the environment variable AIRSCREW_VALIDATION_OUT names a folder, append
 * one row (printf-style) to FOLDER/<name>.csv; the file starts with "# source: <source>" and the
 * header line. tools/validation-report.sh collects these files into a report. */
void ascr_validation_row(const char *name, const char *source, const char *header,
                         const char *fmt, ...)
#if defined(__GNUC__)
    __attribute__((format(printf, 4, 5)))
#endif
    ;

#include "karman_trefftz.h"

#endif
