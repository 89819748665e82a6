/* src/visc/stations.c
 * Stations of the coupled boundary layer: their arrangement around the stagnation point
 * (restage: node order, source-panel ends, the mass-defect influence D = E G and the inviscid
 * edge velocities), the stagnation point from the surface vorticity and its position inside its
 * panel (moving continuously with the first stations' edge velocities), the edge velocities
 * ue = ue_inv + D m, the state of a station as the residuals see it, the residual kind of each
 * station, the per-side context, and the relocation of the stagnation point during the
 * iteration (states carried by node).
 */
#include "visc/visc_impl.h"
#include "core/core_impl.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

/* Current surface gamma at node i from the inviscid part and the sources of the current m. */
/* Surface gamma at the n nodes: g[i] = gam_inv[i] + sum over panels p of E[i][p] sig[p], with
 * sig[p] = ga[p] m[pa[p]] + gb[p] m[pb[p]] the panel's source strength (taken once, in sig), each
 * node's terms added in panel order, eight nodes at a time (as visc_d_times). */
static void node_gammas(ascr_visc_solver *v, double *g)
{
  const size_t n = v->n, np = v->np;
  double *sig = v->sig;
  for (size_t pp = 0; pp < np; pp++) {
    sig[pp] = v->ga[pp] * v->mm[v->pa[pp]] + v->gb[pp] * v->mm[v->pb[pp]];
  }
  size_t i = 0;
  for (; i + 8 <= n; i += 8) {
    const double *e = v->E + i * np;
    double u[8];
    for (int q = 0; q < 8; q++) u[q] = v->gam_inv[i + (size_t)q];
    for (size_t pp = 0; pp < np; pp++) {
      double sp = sig[pp];
      for (int q = 0; q < 8; q++) u[q] += e[(size_t)q * np + pp] * sp;
    }
    for (int q = 0; q < 8; q++) g[i + (size_t)q] = u[q];
  }
  for (; i < n; i++) {
    const double *row = v->E + i * np;
    double u = v->gam_inv[i];
    for (size_t pp = 0; pp < np; pp++) u += row[pp] * sig[pp];
    g[i] = u;
  }
}

/* The wall's curvature at each node, for the turbulent layer's dissipation length
 * (bl_curvature_lambda; Bradshaw 1969, 1973). The circle through a node and its two neighbours,
 * kappa = 2 (a x b) / (|a| |b| |a + b|) with a, b the panels either side (positive where the
 * counter-clockwise contour turns left: convex), then a Gaussian mean in arc length of width
 * CURV_SMOOTH: a section's coordinates carry noise of a few in 1e4 that the three-point circle
 * turns into curvature jumps (Clark Y's UIUC file: 0.49, 0.56, 1.15 per chord at x/c 0.34,
 * 0.28, 0.24), and a layer answers to the curvature over its own thickness, not a panel's
 * length. The width is a numerical smoothing, not a physical constant: 0.005 and 0.02 give
 * every UIUC run's mean cd and cl errors within 0.1 point and 0.001 of 0.01's, but at one
 * angle of SD7003 at Re 6.1e4 where the sweep takes the other of two states (2026-12-06,
 * docs/theory/viscous.md, "Streamline curvature"). Only with ascr_visc_params.wall_curvature. */
#define CURV_SMOOTH 0.01

void visc_wall_curvature(ascr_visc_solver *v)
{
  const ascr_panel_solver *ps = v->ps;
  const size_t n = v->n;
  double *raw = v->work; /* scratch, (n + 1) x wcols >= n */
  for (size_t i = 0; i < n; i++) v->kappa_node[i] = 0.0;
  if (!v->p.wall_curvature) return;
  raw[0] = raw[n - 1] = 0.0;
  for (size_t i = 1; i + 1 < n; i++) {
    double ax = ps->x[i] - ps->x[i - 1], ay = ps->y[i] - ps->y[i - 1];
    double bx = ps->x[i + 1] - ps->x[i], by = ps->y[i + 1] - ps->y[i];
    double den = hypot(ax, ay) * hypot(bx, by) * hypot(ax + bx, ay + by);
    raw[i] = den > 0.0 ? 2.0 * (ax * by - ay * bx) / den : 0.0;
  }
  for (size_t i = 0; i < n; i++) {
    double sw = 0.0, sk = 0.0;
    for (size_t j = 1; j + 1 < n; j++) {
      double d = (v->snode[j] - v->snode[i]) / CURV_SMOOTH;
      if (fabs(d) > 4.0) continue;
      double w = exp(-0.5 * d * d) * 0.5 * (v->snode[j + 1] - v->snode[j - 1]);
      sw += w;
      sk += w * raw[j];
    }
    v->kappa_node[i] = sw > 0.0 ? sk / sw : 0.0;
  }
}

