/* src/visc/transition_rules.c
 * Which station interval holds transition during the coupled iteration: the exact rule
 * (docs/theory/viscous.md), which alone decides whether a state is converged, and the
 * look-ahead placement that the coupled-march start uses until its iteration has settled (a
 * path to a state the exact rule then judges). The crossing point inside an interval is part
 * of the residual (residual.c).
 */
#include "visc/visc_impl.h"
#include "core/core_impl.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

/* Downstream move of the transition interval that starts at kt (first turbulent station) on a
 * side ending before k1: a laminar march (bl_march_laminar_from) from the last laminar station
 * on the present edge velocity over the next stations (at most 12) says where N reaches
 * N_crit - hyst (or where the laminar layer separates: transition is then taken there, as in a
 * separation bubble); the stations passed become laminar with the marched state. Returns the
 * new first turbulent station. */
static size_t move_downstream(ascr_visc_solver *v, const vctx *cx, size_t k1, size_t kt,
                              double hyst)
{
  enum { LOOK = 13 };
  double ss[LOOK], uu[LOOK], tt[LOOK], hh[LOOK], nn[LOOK];
  size_t cnt = 0;
  for (size_t j = kt - 1; j < k1 && cnt < LOOK; j++, cnt++) {
    ss[cnt] = v->xi[j];
    uu[cnt] = fmax(v->ue[j], 1e-4);
  }
  vstate a = visc_get_state(v, kt - 1);
  double ha = a.m / (fmax(a.ue, 1e-6) * a.th);
  int why = 0;
  for (size_t q = 0; q < LOOK; q++) tt[q] = hh[q] = nn[q] = NAN;
  size_t stop = bl_march_laminar_from(a.th, ha, a.c, ss, uu, cnt, cx->re, cx->mach,
                                      cx->ncrit - hyst, tt, hh, nn, &why);
  /* stop: index (in the look-ahead) of the station where the march stopped; stations
   * 1..stop-1 become laminar */
  size_t knew = kt + (stop > 0 ? stop - 1 : 0);
  if (why == 0) knew = kt + cnt - 1;
  if (cx->xi_trip >= 0.0) {
    for (size_t j = kt; j < knew; j++) {
      if (v->xi[j] >= cx->xi_trip) {
        knew = j;
        break;
      }
    }
  }
  for (size_t j = kt; j < knew; j++) {
    size_t q = j - (kt - 1);
    v->turb[j] = 0;
    v->th[j] = tt[q];
    v->cc[j] = nn[q];
    v->mm[j] = hh[q] * tt[q] * fmax(v->ue[j], 1e-6);
  }
  return knew > kt ? knew : kt;
}

/* First turbulent station of the side's stations k0+1 .. k1-1 (k1 if none). */
size_t visc_first_turbulent(const ascr_visc_solver *v, size_t k0, size_t k1)
{
  for (size_t k = k0 + 1; k < k1; k++) {
    if (v->turb[k]) return k;
  }
  return k1;
}

/* Look-ahead placement (the coupled-march start's first phase, driver.c): per side, upstream
 * to the first laminar station with N >= N_crit + hyst (or the trip), else downstream by a
 * look-ahead march (move_downstream). Within hyst the interval keeps its place, which stops it
 * hopping between neighbours while the iteration is far from a solution. Returns 1 if an
 * interval moved. A path only: the exact rule judges the state the iteration settles in. */
int visc_update_transition(ascr_visc_solver *v, const vctx cxs[3], double hyst)
{
  int changed = 0;
  for (int side = 0; side < 2; side++) {
    size_t k0 = side == 0 ? 0 : v->nu, k1 = side == 0 ? v->nu : v->nu + v->nl;
    const vctx *cx = &cxs[side];
    size_t kt = visc_first_turbulent(v, k0, k1);
    /* upstream move: a laminar station already past N_crit, or past the trip */
    for (size_t k = k0 + 1; k < kt; k++) {
      int trip = cx->xi_trip >= 0.0 && v->xi[k] >= cx->xi_trip && v->xi[k - 1] < cx->xi_trip;
      if (v->cc[k] >= cx->ncrit + hyst || trip) {
        for (size_t j = k; j < k1; j++) {
          if (!v->turb[j]) {
            v->turb[j] = 1;
            v->cc[j] = 0.07;
          }
        }
        changed = 1;
        kt = k;
        break;
      }
    }
    /* downstream move: a laminar march from the last laminar station on the current edge
     * velocity over the next stations (at most 12) says where N reaches N_crit (or where the
     * laminar layer separates: transition is then taken there, as in a separation bubble);
     * the stations passed become laminar with the marched state */
    if (!changed && kt < k1 && kt > k0) {
      size_t knew = move_downstream(v, cx, k1, kt, hyst);
      if (knew > kt) {
        changed = 1;
        kt = knew;
      }
    }
    v->itr[side] = kt;
  }
  return changed;
}

/* Transition interval of each side from the current state (Drela & Giles 1987: the interval
 * in which the amplification reaches N_crit, or the trip). Called at the start of every Newton
 * iteration; the rule has no memory, no band and no budget, so a converged state is one in
 * which every laminar station has N < N_crit, lies upstream of the trip, and the transition
 * interval's crossing point (residual.c) lies inside it:
 *  - upstream: where a laminar station has N >= N_crit, the interval moves towards the first
 *    such station, at most TR_MOVE_STATIONS stations at once (a trip: there at once); the
 *    stations passed become turbulent, sqrt(Ctau) from the transition relation
 *    (bl_ctau_initial) at their state;
 *  - downstream: where N at the interval's end, by the laminar amplification equation, stays
 *    below N_crit and no trip lies in the interval, its end station becomes laminar with that N
 *    (theta and m kept). One station per iteration: the Newton step that follows settles the
 *    layer before the next interval is judged.
 * Returns 1 if an interval moved. */
