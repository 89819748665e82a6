/* src/rotor/rotor_impl.h
 * Private helpers of the rotor stage: blade properties at a radius.
 */
#ifndef ASCR_ROTOR_IMPL_H
#define ASCR_ROTOR_IMPL_H

#include "airscrew/ascr_rotor.h"

/* Chord, twist (pitch offset included) and the two sections blended at radius r (inside the
 * blade span): coefficients = (1 - w) * section s0 + w * section s1. */
void rotor_blade_at(const ascr_blade *b, double r, double *chord, double *twist_deg, size_t *s0,
                    size_t *s1, double *w);

/* Outer edge radius of element i-1 / inner edge of element i (i = 0..n) of a blade spanning
 * r0..r1: sine spacing, fine at the tip where the loading falls to zero and coarse at the root
 * (where close trailing vortices would make the vortex model ill-conditioned). */
double rotor_edge(double r0, double r1, size_t i, size_t n);

#endif