/* Station layout for stagnation between nodes is and is+1; builds G, D and ue_inv. */
void visc_restage(ascr_visc_solver *v, size_t is, double s_stag)
{
  const size_t n = v->n, nw = v->nw, np = v->np, ns = n - 1, nst = v->nst;
  v->is = is;
  v->s_stag = s_stag;
  v->nu = is + 1;
  v->nl = n - 1 - is;
  v->dsp = v->snode[is + 1] - v->snode[is];
  size_t k = 0;
  for (size_t i = is + 1; i-- > 0;) {
    v->node[k] = i; v->side[k] = 0; v->sgn[k] = 1.0;
    v->xi[k] = s_stag - v->snode[i];
    v->dfirst[k] = v->snode[is] - v->snode[i];
    v->kappa_st[k] = v->kappa_node[i];
    k++;
  }
  for (size_t i = is + 1; i < n; i++) {
    v->node[k] = i; v->side[k] = 1; v->sgn[k] = -1.0;
    v->xi[k] = v->snode[i] - s_stag;
    v->dfirst[k] = v->snode[i] - v->snode[is + 1];
    v->kappa_st[k] = v->kappa_node[i];
    k++;
  }
  for (size_t j = 0; j < nw; j++) {
    v->node[k] = j; v->side[k] = 2; v->sgn[k] = 1.0;
    v->xi[k] = v->sw[j];
    v->dfirst[k] = 0.0;
    v->kappa_st[k] = 0.0;
    k++;
  }
  /* station of node i */
#define ST_OF(i) ((i) <= is ? is - (i) : v->nu + ((i) - is - 1))
  for (size_t pp = 0; pp < ns; pp++) {
    double L = v->plen[pp];
    size_t a = ST_OF(pp), b = ST_OF(pp + 1);
    v->pa[pp] = a;
    v->pb[pp] = b;
    if (pp + 1 <= is) { /* upper: flow from node pp+1 to node pp */
      v->ga[pp] = 1.0 / L;
      v->gb[pp] = -1.0 / L;
    } else if (pp >= is + 1) { /* lower: flow from pp to pp+1 */
      v->ga[pp] = -1.0 / L;
      v->gb[pp] = 1.0 / L;
    } else { /* the panel holding the stagnation point: both layers start in it */
      v->ga[pp] = 1.0 / L;
      v->gb[pp] = 1.0 / L;
    }
  }
#undef ST_OF
  size_t w0 = v->nu + v->nl;
  for (size_t j = 0; j + 1 < nw; j++) {
    double L = v->plen[ns + j];
    v->pa[ns + j] = w0 + j;
    v->pb[ns + j] = w0 + j + 1;
    v->ga[ns + j] = -1.0 / L;
    v->gb[ns + j] = 1.0 / L;
  }
  memset(v->D, 0, nst * nst * sizeof *v->D);
  for (size_t r = 0; r < nst; r++) {
    size_t row_node = v->side[r] == 2 ? n + v->node[r] : v->node[r];
    const double *er = v->E + row_node * np;
    double *dr = v->D + r * nst;
    for (size_t pp = 0; pp < np; pp++) {
      dr[v->pa[pp]] += v->sgn[r] * er[pp] * v->ga[pp];
      dr[v->pb[pp]] += v->sgn[r] * er[pp] * v->gb[pp];
    }
    v->ue_inv[r] = v->side[r] == 2 ? v->qw_inv[v->node[r]] : v->sgn[r] * v->gam_inv[v->node[r]];
  }
}

/* Stagnation point from nodal gamma: the last node of the first positive-to-negative change
 * counting from the leading-edge node region. */
int visc_find_stagnation(const ascr_visc_solver *v, const double *gam, size_t *is, double *s_stag)
{
  const size_t n = v->n;
  /* start from the node of smallest |gamma| change near the nose: scan all sign changes and
   * take the one nearest the leading-edge node */
  const ascr_panel_solver *ps = v->ps;
  size_t best = n;
  double bestd = INFINITY;
  for (size_t i = 0; i + 1 < n; i++) {
    if (gam[i] > 0.0 && gam[i + 1] <= 0.0) {
      double d = fmin(ps->x[i], ps->x[i + 1]);
      if (d < bestd) {
        bestd = d;
        best = i;
      }
    }
  }
  if (best >= n || best < 1 || best + 2 >= n) return -1;
  *is = best;
  double f = gam[best] / (gam[best] - gam[best + 1]);
  *s_stag = v->snode[best] + f * (v->snode[best + 1] - v->snode[best]);
  return 0;
}

