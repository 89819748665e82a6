/* src/cli/cli.h
 * Shared pieces of the airscrew command-line front end: exit codes, messages, strict option
 * value parsing, section loading, and output that is written whole or not at all.
 * The front end does no numerics; it includes only the public headers of libairscrew.
 */
#ifndef ASCR_CLI_H
#define ASCR_CLI_H

#include <stdio.h>
#include <jansson.h>
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
/* Silent variant: 0 and *out when TEXT is one whole finite number, else 1. */
int cli_parse_number(const char *text, double *out);
int cli_parse_double(const char *opt, const char *text, double lo, double hi, double *out);
int cli_parse_size(const char *opt, const char *text, size_t lo, size_t hi, size_t *out);
/* LO:HI, both within [lo, hi], HI > LO. Returns 0, or 1 with a message printed. */
int cli_parse_pair(const char *opt, const char *text, double lo, double hi, double *a, double *b);

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

/* Read a whole regular file of at most max bytes (counted while reading) into *text
 * (NUL-terminated, caller frees). FIFOs, devices and folders are refused without blocking.
 * what names the kind of file in messages. Returns 0 or an exit code (message printed). */
int cli_read_file(const char *path, size_t max, const char *what, char **text, size_t *len);

/* Can a new file be created in dir? (an exclusive temporary created and removed; errno set
 * when not). 1 or 0. */
int cli_dir_writable(const char *dir);

/* Is path usable as an output (nothing there, a regular file with force, or a character
 * device / FIFO)? Folders, symbolic links, block devices and sockets are refused. Returns 0
 * or CLI_EXIT_OUTPUT (message printed). */
int cli_output_check(const char *path, int force);

/* Write a whole file: to a character device or FIFO directly; otherwise through a temporary in
 * the same folder, renamed into place over nothing or over a regular file (with force), whose
 * permissions it keeps. Symbolic links, folders, block devices and sockets are refused, also
 * if they appear while running. Returns 0 or CLI_EXIT_OUTPUT (message printed). */
int cli_write_atomic(const char *path, const char *buf, size_t len, int force);

/* SIGINT/SIGTERM/SIGHUP: remove the temporary being written (if any) and exit 128 + signal.
 * Outputs exist only as temporaries until complete, so an interrupted run leaves nothing
 * partial. cli_temp_begin/_end name the temporary of the moment. */
void cli_signals_install(void);
void cli_temp_begin(const char *path);
void cli_temp_end(void);

/* A JSON number, or null where ok is 0 or v is not finite (results never printed as numbers
 * when they are not results). Caller owns the reference. */
json_t *cli_json_num(int ok, double v);

/* Set only by the command-line fuzz target: every command returns CLI_EXIT_OK once its options
 * are checked, before it reads a file, creates a folder or computes anything. */
extern int cli_check_options_only;

/* The program behind main(): dispatch on argv[1] (main() also installs the signal handlers and
 * sets the BLAS threads). */
int cli_main(int argc, char **argv);

/* Restart getopt_long for a new argument vector (full reset under glibc, which otherwise keeps
 * its position inside the previous vector's last option cluster). */
void cli_getopt_reset(void);

/* 1 if the stream is a terminal. */
int cli_isatty(FILE *fp);

/* Longest comma-separated list an option takes. */
#define CLI_MAX_LIST 32

/* Printed with every aerodynamic result. */
#define CLI_ESTIMATE_NOTE \
  "estimates from an integral boundary-layer method; check against tests before relying on them"

/* Comma-separated numbers within [lo, hi]; at most CLI_MAX_LIST. */
int cli_parse_list(const char *opt, const char *text, double lo, double hi, double *out,
                   size_t *n);
/* START:END:STEP with START <= END, STEP > 0, all within [lo, hi]. */
int cli_parse_range(const char *opt, const char *text, double lo, double hi, double *a0,
                    double *a1, double *step);

/* VALUES as a comma list (at most CLI_MAX_LIST) or START:END:STEP (at most max values), all
 * within [lo, hi]. Returns 0, or 1 with a message printed. */
int cli_parse_values(const char *opt, const char *text, double lo, double hi, size_t max,
                     double *out, size_t *n);

/* Viscous options shared by flow and polar. */
typedef struct cli_visc_opts {
  const char *preset; /* --transition NAME given (its N_crit is in ncrit) */
  double ncrit;       /* NaN: default or from turbulence */
  double turbulence;  /* percent; NaN: not given */
  double trip_upper;  /* x/c; NaN: none */
  double trip_lower;
} cli_visc_opts;
void cli_visc_opts_init(cli_visc_opts *o);
/* Option codes: 'N' --ncrit, 'T' --turbulence, 'W' --transition, 'U' --trip-upper,
 * 'L' --trip-lower. */
int cli_visc_opts_parse(cli_visc_opts *o, int code, const char *arg);
ascr_visc_params cli_visc_params(const cli_visc_opts *o, double re, double mach);

/* A section ready for analysis: loaded, repanelled, inviscid solver set, viscous solver
 * allocated. */
typedef struct cli_analysis {
  ascr_geom_section *raw, *section;
  ascr_panel_solver *panel;
  ascr_visc_solver *visc;
  size_t n_panels;
} cli_analysis;
int cli_analysis_open(cli_analysis *a, const char *arg, size_t panels);
/* The section respaced on another panel count, the solvers sized anew (message printed on
 * failure, the analysis then closed). */
int cli_analysis_repanel(cli_analysis *a, size_t panels);
void cli_analysis_close(cli_analysis *a);

#endif
