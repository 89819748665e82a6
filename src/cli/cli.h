/* src/cli/cli.h
 * Shared pieces of the airscrew command-line front end: exit codes, messages, strict option
 * value parsing, section loading, and output that is written whole or not at all.
 * The front end does no numerics; it includes only the public headers of libairscrew.
 */
#ifndef ASCR_CLI_H
#define ASCR_CLI_H

#include <stdio.h>
#include <airscrew/airscrew.h>

/* Exit codes (docs/cli-exit-codes.md). */
enum {
  CLI_EXIT_OK = 0,
  CLI_EXIT_INTERNAL = 1, /* out of memory or an unexpected library failure */
  CLI_EXIT_USAGE = 2,    /* unknown option, missing or invalid option value */
  CLI_EXIT_INPUT = 3,    /* unreadable or malformed section file, impossible geometry, bad spec */
  CLI_EXIT_ANALYSIS = 4, /* no valid solution: singular system, condition outside the method */
  CLI_EXIT_OUTPUT = 5    /* output file cannot be written, or exists and --force was not given */
};

/* "airscrew: error: <message>" on stderr. */
void cli_error(const char *fmt, ...)
#if defined(__GNUC__)
  __attribute__((format(printf, 1, 2)))
#endif
  ;
/* "airscrew: warning: <message>" on stderr. */
void cli_warn(const char *fmt, ...)
#if defined(__GNUC__)
  __attribute__((format(printf, 1, 2)))
#endif
  ;

/* Map a library status to an exit code. */
int cli_exit_for(ascr_status st);

/* Strict number parsing for option values; on failure print a usage error naming the option
 * and return nonzero. */
int cli_parse_double(const char *opt, const char *text, double lo, double hi, double *out);
int cli_parse_size(const char *opt, const char *text, size_t lo, size_t hi, size_t *out);

/* Load a section named on the command line: an existing file path, else a generator spec.
 * On failure prints the error and returns the exit code; 0 on success. info may be NULL;
 * *from_file tells which way it was read. */
int cli_load_section(const char *arg, ascr_geom_section **out, ascr_geom_load_info *info,
                     int *from_file);

/* Output collected in memory and delivered whole: to stdout, or to a file through a temporary
 * file in the same folder that is renamed over the target only when complete. */
typedef struct cli_output {
  char *buf;
  size_t len;
  FILE *fp;          /* memory stream to write to */
  const char *path;  /* NULL for stdout */
  int force;         /* overwrite an existing file */
} cli_output;

/* Check the target (refuse an existing file without force) and open the memory stream.
 * Returns 0 or an exit code (message printed). */
int cli_output_open(cli_output *o, const char *path, int force);
/* Deliver the collected output. Returns 0 or CLI_EXIT_OUTPUT (message printed). */
int cli_output_commit(cli_output *o);
/* Drop collected output without writing anything. */
void cli_output_discard(cli_output *o);

/* 1 if the stream is a terminal. */
int cli_isatty(FILE *fp);

#endif
