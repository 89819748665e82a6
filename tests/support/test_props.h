/* tests/support/test_props.h
 * A propeller for tests that must see a model alone: 5 x 4 inch, two blades, chord 12 to 8 mm,
 * geometric pitch 4 inch, on an analytic section (cl = 2 pi (alpha + 2 deg), cd 0.02, no stall,
 * independent of Re and Mach). Header only (static), so that any test program can build it.
 */
#ifndef ASCR_TEST_PROPS_H
#define ASCR_TEST_PROPS_H

#include <math.h>
#include <string.h>
#include "airscrew/ascr_rotor.h"
#include "airscrew/ascr_table.h"

#define TEST_PROP_STATIONS 11

/* Fill b (its stations in st) and make its table (*tab, freed by the caller). 0 or -1. */
static inline int test_prop_five_inch(ascr_blade *b, ascr_blade_station st[TEST_PROP_STATIONS],
                                      ascr_polar_table **tab)
{
  const double pi = 3.14159265358979323846, rtip = 0.0635, pitch = 0.1016;
  memset(b, 0, sizeof *b);
  b->n_blades = 2;
  b->r_tip_m = rtip;
  b->r_hub_m = 0.008;
  b->rotation = 1;
  b->n_sections = 1;
  b->n_stations = TEST_PROP_STATIONS;
  b->stations = st;
  for (size_t i = 0; i < TEST_PROP_STATIONS; i++) {
    double r = 0.012 + (rtip - 0.012) * (double)i / 10.0;
    st[i].r_m = r;
    st[i].chord_m = 0.012 - 0.004 * (double)i / 10.0;
    st[i].twist_deg = atan(pitch / (2.0 * pi * r)) * 180.0 / pi;
    st[i].section = 0;
  }
  return ascr_polar_table_linear(2.0 * pi, -2.0 * pi / 180.0, 0.02, tab, NULL) == ASCR_OK ? 0 : -1;
}

#endif
