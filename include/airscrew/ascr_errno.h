/* include/airscrew/ascr_errno.h
 * Status codes returned by every libairscrew function, and the error buffer that carries
 * the human-readable detail (file, line, station, value) back to the caller.
 *
 * Convention: ASCR_OK is 0; ASCR_CONTINUE (negative) means "not converged yet" and is a normal
 * return of iterative routines; positive codes are failures. The library never prints and
 * never exits; it returns a code and, when the caller passes an ascr_errbuf, fills it with a
 * message that names the cause and its context. Thread safety: the functions here are
 * reentrant; the strings they return are static and must not be freed.
 */
#ifndef ASCR_ERRNO_H
#define ASCR_ERRNO_H

#include <stddef.h>
#include "airscrew/ascr_export.h"

#ifdef __cplusplus
extern "C" {
#endif

typedef enum ascr_status {
  ASCR_CONTINUE = -2, /* iteration has not converged yet (not an error) */
  ASCR_OK = 0,        /* success */
  ASCR_EINVAL = 1,    /* invalid argument passed by the caller (NULL, size mismatch, range) */
  ASCR_ENOMEM = 2,    /* memory allocation failed */
  ASCR_EIO = 3,       /* a file could not be opened, read or written */
  ASCR_EPARSE = 4,    /* input text is malformed (non-numeric field, bad count, bad spec) */
  ASCR_EGEOM = 5,     /* geometry is impossible or degenerate (crossing, doubling back, open) */
  ASCR_ESING = 6,     /* a linear system is singular to working precision */
  ASCR_EMAXITER = 7,  /* iteration limit reached without convergence */
  ASCR_EDOM = 8       /* a value lies outside the range the method supports (e.g. Mach >= 1) */
} ascr_status;

/** Size of the message buffer in an ascr_errbuf, bytes including the terminating NUL. */
#define ASCR_ERRBUF_SIZE 512

/** Caller-owned error buffer. Functions that fail write a NUL-terminated message into msg;
 *  on success they leave it untouched. Pass NULL where no detail is wanted. */
typedef struct ascr_errbuf {
  char msg[ASCR_ERRBUF_SIZE];
} ascr_errbuf;

/** One-line description of a status code (static string, never NULL). */
ASCR_EXPORT const char *ascr_strerror(ascr_status status);

/** Symbolic name of a status code, e.g. "ASCR_EGEOM" (static string, never NULL). */
ASCR_EXPORT const char *ascr_status_name(ascr_status status);

/** Library version string, e.g. "0.1.0" (static). */
ASCR_EXPORT const char *ascr_version(void);

#ifdef __cplusplus
}
#endif
#endif /* ASCR_ERRNO_H */
