/* src/visc/predictor.c
 * Secant predictor of a continuation in alpha: the start of a warm solve is the last converged
 * state extrapolated along the line through it and the converged state it was continued from,
 *     x(alpha) = x1 + f (x1 - x0),   f = (alpha - alpha1) / (alpha1 - alpha0),
 * the secant (first-order) predictor of a predictor-corrector continuation (Allgower & Georg,
 * "Introduction to Numerical Continuation Methods", SIAM 2003, ch. 2 and 6). It decides only
 * where the Newton iteration starts, not what it converges to: the converged state is the one
 * the residual and the transition rule accept at the new condition.
 *
 * The states are compared node by node (the station layout follows the stagnation point):
 * theta, m and sqrt(Ctau) are extrapolated in their logarithms (the Newton unknowns' form),
 * N additively; a node whose regime differs between the two states, a node within two panels
 * of either stagnation point and anything from another Reynolds number keeps the last state.
 * The extrapolation is used for |f| <= PRED_MAX_F (not far beyond the pair) and each factor is
 * held within e^(+-PRED_MAX_LOG) (a path control; the Newton step's own limit is e^1).
 * The transition point of each side is extrapolated likewise, in arc length along the surface,
 * and the interval placed there (visc_transition_place) before the first iteration.
 */
#include "visc/visc_impl.h"

#include <math.h>
#include <string.h>

#define PRED_MAX_F 2.0
#define PRED_MAX_LOG 0.5

/* Node of the surface station k (wake stations: n + wake index). */
static size_t node_of(const ascr_visc_solver *v, size_t k)
{
  return v->side[k] == 2 ? v->n + v->node[k] : v->node[k];
}

void visc_pred_capture(const ascr_visc_solver *v, visc_pred_rec *rec, double alpha)
{
  for (size_t k = 0; k < v->nst; k++) {
    size_t i = node_of(v, k);
    rec->th[i] = v->th[k];
    rec->mm[i] = v->mm[k];
    rec->cc[i] = v->cc[k];
    rec->turb[i] = v->turb[k] + (v->side[k] == 1 ? 2 : 0); /* regime and side */
  }
  rec->is = v->is;
  rec->alpha = alpha;
  rec->re = v->cur_re;
  rec->cl = v->cur_cl;
  rec->valid = 1;
}

void visc_pred_copy(const ascr_visc_solver *v, visc_pred_rec *dst, const visc_pred_rec *src)
{
  size_t m = v->nst;
  memcpy(dst->th, src->th, m * sizeof *dst->th);
  memcpy(dst->mm, src->mm, m * sizeof *dst->mm);
  memcpy(dst->cc, src->cc, m * sizeof *dst->cc);
  memcpy(dst->turb, src->turb, m * sizeof *dst->turb);
  dst->is = src->is;
  dst->alpha = src->alpha;
  dst->re = src->re;
  dst->cl = src->cl;
  dst->valid = src->valid;
}

static double clampd(double x, double lim)
{
  return x > lim ? lim : (x < -lim ? -lim : x);
}

int visc_pred_apply(ascr_visc_solver *v, const visc_pred_rec *prev, double alpha1, double alpha)
{
  if (!prev->valid || prev->re != v->p.re || v->cur_re != v->p.re || !isfinite(alpha1)) return 0;
  double d = alpha1 - prev->alpha;
  if (!(fabs(d) > 1e-12)) return 0;
  double f = (alpha - alpha1) / d;
  if (!(fabs(f) <= PRED_MAX_F)) return 0;
  size_t lo = (v->is < prev->is ? v->is : prev->is), hi = (v->is > prev->is ? v->is : prev->is);
  for (size_t k = 0; k < v->nst; k++) {
    size_t i = node_of(v, k);
    if (v->side[k] < 2 && i + 2 >= lo && i <= hi + 3) continue; /* near a stagnation point */
    int tag = v->turb[k] + (v->side[k] == 1 ? 2 : 0);
    if (prev->turb[i] != tag) continue;
    if (!(prev->th[i] > 0.0 && prev->mm[i] > 0.0)) continue;
    v->th[k] *= exp(clampd(f * log(v->th[k] / prev->th[i]), PRED_MAX_LOG));
    v->mm[k] *= exp(clampd(f * log(v->mm[k] / prev->mm[i]), PRED_MAX_LOG));
    if (v->turb[k]) {
      if (prev->cc[i] > 0.0 && v->cc[k] > 0.0) {
        v->cc[k] *= exp(clampd(f * log(v->cc[k] / prev->cc[i]), PRED_MAX_LOG));
      }
    } else {
      v->cc[k] = fmax(v->cc[k] + f * (v->cc[k] - prev->cc[i]), 0.0);
    }
  }
  return 1;
}

/* Arc length (snode) of the first turbulent node of a side in a record (NaN if laminar to the
 * trailing edge): upper nodes is, is-1, .., 0; lower is+1, .., n-1. */
static double rec_transition_s(const ascr_visc_solver *v, const visc_pred_rec *rec, int side)
{
  if (side == 0) {
    for (size_t i = rec->is + 1; i-- > 0;) {
      if (rec->turb[i] == 1) return v->snode[i];
    }
  } else {
    for (size_t i = rec->is + 1; i < v->n; i++) {
      if (rec->turb[i] == 3) return v->snode[i];
    }
  }
  return NAN;
}

void visc_pred_transition(ascr_visc_solver *v, const visc_pred_rec *prev, double alpha1,
                          double alpha, const visc_pred_rec *cur)
{
  double f = (alpha - alpha1) / (alpha1 - prev->alpha);
  for (int side = 0; side < 2; side++) {
    double s0 = rec_transition_s(v, prev, side), s1 = rec_transition_s(v, cur, side);
    if (!isfinite(s0) || !isfinite(s1) || s0 == s1) continue;
    double sp = s1 + f * (s1 - s0);
    size_t k0 = side == 0 ? 0 : v->nu, k1 = side == 0 ? v->nu : v->nu + v->nl, kbest = k1;
    double dbest = INFINITY;
    for (size_t k = k0 + 1; k < k1; k++) {
      double d = fabs(v->snode[v->node[k]] - sp);
      if (d < dbest) {
        dbest = d;
        kbest = k;
      }
    }
    if (kbest == k1) continue;
    vctx cx = visc_context(v, side);
    v->itr[side] = visc_transition_place(v, &cx, side, kbest, 1);
  }
}
