/* src/core/status.c
 * Names and descriptions of ascr_status codes, and the library version.
 */
#include "airscrew/ascr_errno.h"

const char *ascr_strerror(ascr_status status)
{
  switch (status) {
  case ASCR_CONTINUE: return "iteration has not converged yet";
  case ASCR_OK: return "success";
  case ASCR_EINVAL: return "invalid argument";
  case ASCR_ENOMEM: return "out of memory";
  case ASCR_EIO: return "file could not be read or written";
  case ASCR_EPARSE: return "malformed input";
  case ASCR_EGEOM: return "impossible or degenerate geometry";
  case ASCR_ESING: return "singular linear system";
  case ASCR_EMAXITER: return "iteration limit reached without convergence";
  case ASCR_EDOM: return "value outside the supported range";
  }
  return "unknown status";
}

const char *ascr_status_name(ascr_status status)
{
  switch (status) {
  case ASCR_CONTINUE: return "ASCR_CONTINUE";
  case ASCR_OK: return "ASCR_OK";
  case ASCR_EINVAL: return "ASCR_EINVAL";
  case ASCR_ENOMEM: return "ASCR_ENOMEM";
  case ASCR_EIO: return "ASCR_EIO";
  case ASCR_EPARSE: return "ASCR_EPARSE";
  case ASCR_EGEOM: return "ASCR_EGEOM";
  case ASCR_ESING: return "ASCR_ESING";
  case ASCR_EMAXITER: return "ASCR_EMAXITER";
  case ASCR_EDOM: return "ASCR_EDOM";
  }
  return "ASCR_UNKNOWN";
}

#ifndef ASCR_VERSION_STRING
#define ASCR_VERSION_STRING "0.1.0"
#endif

const char *ascr_version(void) { return ASCR_VERSION_STRING; }
