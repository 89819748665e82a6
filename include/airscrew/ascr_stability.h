/* include/airscrew/ascr_stability.h
 * Linear stability of laminar boundary-layer profiles, to check the transition correlation of
 * the integral boundary layer (ascr_bl.h) where it has no data behind it: Falkner-Skan
 * similarity profiles on the attached and the reversed-flow branch, the Orr-Sommerfeld equation
 * solved for temporal eigenvalues by Chebyshev collocation, spatial growth rates by Gaster's
 * relation, and the e^N envelope of a Falkner-Skan flow. Not used by the viscous solver.
 *
 * Units: lengths in momentum thicknesses theta of the profile, speeds in edge velocities ue;
 * alpha_theta = alpha theta (wavenumber), omega_theta = omega theta / ue (frequency),
 * Re_theta = ue theta / nu. Growth rates are -alpha_i theta (e-folds of amplitude per theta).
 *
 * References (equations written from the published forms; values quoted from memory):
 *   Falkner-Skan: f''' + f f'' + beta (1 - f'^2) = 0, f(0) = f'(0) = 0, f'(inf) = 1, with
 *     eta = y sqrt((m+1) ue / (2 nu x)), beta = 2m/(m+1); D. R. Hartree, Proc. Camb. Phil. Soc.
 *     33, 1937 (attached branch); K. Stewartson, Proc. Camb. Phil. Soc. 50, 1954 (the
 *     reversed-flow branch, f''(0) < 0, for -0.19884 < beta < 0).
 *   Orr-Sommerfeld: (U - c)(phi'' - a^2 phi) - U'' phi = (phi'''' - 2 a^2 phi'' + a^4 phi)/(i a Re),
 *     phi = phi' = 0 at the wall and far out; Chebyshev collocation as in L. N. Trefethen,
 *     "Spectral Methods in MATLAB", SIAM 2000, ch. 6 and 14.
 *   Spatial rates: M. Gaster, J. Fluid Mech. 14, 1962: -alpha_i = omega_i / c_g, c_g = d omega_r / d alpha.
 *   Check: Blasius critical point Re_dstar = 519.4 at alpha dstar = 0.3036, c = 0.3965
 *     (J. Jordinson, J. Fluid Mech. 43, 1970), tests/bl/test_bl_stability.c.
 *
 * Thread safety: a workspace is used by one thread at a time; no hidden state.
 */
#ifndef ASCR_STABILITY_H
#define ASCR_STABILITY_H

#include <stddef.h>
#include "airscrew/ascr_errno.h"

#ifdef __cplusplus
extern "C" {
#endif

/** A Falkner-Skan profile as solved. */
typedef struct ascr_fs_profile {
  double beta;      /* pressure-gradient parameter 2m/(m+1) */
  int reversed;     /* 1: Stewartson's reversed-flow branch, 0: the attached branch */
  double fpp0;      /* wall shear f''(0) */
  double h;         /* shape parameter dstar / theta */
  double theta_eta; /* momentum thickness in eta units */
  double eta_max;   /* outer edge of the integration */
} ascr_fs_profile;

typedef struct ascr_stability ascr_stability;

/** Workspace for n collocation intervals (16 .. 400; 100 resolves the Blasius critical point
 *  to 0.1 %) and envelopes over up to n_re_max Reynolds numbers. NULL if out of memory or n
 *  is out of range. */
ASCR_EXPORT ascr_stability *ascr_stability_alloc(size_t n, size_t n_re_max);
ASCR_EXPORT void ascr_stability_free(ascr_stability *w);

/** Solve the Falkner-Skan profile of beta (attached: -0.19884 < beta <= 2; reversed:
 *  -0.19884 < beta < -0.02; Hartree's separation profile at -0.19884) and make it the profile
 *  of the following calls.
 *  @return ASCR_OK; ASCR_EINVAL outside the range; ASCR_EMAXITER if no shooting solution. */
ASCR_EXPORT ascr_status ascr_stability_set_falkner_skan(ascr_stability *w, double beta,
                                                        int reversed, ascr_fs_profile *info,
                                                        ascr_errbuf *err);

/** The least stable temporal eigenvalue c = cr + i ci at real wavenumber alpha_theta and
 *  Re_theta (a mode with phase speed between -0.5 and 1). */
ASCR_EXPORT ascr_status ascr_stability_temporal(ascr_stability *w, double alpha_theta,
                                                double re_theta, double *cr, double *ci,
                                                ascr_errbuf *err);

/** The largest spatial growth rate over all frequencies at Re_theta, and its frequency;
 *  0 where the profile is stable at that Re_theta. */
ASCR_EXPORT ascr_status ascr_stability_spatial_max(ascr_stability *w, double re_theta,
                                                   double *rate_theta, double *omega_theta,
                                                   ascr_errbuf *err);

/** The e^N envelope of the Falkner-Skan flow of the current profile: re_theta[0..n-1]
 *  increasing (n <= n_re_max), n_env[k] the largest amplification exponent any single frequency
 *  has reached at re_theta[k], integrating the spatial rates of every frequency from re_theta[0]
 *  along the similarity flow (at fixed physical frequency, omega theta / ue grows as
 *  Re_theta^((1-3m)/(1+m))), dN/dRe_theta = (-alpha_i theta) / theta_eta^2. */
ASCR_EXPORT ascr_status ascr_stability_fs_envelope(ascr_stability *w, const double *re_theta,
                                                   size_t n, double *n_env, ascr_errbuf *err);

/** The straight line N = slope (Re_theta - onset) fitted by least squares to the envelope's
 *  points with n_lo <= N <= n_hi (the correlation's form: Drela & Giles 1987); returns the
 *  number of points used, and leaves slope and onset NaN if fewer than 3. */
ASCR_EXPORT size_t ascr_stability_envelope_line(const double *re_theta, const double *n_env,
                                               size_t n, double n_lo, double n_hi,
                                               double *slope, double *onset);

#ifdef __cplusplus
}
#endif
#endif /* ASCR_STABILITY_H */
