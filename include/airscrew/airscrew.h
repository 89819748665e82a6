/* include/airscrew/airscrew.h
 * Umbrella header of libairscrew: section geometry and inviscid panel analysis.
 * Link with pkg-config --libs airscrew, or CMake target airscrew::airscrew.
 * Embedding note: libairscrew calls GSL; GSL's default error handler aborts the process on
 * errors the library has not already caught. The library validates its inputs before calling
 * GSL, but an embedding program should still call gsl_set_error_handler_off() at start.
 */
#ifndef AIRSCREW_H
#define AIRSCREW_H

#include "airscrew/ascr_errno.h"
#include "airscrew/ascr_geom.h"
#include "airscrew/ascr_panel.h"
#include "airscrew/ascr_bl.h"
#include "airscrew/ascr_stability.h"
#include "airscrew/ascr_visc.h"
#include "airscrew/ascr_polar.h"
#include "airscrew/ascr_table.h"
#include "airscrew/ascr_rotor.h"
#include "airscrew/ascr_blade_tables.h"
#include "airscrew/ascr_powertrain.h"
#include "airscrew/ascr_design.h"
#include "airscrew/ascr_structure.h"
#include "airscrew/ascr_shape.h"

#endif /* AIRSCREW_H */
