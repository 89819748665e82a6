/* src/cli/demo_structure.h
 * The structure section of the demo (demo_structure.c).
 */
#ifndef ASCR_CLI_DEMO_STRUCTURE_H
#define ASCR_CLI_DEMO_STRUCTURE_H

#include "cli.h"

typedef struct demo_structure_out {
  char *html;     /* the report's section (owned) */
  char *summary;  /* one line for standard output (owned; NULL: none) */
} demo_structure_out;

/* The demo blade b in a tough SLA resin (material.json written): stresses at hover (hover_rpm
 * with its elements hel, n_el of them) and at full throttle (full_rpm, static, by the BEMT),
 * modes over 0 .. 30,000 rpm with the Campbell diagram (structure.svg/.png) and the printable
 * propeller (prop.stl). 0 or an exit code (message printed); a part that fails is reported in
 * the fragment. */
int demo_structure_section(const ascr_blade *b, const ascr_polar_table *const *tables,
                           const ascr_rotor_params *rp, double hover_rpm,
                           const ascr_rotor_element *hel, double full_rpm, const char *outdir,
                           demo_structure_out *o);
void demo_structure_out_free(demo_structure_out *o);

#endif
