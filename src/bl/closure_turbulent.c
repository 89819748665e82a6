/* src/bl/closure_turbulent.c
 * Turbulent closure relations of the two-equation integral method with a lag equation for the
 * maximum shear-stress coefficient Ctau.
 *
 * Method and references.
 *   H*: M. Drela and M. B. Giles, AIAA Journal 25(10), 1987, turbulent H*(Hk, Re_theta) fit
 *       with H0 = 3 + 400/Re_theta (H0 = 4 below Re_theta = 400).
 *   Cf: T. W. Swafford, "Analytical approximation of two-dimensional separated turbulent
 *       boundary-layer velocity profiles", AIAA Journal 21(6), 1983, pp. 923-926, in the form
 *       used by Drela & Giles: Cf Fc = 0.3 exp(-1.33 Hk) (log10(Re_theta/Fc))^(-1.74-0.31 Hk)
 *       + 0.00011 (tanh(4 - Hk/0.875) - 1), Fc = sqrt(1 + 0.2 M^2).
 *   Dissipation: CD = (Cf/2) Us + Ctau (1 - Us), wall slip velocity
 *       Us = (H* / 2)(1 - (4/3)(Hk - 1)/H) (Drela & Giles 1987), from the G-beta equilibrium
 *       locus with A = 6.7, B = 0.75, which also gives the equilibrium
 *       Ctau_EQ = H* (0.015/(1 - Us)) (Hk - 1)^3 / (Hk^2 H).
 *   Layer thickness for the lag equation: delta = theta (3.15 + 1.72/(Hk - 1)) + dstar.
 *   Lag equation (G. E. Green, D. J. Weeks and J. M. Brooman, "Prediction of turbulent boundary
 *       layers and wakes in compressible flow by a lag-entrainment method", ARC R&M 3791, 1977),
 *       in the form (delta/Ctau) dCtau/dxi = 5.6 (sqrt(Ctau_EQ) - sqrt(Ctau)), i.e. K = 2.8 for sqrt(Ctau),
 *       is applied in march.c.
 * In a wake (wake = 1) the wall terms vanish (Cf = 0) and the outer-layer dissipation is
 * doubled, the two halves of the wake each carrying a shear layer (Drela & Giles 1987).
 * The constants are written from memory of the published fits; the turbulent flat-plate test
 * (tests/bl/test_bl_flat_plate.c) checks the assembled closure against Schlichting's formula.
 */
#include "bl/bl_impl.h"

#include <math.h>

double bl_closure_turbulent_cd(double cf, double us, double ctau, int wake)
{
  double cd = 0.5 * cf * us + ctau * (1.0 - us);
  if (wake) {
    cd *= 2.0;
  }
  return cd;
}

void bl_closure_turbulent(double h, double rth, double me, double ctau, int wake, bl_turb_fit fl,
                          bl_closure *c)
{
  double hk = bl_hk(h, me);
  /* floor of the fits: a wake tends to H = 1 far downstream, a wall layer never goes below 1.05 */
  double hk_min = wake ? 1.00005 : 1.05;
  if (hk < hk_min) hk = hk_min;
  {
    /* Re_theta held above the floor (bl_impl.h: Preston 1958) */
    double d = rth - fl.rth_min;
    rth = fl.rth_min + 0.5 * (d + sqrt(d * d + fl.rth_width * fl.rth_width));
  }
  double h0 = rth > 400.0 ? 3.0 + 400.0 / rth : 4.0;
  double lr = log(rth);
  double hs;
  if (hk < h0) {
    hs = 1.505 + 4.0 / rth + (0.165 - 1.6 / sqrt(rth)) * pow(h0 - hk, 1.6) / hk;
  } else {
    double e = hk - h0, g = hk - h0 + 4.0 / lr;
    hs = 1.505 + 4.0 / rth + e * e * (0.04 / hk + 0.007 * lr / (g * g));
  }
  double fc = sqrt(1.0 + 0.2 * me * me);
  double cf = 0.0;
  if (!wake) {
    double lg = log10(rth / fc);
    if (lg < 0.5) lg = 0.5;
    cf = (0.3 * exp(-1.33 * hk) * pow(lg, -1.74 - 0.31 * hk) +
          0.00011 * (tanh(4.0 - hk / 0.875) - 1.0)) / fc;
  }
  double us = 0.5 * hs * (1.0 - 4.0 / 3.0 * (hk - 1.0) / h);
  if (us > 0.95) us = 0.95;
  if (us < 0.0) us = 0.0;
  double ctau_eq = hs * 0.015 / (1.0 - us) * (hk - 1.0) * (hk - 1.0) * (hk - 1.0) / (hk * hk * h);
  double cd = bl_closure_turbulent_cd(cf, us, ctau, wake);
  c->hk = hk;
  c->hs = hs;
  c->cf = cf;
  c->cd = cd;
  c->ctau_eq = ctau_eq;
  c->us = us;
  c->delta = 0.0; /* set by the caller, which knows theta and dstar */
}

