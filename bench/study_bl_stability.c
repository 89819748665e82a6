/* bench/study_bl_stability.c
 * The e^N envelope of Falkner-Skan flows computed from linear stability (Orr-Sommerfeld,
 * include/airscrew/ascr_stability.h) against the transition correlation of the integral
 * boundary layer (Drela & Giles 1987, src/bl/transition.c), on the attached branch, where the
 * correlation was fitted to such envelopes, and on the reversed-flow branch of separated
 * layers, where it is extrapolated. Figures only, per profile: H; the largest local spatial
 * rate -alpha_i theta at Re_theta 200; the computed envelope's slope theta dN/dxi (least
 * squares over N 1 .. 9, the range transition prediction uses) and its onset Re_theta (where
 * that line crosses N = 0); the correlation's rate theta dN/dxi and onset (half rate) at the
 * same H. Arguments: [collocation intervals] (default 100). Takes a few minutes.
 */
#include <airscrew/airscrew.h>
#include "bl/bl_impl.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>

void openblas_set_num_threads(int num_threads);

#define NRE 48

static double corr_onset(double hk)
{
  double full = bl_amplification_rate(hk, 1.0, 1e7);
  double lo = 0.0, hi = 7.0;
  for (int k = 0; k < 60; k++) {
    double mid = 0.5 * (lo + hi);
    if (bl_amplification_rate(hk, 1.0, pow(10.0, mid)) < 0.5 * full) lo = mid;
    else hi = mid;
  }
  return pow(10.0, 0.5 * (lo + hi));
}

int main(int argc, char **argv)
{
  openblas_set_num_threads(1);
  size_t ncheb = argc > 1 ? (size_t)atoi(argv[1]) : 100;
  ascr_stability *w = ascr_stability_alloc(ncheb, NRE);
  if (w == NULL) return 1;
  const struct { double beta; int rev; } cases[] = {
      {0.0, 0}, {-0.10, 0}, {-0.15, 0}, {-0.19, 0}, {-0.198, 1}, {-0.19, 1},
      {-0.17, 1}, {-0.15, 1}, {-0.13, 1}, {-0.10, 1}, {-0.08, 1}};
  printf("%-7s %-4s %7s | %9s | %-27s | %-22s\n", "beta", "side", "H", "max@Rt200",
         "envelope: th dN/dxi  onset", "correlation: th dN/dxi  onset");
  for (size_t c = 0; c < sizeof cases / sizeof cases[0]; c++) {
    ascr_fs_profile fp;
    ascr_errbuf err;
    if (ascr_stability_set_falkner_skan(w, cases[c].beta, cases[c].rev, &fp, &err) != ASCR_OK) {
      printf("%s\n", err.msg);
      continue;
    }
    double gmax = 0.0;
    ascr_stability_spatial_max(w, 200.0, &gmax, NULL, NULL);
    /* Re_theta range: from below the correlation's onset to where N passes 9 comfortably */
    double r0 = corr_onset(fp.h);
    double lo = fmax(5.0, 0.5 * r0), hi = fp.h > 3.6 ? 600.0 : fmax(3000.0, 12.0 * r0);
    double re[NRE], nenv[NRE];
    for (int k = 0; k < NRE; k++) re[k] = lo * pow(hi / lo, (double)k / (NRE - 1));
    if (ascr_stability_fs_envelope(w, re, NRE, nenv, &err) != ASCR_OK) {
      printf("%s\n", err.msg);
      continue;
    }
    double slope, onset;
    int n = (int)ascr_stability_envelope_line(re, nenv, NRE, 1.0, 9.0, &slope, &onset);
    printf("%-7.3f %-4s %7.3f | %9.4f | %10.4f (n %2d) %8.0f | %13.4f %8.0f\n", cases[c].beta,
           cases[c].rev ? "rev" : "att", fp.h, gmax, slope * fp.theta_eta * fp.theta_eta, n,
           onset, bl_amplification_rate(fp.h, 1.0, 1e7), r0);
    fflush(stdout);
  }
  ascr_stability_free(w);
  return 0;
}
