/* src/panel/compress.c
 * Compressibility corrections of an incompressible pressure coefficient.
 *
 * Karman-Tsien rule: Cp = Cp0 / (beta + M^2 / (1 + beta) * Cp0 / 2), beta = sqrt(1 - M^2).
 * References: H. S. Tsien, "Two-dimensional subsonic flow of compressible fluids",
 * J. Aeronautical Sciences 6(10), 1939, pp. 399-407; Th. von Karman, "Compressibility effects
 * in aerodynamics", J. Aeronautical Sciences 8(9), 1941, pp. 337-356.
 * Critical pressure coefficient (local Mach 1) from the isentropic relations, gamma = 1.4:
 * Cp* = 2/(gamma M^2) [ ((2 + (gamma-1) M^2)/(gamma+1))^(gamma/(gamma-1)) - 1 ]
 * (Ames Research Staff, NACA Report 1135, 1953).
 */
#include "panel/panel_impl.h"

#include <math.h>

double ascr_panel_karman_tsien(double cp0, double mach)
{
  if (!(mach >= 0.0 && mach < 1.0) || !isfinite(cp0)) {
    return NAN;
  }
  double beta = sqrt(1.0 - mach * mach);
  double den = beta + mach * mach / (1.0 + beta) * 0.5 * cp0;
  if (!(den > 0.0)) {
    return NAN;
  }
  double cp = cp0 / den;
  /* below the vacuum limit the rule has left its range */
  double cp_vac = mach > 0.0 ? -2.0 / (1.4 * mach * mach) : -INFINITY;
  return cp >= cp_vac ? cp : NAN;
}

double panel_cp_critical(double mach)
{
  const double g = 1.4;
  double m2 = mach * mach;
  return 2.0 / (g * m2) * (pow((2.0 + (g - 1.0) * m2) / (g + 1.0), g / (g - 1.0)) - 1.0);
}
