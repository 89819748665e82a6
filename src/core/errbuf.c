/* src/core/errbuf.c
 * Error-message formatting into the caller's ascr_errbuf, and checked allocation.
 */
#include "core/core_impl.h"

#include <stdarg.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>

ascr_status core_fail(ascr_errbuf *err, ascr_status code, const char *fmt, ...)
{
  if (err != NULL) {
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(err->msg, sizeof err->msg, fmt, ap);
    va_end(ap);
  }
  return code;
}

void *core_calloc(size_t n, size_t sz)
{
  if (n == 0 || sz == 0 || n > SIZE_MAX / sz) {
    return NULL;
  }
  return calloc(n, sz);
}
