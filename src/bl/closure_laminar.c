/* src/bl/closure_laminar.c
 * Laminar closure relations of the two-equation integral method: fits to the Falkner-Skan
 * similarity profiles for the kinetic-energy shape parameter H*, the skin friction and the
 * dissipation, as functions of the kinematic shape parameter Hk and Re_theta.
 *
 * References.
 *   M. Drela and M. B. Giles, "Viscous-inviscid analysis of transonic and low Reynolds number
 *     airfoils", AIAA Journal 25(10), 1987, pp. 1347-1355: laminar closure (section "Closure
 *     relations", laminar H*, Cf and CD fits).
 *   J. D. Whitfield, Arnold Engineering Development Center, AEDC-TR-77-79, 1978: Hk.
 * The fits were written here from those published forms. Check at the Blasius state
 * Hk = 2.591: H* = 1.573, Re_theta Cf/2 = 0.2207, Re_theta 2 CD / H* = 0.2206, against the exact
 * 1.5726, 0.2204, 0.2204 (tests/bl/test_bl_closure.c).
 *
 * Notation: f = Re_theta Cf / 2, d = Re_theta 2 CD / H*.
 */
#include "bl/bl_impl.h"

#include <math.h>

double bl_hk(double h, double me)
{
  double m2 = me * me;
  return (h - 0.29 * m2) / (1.0 + 0.113 * m2);
}

void bl_closure_laminar(double h, double rth, double me, bl_closure *c)
{
  double hk = bl_hk(h, me);
  if (hk < 1.05) hk = 1.05; /* keep the fits in their domain; Hk < 1.05 is never physical */
  double hs, f, d;
  if (hk < 4.0) {
    hs = 1.515 + 0.076 * (4.0 - hk) * (4.0 - hk) / hk;
    d = 0.207 + 0.00205 * pow(4.0 - hk, 5.5);
  } else {
    double e = (hk - 4.0) * (hk - 4.0);
    hs = 1.515 + 0.040 * e / hk;
    d = 0.207 - 0.003 * e / (1.0 + 0.02 * e);
  }
  if (hk < 7.4) {
    f = -0.067 + 0.01977 * (7.4 - hk) * (7.4 - hk) / (hk - 1.0);
  } else {
    double g = 1.0 - 1.4 / (hk - 6.0);
    f = -0.067 + 0.022 * g * g;
  }
  c->hk = hk;
  c->hs = hs;
  c->cf = 2.0 * f / rth;
  c->cd = 0.5 * d * hs / rth;
  c->ctau_eq = 0.0;
  c->us = 0.0;
  c->delta = 0.0;
}
