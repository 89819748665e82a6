/* src/bl/transition.c
 * e^N envelope transition: growth rate of the most amplified Tollmien-Schlichting wave in a
 * Falkner-Skan layer, as a function of the local shape parameter and Re_theta; critical N from
 * the free-stream turbulence level; Ctau at the start of turbulent flow.
 *
 * References.
 *   M. Drela and M. B. Giles, AIAA Journal 25(10), 1987: envelope fits
 *     dN/dRe_theta = 0.01 sqrt((2.4 Hk - 3.7 + 2.5 tanh(1.5 Hk - 4.65))^2 + 0.25),
 *     log10 Re_theta,0 = (1.415/(Hk-1) - 0.489) tanh(20/(Hk-1) - 12.9) + 3.295/(Hk-1) + 0.44,
 *     and the conversion to a streamwise rate with the Falkner-Skan relations
 *     dN/dxi = dN/dRe_theta (m+1)/2 l/theta,
 *     l = (6.54 Hk - 14.07)/Hk^2, m = (0.058 (Hk-4)^2/(Hk-1) - 0.068)/l.
 *     Amplification starts where Re_theta exceeds Re_theta,0; a smooth ramp over
 *     +-0.08 in log10 Re_theta avoids a jump in the rate (a choice of ours).
 *     Checked against the e^N envelope computed from the Orr-Sommerfeld equation
 *     (src/bl/stability.c; tests/bl/test_bl_stability.c): within 5 % on the attached branch;
 *     on the reversed-flow branch (H above 4) the fit runs 25 % to 3.6 times faster than the
 *     computed envelope (docs/theory/viscous.md), kept because the UIUC comparison is worse
 *     without it.
 *   L. M. Mack, "Transition prediction and linear stability theory", AGARD CP-224, 1977:
 *     N_crit = -8.43 - 2.4 ln(Tu).
 *   Initial Ctau: 1.8 exp(-3.3/(Hk - 1)) Ctau_EQ (Drela 1989, "XFOIL: an analysis and design
 *     system for low Reynolds number airfoils", LNE 54; from memory).
 */
#include "bl/bl_impl.h"

#include <math.h>
#include <string.h>

double bl_amplification_rate(double hk, double theta, double rth)
{
  if (hk < 1.05) hk = 1.05;
  double hm = 1.0 / (hk - 1.0);
  double lg0 = (1.415 * hm - 0.489) * tanh(20.0 * hm - 12.9) + 3.295 * hm + 0.44;
  double lg = log10(rth > 1.0 ? rth : 1.0);
  const double ramp = 0.08;
  double w;
  if (lg < lg0 - ramp) {
    return 0.0;
  } else if (lg > lg0 + ramp) {
    w = 1.0;
  } else {
    double u = (lg - (lg0 - ramp)) / (2.0 * ramp);
    w = u * u * (3.0 - 2.0 * u);
  }
  double a = 2.4 * hk - 3.7 + 2.5 * tanh(1.5 * hk - 4.65);
  double dndr = 0.01 * sqrt(a * a + 0.25);
  double l = (6.54 * hk - 14.07) / (hk * hk);
  double m = (0.058 * (hk - 4.0) * (hk - 4.0) / (hk - 1.0) - 0.068) / l;
  double rate = dndr * 0.5 * (m + 1.0) * l / theta;
  return w * (rate > 0.0 ? rate : 0.0);
}

double bl_ctau_initial(double hk, double ctau_eq)
{
  if (hk < 1.05) hk = 1.05;
  return 1.8 * exp(-3.3 / (hk - 1.0)) * ctau_eq;
}

double ascr_bl_ncrit_from_turbulence(double tu_percent)
{
  if (!(tu_percent > 0.0)) return NAN;
  return -8.43 - 2.4 * log(tu_percent / 100.0);
}

/* Named settings. Values other than the tunnel's are common practice, not measurements of
 * ours; Mack's relation (above) is quoted beside them as the turbulence level each stands for,
 * though it is meant for wind-tunnel turbulence, not for roughness. */
static const ascr_transition_preset presets[] = {
    {"quiet-air", 11.0,
     "smooth surface in calm free air; common practice (N_crit 11-12 is usual for free flight; "
     "Mack 1977 gives 11 at Tu 0.03 %)"},
    {"tunnel", 9.0,
     "smooth model in a low-turbulence wind tunnel (Tu about 0.07 %: Mack 1977 gives 9.0), the "
     "conditions of the UIUC and NACA low-speed data"},
    {"sanded", 7.0,
     "a sanded or painted printed blade; common practice (Mack 1977: Tu about 0.15 %)"},
    {"rotor-inflow", 5.0,
     "a rotor blade in the disturbed inflow of a hovering rotor (the other blades' wakes, "
     "room or gust turbulence); common practice (Mack 1977: Tu about 0.3 %)"},
    {"printed-rough", 3.0,
     "an as-printed blade with layer lines (filament or coarse resin print): roughness of that "
     "size brings transition close behind the leading edge; common practice (a trip near the "
     "leading edge is the alternative; Mack 1977: Tu about 0.8 %)"},
};

const ascr_transition_preset *ascr_transition_presets(size_t *n)
{
  if (n != NULL) *n = sizeof presets / sizeof presets[0];
  return presets;
}

const ascr_transition_preset *ascr_transition_preset_find(const char *name)
{
  if (name == NULL) return NULL;
  for (size_t i = 0; i < sizeof presets / sizeof presets[0]; i++) {
    if (strcmp(presets[i].name, name) == 0) return &presets[i];
  }
  return NULL;
}
