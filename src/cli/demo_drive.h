/* src/cli/demo_drive.h
 * The powertrain section of the demo (demo_drive.c).
 */
#ifndef ASCR_CLI_DEMO_DRIVE_H
#define ASCR_CLI_DEMO_DRIVE_H

#include "cli.h"
#include "cli_tables.h"

typedef struct demo_drive_out {
  char *html;     /* the report's section (owned) */
  char *summary;  /* one line for standard output (owned) */
  double full_throttle_rpm; /* static, full throttle, nominal pack (NaN: not converged) */
} demo_drive_out;

/* Compute the section for blade b with air rp and table options to, write powertrain.json,
 * drive-map.csv and drive.svg/.png into outdir. 0 or an exit code (message printed). */
int demo_drive_section(const ascr_blade *b, const ascr_rotor_params *rp, const cli_table_opts *to,
                       const char *outdir, demo_drive_out *o);
void demo_drive_out_free(demo_drive_out *o);

#endif