/* Path controls of the exact rule (they decide how fast the iteration gets there, not where it
 * ends): a move passes at most TR_MOVE_STATIONS stations at once, and the intervals are judged
 * once the largest relative update is below TR_EXACT_SETTLED. Measured on the thin plate at Re
 * 2e5, 2 deg: 1 station / 0.05 crept for 100 iterations without arriving; 2 / 0.15, 4 / 0.15
 * and 3 / 0.3 converged to the same state in 113, 97 and 85 iterations (downstream moves).
 * Upstream moves went to the first station past N_crit at once until 2026-12-04: on a state
 * not yet settled that overshot (NACA 2412, Re 1e5, -1 deg: 0.913 -> 0.832 c, converged at
 * 0.901 after 190 iterations); limited alike, bench_visc's mean iterations 27.2 -> 21.0 (Re
 * 1e5) and 8.8 -> 8.2 (1e6), docs/theory/viscous.md. */
#define TR_MOVE_STATIONS 3 /* TR_EXACT_SETTLED is the driver's (driver.c) */
int visc_transition_exact(ascr_visc_solver *v, const vctx cxs[3])
{
  int changed = 0;
  for (int side = 0; side < 2; side++) {
    size_t k0 = side == 0 ? 0 : v->nu, k1 = side == 0 ? v->nu : v->nu + v->nl;
    const vctx *cx = &cxs[side];
    size_t kt = visc_first_turbulent(v, k0, k1);
    /* everything behind the first turbulent station is turbulent */
    for (size_t k = kt; k < k1; k++) v->turb[k] = 1;
    int moved = 0;
    for (size_t k = k0 + 1; k < kt; k++) {
      int trip = cx->xi_trip >= 0.0 && v->xi[k] >= cx->xi_trip;
      if (v->cc[k] >= cx->ncrit || trip) {
        size_t kn = trip || k + TR_MOVE_STATIONS >= kt ? k : kt - TR_MOVE_STATIONS;
        kt = visc_transition_place(v, cx, side, kn, 0);
        moved = 1;
        break;
      }
    }
    if (!moved && kt < k1 && kt > k0 + 1) {
      size_t knew = visc_transition_place(v, cx, side, kt + TR_MOVE_STATIONS, 0);
      moved = knew != kt;
      kt = knew;
    }
    changed |= moved;
    v->itr[side] = kt;
  }
  return changed;
}

/* Put the first turbulent station of a side at kt_new (clamped to the side): upstream, the
 * stations passed turn turbulent with sqrt(Ctau) from the transition relation at their state
 * (bl_ctau_initial); downstream, only where the interval's laminar end, at its own rate of
 * amplification, stays below N_crit at the interval's end: N grows on at that rate over the
 * stations passed, which turn laminar (theta and m kept), until N_crit or the trip is reached.
 * With to_place (the predictor's placement), downstream moves go to kt_new whatever the
 * rate says, N rising linearly in xi to N_crit there. A first guess, which the following
 * iterations settle and the exact rule may move back. Returns the side's first turbulent
 * station. */
size_t visc_transition_place(ascr_visc_solver *v, const vctx *cx, int side, size_t kt_new,
                             int to_place)
{
  size_t k0 = side == 0 ? 0 : v->nu, k1 = side == 0 ? v->nu : v->nu + v->nl;
  size_t kt = visc_first_turbulent(v, k0, k1);
  if (kt_new <= k0) kt_new = k0 + 1;
  if (kt_new > k1) kt_new = k1;
  if (kt_new < kt) {
    for (size_t j = kt_new; j < kt; j++) {
      vstate s = visc_get_state(v, j);
      v->turb[j] = 1;
      v->cc[j] = visc_sqrt_ctau_start(cx, &s);
    }
    return kt_new;
  }
  if (kt_new == kt || kt >= k1 || kt <= k0 + 1) return kt;
  if (to_place) {
    /* N rising linearly in xi from the last laminar station to N_crit at kt_new */
    double na = v->cc[kt - 1], xa = v->xi[kt - 1], xb = v->xi[kt_new < k1 ? kt_new : k1 - 1];
    size_t j = kt;
    for (; j < kt_new && j < k1; j++) {
      if (cx->xi_trip >= 0.0 && v->xi[j] >= cx->xi_trip) break;
      v->turb[j] = 0;
      v->cc[j] = fmax(na + (cx->ncrit - na) * (v->xi[j] - xa) / fmax(xb - xa, 1e-300), 0.0);
      if (!(v->cc[j] < cx->ncrit)) v->cc[j] = 0.999 * cx->ncrit;
    }
    return j;
  }
  vstate sa = visc_get_state(v, kt - 1), sb = visc_get_state(v, kt);
  double R[3], f[3] = {1.0, INFINITY, 0.0};
  visc_residual(VR_TRANS, cx, &sa, &sb, NULL, R, f);
  if (!(isfinite(f[1]) && f[1] < cx->ncrit)) return kt;
  double na = sa.c, rate = (f[1] - na) / fmax(log(sb.xi / sa.xi) * 0.5 * (sa.xi + sb.xi), 1e-300);
  size_t j = kt;
  while (j < kt_new) {
    double nj = na + rate * 0.5 * (sa.xi + v->xi[j]) * log(v->xi[j] / sa.xi);
    if (!(nj < cx->ncrit) || (cx->xi_trip >= 0.0 && v->xi[j] >= cx->xi_trip)) break;
    v->turb[j] = 0;
    v->cc[j] = fmax(nj, 0.0);
    j++;
  }
  return j;
}

