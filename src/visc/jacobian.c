/* src/visc/jacobian.c
 * Residuals of all stations and the Newton matrix: the derivatives of every station's residual
 * with respect to the unknowns of the stations it involves and to the edge velocities (forward
 * differences, relative step FD_STEP), the latter chained through the mass-defect influence D,
 * stored densely or in the structured form solved by linsolve.c.
 */
#include "visc/visc_impl.h"
#include "core/core_impl.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

#define FD_STEP 1e-7

/* Writers of the Newton matrix: dense (J, column-major) or structured (L blocks, U entries). */
static void add_local(ascr_visc_solver *v, size_t k, size_t e, size_t col_station, int var, double d)
{
  if (v->dense_jac) {
    size_t N = 3 * v->nst;
    v->J[(3 * k + e) + (3 * col_station + (size_t)var) * N] += d;
    return;
  }
  size_t *ls = v->lst + 3 * k;
  int q = 0;
  while (q < 3 && ls[q] != col_station && ls[q] != SIZE_MAX) q++;
  if (q == 3) return; /* cannot happen: at most three stations per residual */
  ls[q] = col_station;
  v->lblk[(3 * k + (size_t)q) * 9 + e * 3 + (size_t)var] += d;
}

/* row 3k+e gets d * (D row drow) in the m columns */
static void add_ue(ascr_visc_solver *v, size_t k, size_t e, size_t drow, double d)
{
  size_t nst = v->nst, row = 3 * k + e;
  if (v->dense_jac) {
    size_t N = 3 * nst;
    const double *dr = v->D + drow * nst;
    double *jr = v->J + row;
    for (size_t kk = 0; kk < nst; kk++) jr[(3 * kk + 1) * N] += d * dr[kk];
    return;
  }
  size_t *ui = v->uidx + row * UMAX;
  double *uc = v->ucoef + row * UMAX;
  int c = v->ucnt[row];
  for (int q = 0; q < c; q++) {
    if (ui[q] == drow) {
      uc[q] += d;
      return;
    }
  }
  if (c < UMAX) {
    ui[c] = drow;
    uc[c] = d;
    v->ucnt[row] = c + 1;
  }
}

