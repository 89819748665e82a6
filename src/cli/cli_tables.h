/* src/cli/cli_tables.h
 * Section tables for the rotor commands: for every section of a blade, the curves over the
 * Re ladder its operating range needs, read from the cache or computed (in parallel) and
 * stored, or read from a polar-table file the user names.
 */
#ifndef ASCR_CLI_TABLES_H
#define ASCR_CLI_TABLES_H

#include "cli.h"

typedef struct cli_table_opts {
  const char *cache_dir;  /* NULL: no cache */
  cli_visc_opts vo;
  double alpha_lo, alpha_hi, alpha_step;
  size_t panels;
  size_t n_files;         /* user polar-table files: section name -> path */
  const char *file_section[CLI_MAX_LIST];
  const char *file_path[CLI_MAX_LIST];
} cli_table_opts;

void cli_table_opts_init(cli_table_opts *o);

/* Default cache folder: $AIRSCREW_CACHE_DIR, else $XDG_CACHE_HOME/airscrew, else
 * $HOME/.cache/airscrew (NULL if none can be named). Static storage. */
const char *cli_default_cache_dir(void);

typedef struct cli_section_info {
  char fingerprint[17];
  double re_lo, re_hi;    /* range the operating points need */
  size_t n_curves;
  double re[CLI_MAX_LIST];
  size_t converged[CLI_MAX_LIST], points[CLI_MAX_LIST];
  size_t from_cache, computed;
  const char *user_file;  /* NULL unless the user gave the table */
  ascr_curve_data *curve; /* the curves of the table (owned) */
  size_t n_curve;
} cli_section_info;

typedef struct cli_tables {
  size_t n;
  ascr_polar_table **tables;
  cli_section_info *info;
} cli_tables;

/* Prepare one table per blade section for rpm in rpm_lo..rpm_hi and speed in v_lo..v_hi.
 * Returns 0 or an exit code (message printed). */
int cli_tables_prepare(const ascr_blade *b, const ascr_rotor_params *p, double rpm_lo,
                       double rpm_hi, double v_lo, double v_hi, const cli_table_opts *o,
                       cli_tables *out);
void cli_tables_free(cli_tables *t);

#endif
