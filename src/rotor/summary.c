/* src/rotor/summary.c
 * The key numbers of a rotor map for comparing candidates (include/airscrew/ascr_rotor.h,
 * ascr_rotor_summarize): hover rpm and power at a thrust, the best figure of merit, the best
 * efficiency at each airspeed.
 */
#include "core/core_impl.h"
#include "airscrew/ascr_rotor.h"

#include <math.h>
#include <string.h>

/* figure of merit from the coefficients: T^1.5 / (P sqrt(2 rho A)) with T = CT rho n^2 D^4,
 * P = CP rho n^3 D^5, A = pi D^2 / 4 gives CT^1.5 / (CP sqrt(pi / 2)) */
static double fm_of(const ascr_rotor_result *r)
{
  return r->CT > 0.0 && r->CP > 0.0 ? pow(r->CT, 1.5) / (r->CP * sqrt(0.5 * ASCR_PI)) : NAN;
}

/* hover at thrust t among the static points: a point at t, else the bracketing pair nearest in
 * rpm, sqrt(T) and P^(1/3) linear in rpm between them */
static void hover(const ascr_rotor_result *p, size_t n, double t, ascr_rotor_summary *o)
{
  double best = HUGE_VAL;
  for (size_t i = 0; i < n; i++) {
    if (!p[i].converged || p[i].speed_m_s != 0.0) continue;
    if (fabs(p[i].thrust_N - t) <= 1e-9 * t) {
      o->hover_rpm = p[i].rpm;
      o->hover_power_W = p[i].power_W;
      o->hover_interpolated = 0;
      return;
    }
    for (size_t j = 0; j < n; j++) {
      if (!p[j].converged || p[j].speed_m_s != 0.0 || !(p[j].rpm > p[i].rpm)) continue;
      if (!(p[i].thrust_N < t && p[j].thrust_N > t) || p[i].thrust_N <= 0.0) continue;
      double span = p[j].rpm - p[i].rpm;
      if (span >= best) continue;
      best = span;
      double si = sqrt(p[i].thrust_N), sj = sqrt(p[j].thrust_N);
      double f = (sqrt(t) - si) / (sj - si);
      double ci = cbrt(p[i].power_W), cj = cbrt(p[j].power_W);
      double c = ci + f * (cj - ci);
      o->hover_rpm = p[i].rpm + f * span;
      o->hover_power_W = c * c * c;
      o->hover_interpolated = 1;
    }
  }
}

ascr_status ascr_rotor_summarize(const ascr_rotor_result *p, size_t n, double t,
                                 ascr_rotor_summary *o, ascr_errbuf *err)
{
  if ((p == NULL && n > 0) || o == NULL || !(isnan(t) || t > 0.0)) {
    return core_fail(err, ASCR_EINVAL, "rotor summary: bad arguments (hover thrust > 0 or NaN)");
  }
  memset(o, 0, sizeof *o);
  o->hover_thrust_N = t;
  o->hover_rpm = o->hover_power_W = o->fm_max = o->fm_max_rpm = NAN;
  for (size_t i = 0; i < n; i++) {
    const ascr_rotor_result *r = &p[i];
    if (!r->converged) continue;
    o->n_used++;
    if (r->speed_m_s == 0.0) {
      double fm = fm_of(r);
      if (isfinite(fm) && !(fm <= o->fm_max)) {
        o->fm_max = fm;
        o->fm_max_rpm = r->rpm;
      }
      continue;
    }
    if (!(r->speed_m_s > 0.0)) continue;
    size_t k = 0;
    while (k < o->n_speeds && o->speed_m_s[k] != r->speed_m_s) k++;
    if (k == o->n_speeds) {
      if (o->n_speeds == ASCR_SUMMARY_MAX_SPEEDS) continue; /* more speeds: the lowest kept */
      o->speed_m_s[k] = r->speed_m_s;
      o->eta_max[k] = o->eta_max_rpm[k] = NAN;
      o->n_speeds++;
    }
    if (isfinite(r->efficiency) && !(r->efficiency <= o->eta_max[k])) {
      o->eta_max[k] = r->efficiency;
      o->eta_max_rpm[k] = r->rpm;
    }
  }
  /* ascending speeds (insertion sort of at most 8) */
  for (size_t a = 1; a < o->n_speeds; a++) {
    for (size_t b = a; b > 0 && o->speed_m_s[b] < o->speed_m_s[b - 1]; b--) {
      double s = o->speed_m_s[b], e = o->eta_max[b], r = o->eta_max_rpm[b];
      o->speed_m_s[b] = o->speed_m_s[b - 1];
      o->eta_max[b] = o->eta_max[b - 1];
      o->eta_max_rpm[b] = o->eta_max_rpm[b - 1];
      o->speed_m_s[b - 1] = s;
      o->eta_max[b - 1] = e;
      o->eta_max_rpm[b - 1] = r;
    }
  }
  if (!isnan(t)) hover(p, n, t, o);
  return ASCR_OK;
}
