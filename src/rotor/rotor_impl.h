/* src/rotor/rotor_impl.h
 * Private helpers of the rotor stage: blade properties at a radius.
 */
#ifndef ASCR_ROTOR_IMPL_H
#define ASCR_ROTOR_IMPL_H

#include "airscrew/ascr_rotor.h"
#include "airscrew/ascr_table.h"

/* Chord, twist (pitch offset included) and the two sections blended at radius r (inside the
 * blade span): coefficients = (1 - w) * section s0 + w * section s1. */
void rotor_blade_at(const ascr_blade *b, double r, double *chord, double *twist_deg, size_t *s0,
                    size_t *s1, double *w);

/* The blended section coefficients at an element: section s0's table, blended with weight w
 * towards section s1's (rotor_blade_at), at angle of attack alpha (rad), Re and Mach; the flags
 * of either; the lift raised by the stall-delay factor sd of the element
 * (rotor_stall_delay_factor; 0: none) (blade.c). */
void rotor_sample(const ascr_polar_table *const *tables, size_t s0, size_t s1, double w,
                  double alpha, double re, double mach, double sd, ascr_table_sample *out);
/* The stall-delay factor of an element of chord c at radius r under p's model: 3 (c/r)^2
 * held at most 1 for Snel's, 0 without a model (blade.c; ascr_rotor.h says the model). */
double rotor_stall_delay_factor(const ascr_rotor_params *p, double chord, double r);
/* The blended pitching-moment coefficient there (the look-ups above skip cm for speed; this
 * one is for the reported elements) (blade.c). */
double rotor_sample_cm(const ascr_polar_table *const *tables, size_t s0, size_t s1, double w,
                       double alpha, double re, double mach);

/* Prandtl's tip-and-hub loss factor of blade b at radius r for inflow angle sin_phi (the
 * parameters' switches applied; floored at 1e-8): F = 2/pi acos(exp(-f)),
 * f = (B/2) dist / (rref |sin phi|) (Glauert 1935) for the tip (dist R - r, rref r) and the hub
 * (dist r - r_hub, rref r_hub) (blade.c). */
double rotor_loss(const ascr_blade *b, const ascr_rotor_params *p, double r, double sin_phi);

/* Outer edge radius of element i-1 / inner edge of element i (i = 0..n) of a blade spanning
 * r0..r1: sine spacing, fine at the tip where the loading falls to zero and coarse at the root
 * (where close trailing vortices would make the vortex model ill-conditioned). */
double rotor_edge(double r0, double r1, size_t i, size_t n);

/* Flags of the solved elements of one point: counts, and the thrust magnitudes behind the share
 * resting on flagged ones. Both inflow models count through here (src/rotor/result.c). */
typedef struct rotor_flags {
  size_t n_stalled, n_extended, n_bridged, n_re_outside, n_trip_unbound;
  double t_all, t_flagged;
} rotor_flags;

/* Count one solved element (stalled, extended, bridged, Re outside, a trip binding nothing);
 * dt_dr (N/m) times dr is its thrust. */
void rotor_flags_add(rotor_flags *f, const ascr_table_sample *q, double dt_dr, double dr);

/* The counts, flagged_thrust_share and low_confidence into res. */
void rotor_flags_finish(const rotor_flags *f, ascr_rotor_result *res);

/* Every figure of a point into res from its thrust (N) and torque (N m) at rpm and axial speed
 * v (m/s): power, the propeller and rotor coefficients, solidity, efficiency or figure of merit
 * (converged points only), tip Mach number, and the flags (rotor_flags_finish). */
void rotor_point_finish(const ascr_blade *b, const ascr_rotor_params *p, double rpm, double v,
                        double thrust, double torque, int converged, const rotor_flags *f,
                        ascr_rotor_result *res);

/* The vortex model from a BEMT solution at the same point (its result bres and elements bel give
 * the starting circulation and wake pitch); p and vp complete and checked (point.c). */
ascr_status rotor_vortex_from(const ascr_blade *b, const ascr_polar_table *const *tables,
                              const ascr_rotor_params *p, const ascr_vortex_params *vp,
                              double rpm, double speed_m_s, const ascr_rotor_result *bres,
                              const ascr_rotor_element *bel, ascr_rotor_result *res,
                              ascr_rotor_element *el, ascr_errbuf *err);

#endif
