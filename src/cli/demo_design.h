/* src/cli/demo_design.h
 * The design section of the demo (demo_design.c).
 */
#ifndef ASCR_CLI_DEMO_DESIGN_H
#define ASCR_CLI_DEMO_DESIGN_H

#include "cli.h"

typedef struct demo_design_out {
  char *html;     /* the report's section (owned) */
  char *summary;  /* one line for standard output (owned; NULL: none) */
} demo_design_out;

/* Design the MIL blade for the demo craft's hover with blade b's sections and tables, write
 * design-blade.json and design.svg/.png into outdir. 0 or an exit code (message printed); a
 * design that fails is reported in the fragment, not as an error. */
int demo_design_section(const ascr_blade *b, const ascr_polar_table *const *tables,
                        const ascr_rotor_params *rp, double thrust, const char *outdir,
                        demo_design_out *o);
void demo_design_out_free(demo_design_out *o);

#endif
