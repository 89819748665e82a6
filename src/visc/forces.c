/* src/visc/forces.c
 * Results of a converged (or last) iterate: surface pressure from the viscous edge velocity,
 * lift and moment by pressure integration, drag from the far-wake momentum thickness (Squire &
 * Young 1937, ARC R&M 1838), skin-friction drag by integration, transition and separation
 * points; the boundary-layer distributions and Cp of the public API.
 */
#include "visc/visc_impl.h"
#include "core/core_impl.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

/* x/c at fraction f of the interval ending at station k (side stations). */
static double station_x(const ascr_visc_solver *v, size_t k, double f)
{
  const ascr_panel_solver *ps = v->ps;
  double xb = ps->x[v->node[k]];
  double xa = ps->x[v->node[k - 1]];
  return xa + f * (xb - xa);
}

double visc_x_transition(const ascr_visc_solver *v, int side)
{
  size_t k0 = side == 0 ? 0 : v->nu, k1 = side == 0 ? v->nu : v->nu + v->nl;
  size_t kt = v->itr[side];
  return kt < k1 && kt > k0 ? station_x(v, kt, v->f_tr[side]) : NAN;
}

void visc_results(ascr_visc_solver *v, const vctx cxs[3], ascr_visc_result *r)
{
  const size_t n = v->n;
  const ascr_panel_solver *ps = v->ps;
  /* surface pressure from the viscous edge velocity */
  for (size_t k = 0; k < v->nu + v->nl; k++) {
    double ue = v->ue[k];
    double cp0 = 1.0 - ue * ue;
    double cp = v->p.mach > 0.0 ? ascr_panel_karman_tsien(cp0, v->p.mach) : cp0;
    v->cp[v->node[k]] = isfinite(cp) ? cp : cp0;
  }
  double cl, cm, cdp_int;
  panel_integrate_cp(ps, v->cp, v->alpha, &cl, &cm, &cdp_int);
  (void)cdp_int;
  r->alpha_rad = v->alpha;
  r->cl = cl;
  r->cm = cm;
  size_t ke = v->nst - 1;
  double he = v->mm[ke] / (v->ue[ke] * v->th[ke]);
  r->cd = 2.0 * v->th[ke] * pow(fmax(v->ue[ke], 1e-6), 0.5 * (he + 5.0));
  /* skin friction drag */
  double cdf = 0.0, ca = cos(v->alpha), sa = sin(v->alpha);
  r->x_transition_upper = r->x_transition_lower = NAN;
  r->x_separation_upper = r->x_separation_lower = NAN;
  r->x_reattach_upper = r->x_reattach_lower = NAN;
  r->forced_upper = 0;
  r->trip_not_applied = 0;
  for (int side = 0; side < 2; side++) {
    size_t k0 = side == 0 ? 0 : v->nu, k1 = side == 0 ? v->nu : v->nu + v->nl;
    double cfprev = 0.0, xprev = 0.0;
    double xsep = NAN, xre = NAN;
    for (size_t k = k0; k < k1; k++) {
      vstate s = visc_get_state(v, k);
      vctx cx = cxs[side];
      if (k == k0) s.ue = cx.stag_a * fmax(s.xi, cx.xi_min);
      double h = s.m / (fmax(s.ue, 1e-6) * s.th), rth = cx.re * fmax(s.ue, 1e-6) * s.th;
      bl_closure c;
      if (s.turb) bl_closure_turbulent(h, rth, cx.mach * s.ue, s.c * s.c, 0, cx.turb_fit, &c);
      else bl_closure_laminar(h, rth, cx.mach * s.ue, &c);
      double x = ps->x[v->node[k]];
      if (k > k0) {
        size_t ia = v->node[k - 1], ib = v->node[k];
        double dx = ps->x[ib] - ps->x[ia], dy = ps->y[ib] - ps->y[ia];
        double ta = cfprev * v->ue[k - 1] * v->ue[k - 1], tb = c.cf * s.ue * s.ue;
        cdf += 0.5 * (ta + tb) * (dx * ca + dy * sa);
        if (cfprev > 0.0 && c.cf <= 0.0 && isnan(xsep)) {
          xsep = xprev + cfprev / (cfprev - c.cf) * (x - xprev);
        } else if (cfprev <= 0.0 && c.cf > 0.0 && !isnan(xsep) && isnan(xre)) {
          xre = xprev + cfprev / (cfprev - c.cf) * (x - xprev);
        }
      }
      cfprev = c.cf;
      xprev = x;
    }
    double xtr = visc_x_transition(v, side);
    {
      double xt = side == 0 ? v->p.trip_upper : v->p.trip_lower;
      if (xt >= 0.0 && xt <= 1.0 && !(cxs[side].xi_trip >= 0.0)) r->trip_not_applied |= 1 << side;
    }
    int forced = 0;
    if (!isnan(xtr) && cxs[side].xi_trip >= 0.0) {
      double xt = side == 0 ? v->p.trip_upper : v->p.trip_lower;
      forced = fabs(xtr - xt) < 1e-9 + 1e-6;
    }
    if (side == 0) {
      r->x_transition_upper = xtr;
      r->forced_upper = forced;
      r->x_separation_upper = xsep;
      r->x_reattach_upper = xre;
    } else {
      r->x_transition_lower = xtr;
      r->x_separation_lower = xsep;
      r->x_reattach_lower = xre;
    }
  }
  r->cdf = cdf;
  r->cdp = r->cd - cdf;
  (void)n;
}


void ascr_visc_solver_distributions(const ascr_visc_solver *v, int *side, double *s, double *x,
                                    double *y, double *ue, double *dstar, double *theta,
                                    double *h, double *cf, double *ampl, int *turbulent)
{
  const ascr_panel_solver *ps = v->ps;
  vctx c0 = visc_context(v, 0);
  for (size_t k = 0; k < v->nst; k++) {
    int sd = v->side[k];
    double u = v->ue[k];
    /* the first station of a surface is seen in the stagnation-flow view of the residuals */
    double ub = (k == 0 || k == v->nu) ? c0.stag_a * fmax(v->xi[k], c0.xi_min) : u;
    double hh = v->mm[k] / (fmax(ub, 1e-6) * v->th[k]);
    if (side) side[k] = sd;
    if (s) s[k] = v->xi[k];
    if (x) x[k] = sd == 2 ? v->xw[v->node[k]] : ps->x[v->node[k]];
    if (y) y[k] = sd == 2 ? v->yw[v->node[k]] : ps->y[v->node[k]];
    if (ue) ue[k] = u;
    if (dstar) dstar[k] = v->mm[k] / fmax(ub, 1e-6);
    if (theta) theta[k] = v->th[k];
    if (h) h[k] = hh;
    if (cf) {
      double rth = v->p.re * fmax(ub, 1e-6) * v->th[k];
      bl_closure c;
      if (sd == 2) c.cf = 0.0;
      else if (v->turb[k]) {
        bl_closure_turbulent(hh, rth, v->p.mach * ub, v->cc[k] * v->cc[k], 0, c0.turb_fit, &c);
      }
      else bl_closure_laminar(hh, rth, v->p.mach * ub, &c);
      cf[k] = c.cf;
    }
    if (ampl) ampl[k] = v->cc[k];
    if (turbulent) turbulent[k] = v->turb[k];
  }
}

void ascr_visc_solver_cp(const ascr_visc_solver *v, double *cp)
{
  for (size_t i = 0; i < v->n; i++) cp[i] = v->cp[i];
}
