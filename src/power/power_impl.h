/* src/power/power_impl.h
 * Private pieces of the powertrain stage (not installed).
 */
#ifndef ASCR_POWER_IMPL_H
#define ASCR_POWER_IMPL_H

#include "airscrew/ascr_powertrain.h"

/* No-load current of motor m at shaft speed rpm (circuit.c). */
double power_no_load_current(const ascr_motor *m, double rpm);

#endif
