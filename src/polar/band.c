/* src/polar/band.c
 * The band of a polar over sweeps that differ in one input. Its use (issue 12): the
 * transition uncertainty. N_crit stands for the disturbance environment (Mack 1977 relates it
 * to the free-stream turbulence level), which a designer rarely knows: a printed blade, a
 * rotor's own disturbed inflow and a wind tunnel's turbulence each move transition, and at
 * blade Reynolds numbers of 1e4-1e5 transition sets the drag. The band is the range the
 * result spans over the sweeps given (the caller chooses them, e.g. the two ends of an N_crit
 * range and the nominal value); it is not an error bar of the method, and a dependence that is
 * not monotonic between the sweeps is not sampled.
 */
#include "airscrew/ascr_polar.h"
#include "core/core_impl.h"

#include <math.h>

ascr_status ascr_polar_band_compute(const ascr_polar_point *const *runs, size_t nruns,
                                    size_t npts, ascr_polar_band *out, ascr_errbuf *err)
{
  if (runs == NULL || out == NULL || nruns == 0) {
    return core_fail(err, ASCR_EINVAL, "polar band: no sweeps given");
  }
  for (size_t r = 0; r < nruns; r++) {
    if (runs[r] == NULL) return core_fail(err, ASCR_EINVAL, "polar band: sweep %zu is NULL", r);
    for (size_t i = 0; i < npts; i++) {
      if (fabs(runs[r][i].alpha_deg - runs[0][i].alpha_deg) > 1e-9) {
        return core_fail(err, ASCR_EINVAL, "polar band: sweep %zu has alpha %g at point %zu, "
                         "sweep 0 has %g: not the same grid", r, runs[r][i].alpha_deg, i,
                         runs[0][i].alpha_deg);
      }
    }
  }
  for (size_t i = 0; i < npts; i++) {
    ascr_polar_band b = {INFINITY, -INFINITY, INFINITY, -INFINITY, INFINITY, -INFINITY,
                         INFINITY, -INFINITY, nruns, 0};
    for (size_t r = 0; r < nruns; r++) {
      const ascr_polar_point *q = &runs[r][i];
      if (!q->converged) continue;
      b.n_converged++;
      b.cl_lo = fmin(b.cl_lo, q->cl);
      b.cl_hi = fmax(b.cl_hi, q->cl);
      b.cd_lo = fmin(b.cd_lo, q->cd);
      b.cd_hi = fmax(b.cd_hi, q->cd);
      b.cm_lo = fmin(b.cm_lo, q->cm);
      b.cm_hi = fmax(b.cm_hi, q->cm);
      double ld = q->cd > 0.0 ? q->cl / q->cd : NAN;
      if (isfinite(ld)) {
        b.ld_lo = fmin(b.ld_lo, ld);
        b.ld_hi = fmax(b.ld_hi, ld);
      }
    }
    if (b.n_converged == 0) b.cl_lo = b.cl_hi = b.cd_lo = b.cd_hi = b.cm_lo = b.cm_hi = NAN;
    if (!(b.ld_lo <= b.ld_hi)) b.ld_lo = b.ld_hi = NAN;
    out[i] = b;
  }
  return ASCR_OK;
}