/* Green et al. 1977 / Drela & Giles 1987: (delta/Ctau) dCtau/dxi = 5.6 (sqrt(Ctau_EQ) -
 * sqrt(Ctau)), i.e. 2.8 in the sqrt(Ctau) form used here */
#define LAG_K 2.8
/* Wake: Green, Weeks & Brooman (1977) scale the dissipation length of a wake by lambda = 0.5
 * against a wall layer (value from memory of the report); the lag constant, a rate per unit of
 * that length (Bradshaw's dissipation term (tau/rho)^(3/2)/L), scales with 1/lambda. Without
 * it the lag length delta, which grows like 1/(Hk - 1) as the defect decays, froze Ctau in the
 * near wake behind a thick or separated trailing edge and the dissipation drove H below 1
 * (docs/theory/viscous.md, "The wake"). */
#define LAG_WAKE_LAMBDA 0.5

/* Streamline curvature. Curvature of the streamlines in the plane of the mean shear changes the
 * turbulence an order of magnitude more than the extra terms it brings into the mean equations:
 * a convex wall (stabilising) shortens the length scale of the stress-carrying eddies, a concave
 * one lengthens it. Bradshaw's analogy with buoyancy (P. Bradshaw, "The analogy between
 * streamline curvature and buoyancy in turbulent shear flow", J. Fluid Mech. 36(1), 1969,
 * pp. 177-191; "Effects of streamline curvature on turbulent flow", AGARDograph 169, 1973)
 * writes it as L/L0 = 1 - beta Ri, Ri = (2U/R)/(dU/dy) the curvature Richardson number. In the
 * lag equation the dissipation term, the one in sqrt(Ctau), carries 1/L: it is multiplied by
 * lambda = L0/L, and the stress the layer sustains falls by lambda^2. Green, Weeks & Brooman
 * (1977) evaluate Ri for the integral layer as (2/3)(theta/R)(H1 + H)(H1/H + 0.3) with Head's
 * H1 and take beta = 7 on convex and 4.5 on concave walls (form and constants from memory of
 * the report). The form checked: Ri of a power-law profile U/Ue = (y/delta)^n, n = (H - 1)/2,
 * at y = 0.4 delta, 2 (y/n)/R, lies 2-31 % from this one over H 1.3-2.0 with the profile's own
 * theta (tests/bl/test_bl_march.c). Convex: Green's linear form
 * 1 + 7 Ri (Bradshaw's 1/(1 - 7 Ri) to first order, finite for any Ri); concave: Bradshaw's
 * 1/(1 + 4.5 |Ri|) exactly, positive for any curvature. The curvature is the wall's: for an
 * attached layer that of its streamlines; over a separation bubble the dividing streamline's
 * differs (docs/theory/viscous.md, "Streamline curvature"). */
#define CURV_BETA_CONVEX 7.0
#define CURV_BETA_CONCAVE 4.5

double bl_curvature_lambda(double theta, double h, double hk, double kappa)
{
  if (kappa == 0.0) return 1.0;
  double h1 = 3.15 + 1.72 / (hk - 1.0);
  double ri = (2.0 / 3.0) * theta * kappa * (h1 + h) * (h1 / h + 0.3);
  return ri > 0.0 ? 1.0 + CURV_BETA_CONVEX * ri : 1.0 / (1.0 - CURV_BETA_CONCAVE * ri);
}

/* The lag thickness. Head's entrainment shape factor as fitted by Green, Weeks & Brooman,
 * delta = theta (3.15 + 1.72/(Hk - 1)) + dstar, grows without bound as Hk -> 1 (29 theta at Hk
 * 1.07), beyond the fit's range (H about 1.3-2.8): behind a leading-edge bubble a layer with
 * Ctau far above equilibrium then relaxed ever more slowly while the dissipation drove Hk down,
 * a runaway to the wall-layer floor Hk 1.05 (a thin plate at Re 1e6 behind its lower bubble: H
 * 1.07, Cf 0.006 at Re_theta 1800, where a flat plate has 1.4 and 0.0035). Coles' profile bounds
 * it by the skin friction; in an attached layer the two agree (Re_theta 2000, H 1.4: 8.85 and
 * 8.89 theta, tests/bl/test_bl_march.c), near separation (Cf -> 0) Coles' grows and the fit
 * stands. Measured (docs/theory/viscous.md). */
double bl_lag_rate(double theta, double h, double hk, double sc, double ctau_eq, double cf,
                   int wake, double coles, double kappa)
{
  double delta = theta * (3.15 + 1.72 / (hk - 1.0)) + h * theta;
  if (!wake && coles > 0.0 && cf > 0.0) {
    double dc = BL_COLES_KAPPA * h * theta / ((1.0 + BL_COLES_PI) * sqrt(0.5 * cf) * coles);
    if (dc < delta) delta = dc;
  }
  double k = wake ? LAG_K / LAG_WAKE_LAMBDA : LAG_K;
  double lam = wake ? 1.0 : bl_curvature_lambda(theta, h, hk, kappa);
  return k * sc * (sqrt(ctau_eq) - lam * sc) / delta;
}
