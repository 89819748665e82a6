/* src/polar/polar_impl.h
 * Private entry points of the polar stage for the rotor stage.
 */
#ifndef ASCR_POLAR_IMPL_H
#define ASCR_POLAR_IMPL_H

#include "airscrew/ascr_table.h"

/* ascr_polar_table_eval, with the pitching moment only when want_cm (NaN otherwise): the
 * rotor's inner loops need lift and drag only. */
void polar_table_lookup(const ascr_polar_table *t, double alpha_rad, double re, double mach,
                        int want_cm, ascr_table_sample *out);

#endif
