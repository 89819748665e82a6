/* src/rotor/result.c
 * The figures of one operating point from its thrust and torque, and the flags of its blade
 * elements with the share of the thrust that rests on flagged ones (rotor_impl.h): one place
 * for both inflow models.
 */
#include "rotor/rotor_impl.h"
#include "core/core_impl.h"

#include <math.h>

void rotor_flags_add(rotor_flags *f, const ascr_table_sample *q, double dt_dr, double dr)
{
  f->n_stalled += (size_t)q->stalled;
  f->n_extended += (size_t)(q->region == ASCR_TABLE_EXTENDED);
  f->n_bridged += (size_t)(q->region == ASCR_TABLE_BRIDGED);
  f->n_re_outside += (size_t)q->re_outside;
  f->n_trip_unbound += (size_t)(q->trip_unbound != 0);
  double t = fabs(dt_dr * dr);
  if (isfinite(t)) {
    f->t_all += t;
    if (q->region != ASCR_TABLE_COMPUTED || q->re_outside) f->t_flagged += t;
  }
}

void rotor_flags_finish(const rotor_flags *f, ascr_rotor_result *res)
{
  res->n_stalled = f->n_stalled;
  res->n_extended = f->n_extended;
  res->n_bridged = f->n_bridged;
  res->n_re_outside = f->n_re_outside;
  res->n_trip_unbound = f->n_trip_unbound;
  res->flagged_thrust_share = f->t_all > 0.0 ? f->t_flagged / f->t_all : 0.0;
  res->low_confidence = res->flagged_thrust_share > ASCR_ROTOR_LOW_CONFIDENCE_SHARE;
}

void rotor_point_finish(const ascr_blade *b, const ascr_rotor_params *p, double rpm, double v,
                        double thrust, double torque, int converged, const rotor_flags *f,
                        ascr_rotor_result *res)
{
  double rho = p->density_kg_m3, n = rpm / 60.0, d = 2.0 * b->r_tip_m, r = b->r_tip_m;
  double omega = rpm * 2.0 * ASCR_PI / 60.0, area = ASCR_PI * r * r, vtip = omega * r;
  res->rpm = rpm;
  res->speed_m_s = v;
  res->converged = converged;
  res->thrust_N = thrust;
  res->torque_Nm = torque;
  res->power_W = torque * omega;
  /* propeller convention (n in rev/s, D the diameter) */
  res->CT = thrust / (rho * n * n * pow(d, 4));
  res->CP = res->power_W / (rho * n * n * n * pow(d, 5));
  res->CQ = torque / (rho * n * n * pow(d, 5));
  res->J = v / (n * d);
  /* rotor convention (tip speed, disc area; Leishman, Principles of Helicopter
   * Aerodynamics, 2nd ed. 2006, ch. 2), and the thrust-weighted blade loading CT/sigma with
   * the area solidity sigma = B int c dr / (pi R^2) over the blade span */
  res->CT_rotor = thrust / (rho * area * vtip * vtip);
  res->CP_rotor = res->power_W / (rho * area * vtip * vtip * vtip);
  double cint = 0.0, r0 = b->stations[0].r_m, r1 = b->stations[b->n_stations - 1].r_m;
  for (size_t i = 0; i < p->n_elements; i++) {
    double ea = rotor_edge(r0, r1, i, p->n_elements), eb = rotor_edge(r0, r1, i + 1, p->n_elements);
    double chord, tw, w;
    size_t s0, s1;
    rotor_blade_at(b, 0.5 * (ea + eb), &chord, &tw, &s0, &s1, &w);
    cint += chord * (eb - ea);
  }
  res->solidity = b->n_blades * cint / (ASCR_PI * r * r);
  res->CT_over_sigma = res->CT_rotor / res->solidity;
  res->efficiency = (converged && v > 0.0 && thrust > 0.0 && res->power_W > 0.0)
                        ? thrust * v / res->power_W : NAN;
  res->figure_of_merit = (converged && v == 0.0 && thrust > 0.0 && res->power_W > 0.0)
                             ? pow(thrust, 1.5) / (res->power_W * sqrt(2.0 * rho * area)) : NAN;
  res->tip_mach = hypot(vtip, v) / p->sound_speed_m_s;
  {
    double c75, tw, w;
    size_t s0, s1;
    rotor_blade_at(b, fmin(fmax(0.75 * r, r0), r1), &c75, &tw, &s0, &s1, &w);
    res->re_075 = rho * c75 * hypot(0.75 * vtip, v) / p->viscosity_pa_s;
  }
  rotor_flags_finish(f, res);
}

void ascr_rotor_band_of(const ascr_rotor_result *r, size_t n, ascr_rotor_band *out)
{
  out->thrust_N[0] = out->power_W[0] = out->efficiency[0] = INFINITY;
  out->thrust_N[1] = out->power_W[1] = out->efficiency[1] = -INFINITY;
  out->re_075 = n > 0 ? r[0].re_075 : NAN;
  out->n_used = 0;
  int eta = 1;
  for (size_t i = 0; i < n; i++) {
    if (!r[i].converged) continue;
    out->n_used++;
    out->thrust_N[0] = fmin(out->thrust_N[0], r[i].thrust_N);
    out->thrust_N[1] = fmax(out->thrust_N[1], r[i].thrust_N);
    out->power_W[0] = fmin(out->power_W[0], r[i].power_W);
    out->power_W[1] = fmax(out->power_W[1], r[i].power_W);
    if (isfinite(r[i].efficiency)) {
      out->efficiency[0] = fmin(out->efficiency[0], r[i].efficiency);
      out->efficiency[1] = fmax(out->efficiency[1], r[i].efficiency);
    } else {
      eta = 0;
    }
  }
  out->complete = n > 0 && out->n_used == n;
  if (out->n_used == 0) {
    out->thrust_N[0] = out->thrust_N[1] = out->power_W[0] = out->power_W[1] = NAN;
  }
  if (out->n_used == 0 || !eta) out->efficiency[0] = out->efficiency[1] = NAN;
}
