/* src/rotor/air.c
 * The air of a rotor run: the International Standard Atmosphere, or a given temperature and
 * pressure; density by the ideal-gas law, dynamic viscosity by Sutherland's law, speed of sound
 * sqrt(gamma R T) (U.S. Standard Atmosphere 1976 constants: R 287.05287 J/(kg K), gamma 1.4,
 * Sutherland beta 1.458e-6 kg/(m s K^0.5), S 110.4 K).
 */
#include "rotor/rotor_impl.h"
#include "core/core_impl.h"

#include <math.h>

#define R_AIR 287.05287

ascr_status ascr_air_from_tp(double temperature_k, double pressure_pa, double *rho, double *mu,
                             double *a, ascr_errbuf *err)
{
  double t = temperature_k, p = pressure_pa;
  if (!(isfinite(t) && t >= 180.0 && t <= 350.0) || !(isfinite(p) && p >= 1e4 && p <= 1.2e5)) {
    return core_fail(err, ASCR_EDOM,
                     "air at %g K and %g Pa: outside 180 .. 350 K and 10 .. 120 kPa", t, p);
  }
  *rho = p / (R_AIR * t);
  *mu = 1.458e-6 * t * sqrt(t) / (t + 110.4);
  *a = sqrt(1.4 * R_AIR * t);
  return ASCR_OK;
}

ascr_status ascr_isa(double h, double *rho, double *mu, double *a, ascr_errbuf *err)
{
  if (!(isfinite(h) && h >= -500.0 && h <= 11000.0)) {
    return core_fail(err, ASCR_EDOM, "altitude %g m outside the ISA troposphere (-500 .. 11000 m)", h);
  }
  /* U.S. Standard Atmosphere 1976: T0 288.15 K, lapse 6.5 K/km, p0 101325 Pa, g0 9.80665 */
  const double g0 = 9.80665, lapse = 0.0065;
  double t = 288.15 - lapse * h;
  double p = 101325.0 * pow(t / 288.15, g0 / (R_AIR * lapse));
  return ascr_air_from_tp(t, p, rho, mu, a, err);
}