/* y[r] = y0[r] (0 where y0 is NULL) + sum over k of D[r][k] x[stride k], each row's terms added
 * in the order of k, so that the numbers do not depend on how rows are grouped: eight rows at a
 * time, whose independent sums the processor overlaps (a row at a time waits for each
 * addition; a BLAS product would change the order of the sums, and with it which state some
 * thin-plate starts reach: docs/theory/viscous.md). */
void visc_d_times(const ascr_visc_solver *v, const double *y0, const double *x, size_t stride,
                  double *y)
{
  const size_t nst = v->nst;
  size_t r = 0;
  for (; r + 8 <= nst; r += 8) {
    const double *d = v->D + r * nst;
    double u[8];
    for (int q = 0; q < 8; q++) u[q] = y0 ? y0[r + (size_t)q] : 0.0;
    for (size_t k = 0; k < nst; k++) {
      double xk = x[stride * k];
      for (int q = 0; q < 8; q++) u[q] += d[(size_t)q * nst + k] * xk;
    }
    for (int q = 0; q < 8; q++) y[r + (size_t)q] = u[q];
  }
  for (; r < nst; r++) {
    const double *dr = v->D + r * nst;
    double u = y0 ? y0[r] : 0.0;
    for (size_t k = 0; k < nst; k++) u += dr[k] * x[stride * k];
    y[r] = u;
  }
}

void visc_update_ue(ascr_visc_solver *v)
{
  visc_d_times(v, v->ue_inv, v->mm, 1, v->ue);
}

/* Stagnation point between the first stations of the two sides, where the edge velocity,
 * linear along the stagnation panel, vanishes: offsets of the two sides' first stations. */
static void stag_offsets(const ascr_visc_solver *v, double ueu, double uel, double *xu, double *xl)
{
  ueu = fmax(ueu, 1e-7);
  uel = fmax(uel, 1e-7);
  *xu = v->dsp * ueu / (ueu + uel);
  *xl = v->dsp * uel / (ueu + uel);
}

/* Surface xi from the current first-station edge velocities. */
void visc_set_xi(ascr_visc_solver *v)
{
  double xu, xl;
  stag_offsets(v, v->ue[0], v->ue[v->nu], &xu, &xl);
  for (size_t k = 0; k < v->nu; k++) v->xi[k] = xu + v->dfirst[k];
  for (size_t k = v->nu; k < v->nu + v->nl; k++) v->xi[k] = xl + v->dfirst[k];
  v->s_stag = v->snode[v->is] + xu;
}

vstate visc_get_state(const ascr_visc_solver *v, size_t k)
{
  vstate s;
  s.th = v->th[k];
  s.m = v->mm[k];
  s.c = v->cc[k];
  s.ue = v->ue[k];
  s.xi = v->xi[k];
  s.kappa = v->kappa_st[k];
  s.turb = v->turb[k];
  s.first = (k == 0 || k == v->nu);
  return s;
}

/* Residual kind of station k and its partner stations. */
int visc_station_kind(const ascr_visc_solver *v, size_t k, size_t *a, size_t *b, size_t *w)
{
  size_t w0 = v->nu + v->nl;
  *w = k;
  *b = k;
  if (k == 0 || k == v->nu) {
    *a = k;
    return VR_STAG;
  }
  if (k == w0) {
    *a = v->nu - 1;
    *b = w0 - 1;
    return VR_MERGE;
  }
  *a = k - 1;
  if (k > w0) return VR_WAKE;
  if (!v->turb[k]) return VR_LAM;
  return v->turb[k - 1] ? VR_TURB : VR_TRANS;
}


/* Distance along the surface between the second stations of the two sides. */
double visc_stag_span(const ascr_visc_solver *v)
{
  return v->snode[v->node[v->nu + 1]] - v->snode[v->node[1]];
}

vctx visc_context(const ascr_visc_solver *v, int side)
{
  vctx c;
  c.re = v->p.re;
  c.mach = v->p.mach;
  c.ncrit = v->p.ncrit;
  c.turb_fit = v->turb_fit;
  c.xi_trip = -1.0;
  /* the stagnation-flow gradient from the second stations of the two sides: their edge
   * velocities are well away from zero, while the first stations' can be dominated by the
   * displacement effect when the stagnation point sits near a node */
  c.stag_a = (fmax(v->ue[1], 0.0) + fmax(v->ue[v->nu + 1], 0.0)) / visc_stag_span(v);
  if (!(c.stag_a > 1e-6)) c.stag_a = 1e-6;
  c.xi_min = 0.25 * v->dsp;
  c.exact_tr = v->exact_phase;
  c.hiem_h = v->hiem_h;
  c.hiem_f = v->hiem_f;
  double xt = side == 0 ? v->p.trip_upper : v->p.trip_lower;
  if (side < 2 && xt >= 0.0 && xt <= 1.0) {
    /* xi of the trip: first node on this side at or behind x = xt */
    const ascr_panel_solver *ps = v->ps;
    size_t k0 = side == 0 ? 0 : v->nu, k1 = side == 0 ? v->nu : v->nu + v->nl;
    for (size_t k = k0 + 1; k < k1; k++) {
      double xa = ps->x[v->node[k - 1]], xb = ps->x[v->node[k]];
      if (xa <= xt && xb >= xt && xb > xa) {
        c.xi_trip = v->xi[k - 1] + (xt - xa) / (xb - xa) * (v->xi[k] - v->xi[k - 1]);
        break;
      }
    }
  }
  return c;
}