/* Build R and J. Returns the largest |R|. */
double visc_assemble(ascr_visc_solver *v, const vctx cxs[3])
{
  const size_t nst = v->nst, N = 3 * nst;
  if (v->dense_jac) {
    memset(v->J, 0, N * N * sizeof *v->J);
  } else {
    for (size_t i = 0; i < 3 * nst; i++) v->lst[i] = SIZE_MAX;
    memset(v->lblk, 0, 27 * nst * sizeof *v->lblk);
    memset(v->ucnt, 0, 3 * nst * sizeof *v->ucnt);
  }
  double rmax = 0.0;
  /* the evaluations of the previous interval's downstream end (residual.c) */
  visc_end_evals ends;
  ends.k = SIZE_MAX;
  for (size_t k = 0; k < nst; k++) {
    const vctx *cx = &cxs[v->side[k]];
    size_t a, b, w;
    int kind = visc_station_kind(v, k, &a, &b, &w);
    size_t st[3] = {a, b, w};
    int nsts = kind == VR_MERGE ? 3 : (kind == VR_STAG ? 1 : 2);
    if (kind == VR_STAG) st[0] = k;
    vstate s[3];
    for (int q = 0; q < nsts; q++) s[q] = visc_get_state(v, st[q]);
    double R0[3], ftr[3] = {1.0, INFINITY, 0.0};
    /* forward-difference steps of theta, m, the third unknown and ue of each station */
    double hs[3][4];
    for (int q = 0; q < nsts; q++) {
      for (int var = 0; var < 4; var++) {
        double x = var == 0 ? s[q].th : var == 1 ? s[q].m : var == 2 ? s[q].c : s[q].ue;
        hs[q][var] = var < 2 ? FD_STEP * fabs(x) + 1e-14 : FD_STEP * (fabs(x) > 1e-3 ? fabs(x) : 1e-3);
      }
    }
    int plain = kind == VR_LAM || kind == VR_TURB || kind == VR_WAKE;
    /* the stagnation offset's step (surface stations) */
    int offset = v->side[k] < 2 && kind != VR_MERGE;
    double hx = 1e-7 * fmax(v->xi[v->side[k] == 0 ? 0 : v->nu], 1e-9);
    double Rp[2][4][3], Rx[3];
    if (plain) {
      visc_residual_plain_fd(kind, cx, &s[0], &s[1], (const double(*)[4])hs, hx, R0, Rp,
                             offset ? Rx : NULL, a, b, &ends);
    } else {
      ends.k = SIZE_MAX;
      if (kind == VR_MERGE) visc_residual(kind, cx, &s[0], &s[1], &s[2], R0, ftr);
      else if (kind == VR_STAG) visc_residual(kind, cx, NULL, &s[0], NULL, R0, NULL);
      else visc_residual(kind, cx, &s[0], &s[1], NULL, R0, ftr);
    }
    if (kind == VR_TRANS) v->f_tr[v->side[k]] = ftr[0];
    for (int e = 0; e < 3; e++) {
      v->R[3 * k + e] = R0[e];
      rmax = fmax(rmax, fabs(R0[e]));
    }
    /* derivative with respect to the stagnation offset of this side (surface stations): the
     * offsets depend on the two first-station edge velocities, which depend on all m */
    if (offset) {
      double h = hx, R1s[3];
      const double *R1 = R1s;
      if (plain) {
        R1 = Rx;
      } else {
        vstate sp[3];
        for (int qq = 0; qq < nsts; qq++) sp[qq] = s[qq];
        for (int qq = 0; qq < nsts; qq++) sp[qq].xi += h;
        if (kind == VR_STAG) visc_residual(kind, cx, NULL, &sp[0], NULL, R1s, NULL);
        else visc_residual(kind, cx, &sp[0], &sp[1], NULL, R1s, NULL);
      }
      double ueu = fmax(v->ue[0], 1e-7), uel = fmax(v->ue[v->nu], 1e-7), sum = ueu + uel;
      /* d xoff / d ue_u0 and d ue_l0 for this side */
      double du, dl;
      if (v->side[k] == 0) {
        du = v->dsp * uel / (sum * sum);
        dl = -v->dsp * ueu / (sum * sum);
      } else {
        du = -v->dsp * uel / (sum * sum);
        dl = v->dsp * ueu / (sum * sum);
      }
      for (int e = 0; e < 3; e++) {
        double d = (R1[e] - R0[e]) / h;
        if (d == 0.0) continue;
        add_ue(v, k, (size_t)e, 0, d * du);
        add_ue(v, k, (size_t)e, v->nu, d * dl);
      }
    }
    /* derivative with respect to the stagnation-flow gradient a = (ue_u1 + ue_l1)/span: it
     * enters through the first station of a surface only (its view, residual.c), elsewhere
     * the difference is zero */
    if (v->side[k] < 2 && kind != VR_MERGE &&
        (kind == VR_STAG || s[0].first || s[1].first)) {
      vctx cp2 = *cx;
      double h = 1e-7 * cx->stag_a;
      cp2.stag_a += h;
      double R1[3];
      if (kind == VR_STAG) visc_residual(kind, &cp2, NULL, &s[0], NULL, R1, NULL);
      else visc_residual(kind, &cp2, &s[0], &s[1], NULL, R1, NULL);
      for (int e = 0; e < 3; e++) {
        double d = (R1[e] - R0[e]) / h / visc_stag_span(v);
        if (d == 0.0) continue;
        add_ue(v, k, (size_t)e, 1, d);
        add_ue(v, k, (size_t)e, v->nu + 1, d);
      }
    }
    /* derivatives with respect to theta, m, c, ue of each involved station */
    for (int q = 0; q < nsts; q++) {
      for (int var = 0; var < 4; var++) {
        double h = hs[q][var], R1s[3];
        const double *R1 = R1s;
        if (plain) {
          R1 = Rp[q][var];
        } else {
          vstate sp[3];
          for (int qq = 0; qq < nsts; qq++) sp[qq] = s[qq];
          double *x = var == 0 ? &sp[q].th : var == 1 ? &sp[q].m : var == 2 ? &sp[q].c : &sp[q].ue;
          *x += h;
          if (kind == VR_MERGE) visc_residual(kind, cx, &sp[0], &sp[1], &sp[2], R1s, NULL);
          else if (kind == VR_STAG) visc_residual(kind, cx, NULL, &sp[0], NULL, R1s, NULL);
          else visc_residual(kind, cx, &sp[0], &sp[1], NULL, R1s, NULL);
        }
        for (int e = 0; e < 3; e++) {
          double d = (R1[e] - R0[e]) / h;
          if (d == 0.0) continue;
          if (var < 3) {
            add_local(v, k, (size_t)e, st[q], var, d);
          } else {
            add_ue(v, k, (size_t)e, st[q], d);
          }
        }
      }
    }
  }
  return rmax;
}

