/* src/cli/cli_tables.h
 * Section tables for the rotor commands: the options as the command line gives them, passed
 * to the library's pipeline (ascr_blade_tables_prepare), its notes and errors printed.
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

/* The library's tables of a blade (include/airscrew/ascr_blade_tables.h). */
typedef ascr_section_table_info cli_section_info;
typedef ascr_blade_tables cli_tables;

/* Prepare one table per blade section for rpm in rpm_lo..rpm_hi and speed in v_lo..v_hi
 * (ascr_blade_tables_prepare; its notes printed as warnings, a progress line on a terminal).
 * Returns 0 or an exit code (message printed). */
int cli_tables_prepare(const ascr_blade *b, const ascr_rotor_params *p, double rpm_lo,
                       double rpm_hi, double v_lo, double v_hi, const cli_table_opts *o,
                       cli_tables *out);
void cli_tables_free(cli_tables *t);

#endif