/* Move the stagnation point if the current surface gamma says so; states are carried by node. */
int visc_relocate_stagnation(ascr_visc_solver *v)
{
  const size_t n = v->n;
  double *g = v->cp; /* scratch */
  node_gammas(v, g);
  size_t is;
  double ss;
  if (visc_find_stagnation(v, g, &is, &ss) != 0) return -1;
  /* at most one node per iteration: a far jump comes from a poor intermediate state */
  if (is > v->is + 1) is = v->is + 1;
  if (is + 1 < v->is) is = v->is - 1;
  if (is != v->is) {
    double f = g[is] / (g[is] - g[is + 1]);
    if (!(f >= 0.0 && f <= 1.0)) f = g[is] > 0.0 ? 1.0 : 0.0;
    ss = v->snode[is] + f * (v->snode[is + 1] - v->snode[is]);
  }
  if (is == v->is) {
    visc_set_xi(v);
    return 0;
  }
  /* carry the state by node: save, restage, restore */
  size_t nst = v->nst;
  double *th = v->J, *mm = v->J + nst, *cc = v->J + 2 * nst; /* J is rebuilt anyway */
  int *tb = v->iscratch;
  double *nth = v->J + 3 * nst, *nmm = v->J + 4 * nst, *ncc = v->J + 5 * nst;
  int *ntb = v->iscratch + nst;
  for (size_t k = 0; k < nst; k++) {
    th[k] = v->th[k]; mm[k] = v->mm[k]; cc[k] = v->cc[k]; tb[k] = v->turb[k];
  }
  size_t old_is = v->is, old_nu = v->nu;
  /* node -> old station */
  for (size_t i = 0; i < n; i++) {
    size_t ko = i <= old_is ? old_is - i : old_nu + (i - old_is - 1);
    nth[i] = th[ko]; nmm[i] = mm[ko]; ncc[i] = cc[ko]; ntb[i] = tb[ko];
  }
  double *wth = v->J + 6 * nst; /* wake part unchanged */
  size_t w0o = old_nu + (n - 1 - old_is);
  for (size_t j = 0; j < v->nw; j++) {
    wth[3 * j] = th[w0o + j]; wth[3 * j + 1] = mm[w0o + j]; wth[3 * j + 2] = cc[w0o + j];
  }
  visc_restage(v, is, ss);
  visc_update_ue(v);
  for (size_t k = 0; k < v->nu + v->nl; k++) {
    size_t i = v->node[k];
    v->th[k] = nth[i]; v->mm[k] = nmm[i]; v->cc[k] = ncc[i]; v->turb[k] = ntb[i];
  }
  /* Stations whose node changed sides, and the first station of each side, lie within a few
   * panels of the stagnation point: they restart from its Hiemenz state (constant theta,
   * H = H_hiemenz, N = 0), which is what the layer there is. */
  {
    visc_update_ue(v);
    visc_set_xi(v);
    vctx c0 = visc_context(v, 0);
    double hh = c0.hiem_h, thh = visc_hiemenz_theta(&c0);
    for (size_t k = 0; k < v->nu + v->nl; k++) {
      size_t i = v->node[k];
      int upper = k < v->nu;
      int moved = upper ? (i > old_is) : (i <= old_is);
      if (moved || k == 0 || k == v->nu) {
        double ue = (k == 0 || k == v->nu) ? c0.stag_a * fmax(v->xi[k], c0.xi_min) : fmax(v->ue[k], 1e-6);
        v->th[k] = thh;
        v->mm[k] = hh * thh * ue;
        v->cc[k] = 0.0;
        v->turb[k] = 0;
      }
    }
  }
  size_t w0 = v->nu + v->nl;
  for (size_t j = 0; j < v->nw; j++) {
    v->th[w0 + j] = wth[3 * j]; v->mm[w0 + j] = wth[3 * j + 1]; v->cc[w0 + j] = wth[3 * j + 2];
    v->turb[w0 + j] = 1;
  }
  visc_update_ue(v);
  visc_set_xi(v);
  return 1;
}

