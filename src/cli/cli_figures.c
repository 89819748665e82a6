/* src/cli/cli_figures.c
 * The standard figures of the CLI (see cli_figures.h), through cli_plot.
 */
#define _POSIX_C_SOURCE 200809L
#include "cli_figures.h"
#include "cli.h"
#include "cli_plot.h"

#include <errno.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

int fig_prepare_dir(const char *dir, const char *const *names, int force)
{
  struct stat sb;
  if (stat(dir, &sb) != 0) {
    if (mkdir(dir, 0755) != 0) {
      cli_error("cannot create the plot folder %s: %s", dir, strerror(errno));
      return CLI_EXIT_OUTPUT;
    }
  } else if (!S_ISDIR(sb.st_mode)) {
    cli_error("%s: exists and is not a folder", dir);
    return CLI_EXIT_OUTPUT;
  }
  /* every file of the set, before anything is computed */
  static const char *const ext[2] = {"svg", "png"};
  char path[4200];
  for (size_t i = 0; names[i] != NULL; i++) {
    for (int k = 0; k < 2; k++) {
      snprintf(path, sizeof path, "%s/%s.%s", dir, names[i], ext[k]);
      if (lstat(path, &sb) != 0) continue;
      if (!S_ISREG(sb.st_mode)) {
        cli_error("%s: exists and is not a regular file; not replaced", path);
        return CLI_EXIT_OUTPUT;
      }
      if (!force) {
        cli_error("%s: exists; not overwritten (add --force to replace it)", path);
        return CLI_EXIT_OUTPUT;
      }
    }
  }
  /* writable? (the plotting library ends the process when it cannot open its file) */
  if (!cli_dir_writable(dir)) {
    cli_error("%s: cannot write figures there: %s", dir, strerror(errno));
    return CLI_EXIT_OUTPUT;
  }
  return 0;
}

int fig_polar_set(const char *base, const char *title, const fig_polar *p, size_t np)
{
  fig_polar_work w;
  w.sr = calloc(8 * np + 1, sizeof *w.sr);
  w.ld = calloc(np + 1, sizeof *w.ld);
  w.label = calloc(np + 1, sizeof *w.label);
  int rc = w.sr == NULL || w.ld == NULL || w.label == NULL;
  for (size_t k = 0; rc == 0 && k < np; k++) {
    w.ld[k] = calloc((p[k].cl_lo != NULL ? 17 : 1) * p[k].n + 1, sizeof **w.ld);
    if (w.ld[k] == NULL) rc = 1;
  }
  if (rc == 0) {
    plot_panel pan[4];
    fig_polar_panels(title, p, np, &w, pan);
    rc = plot_figure(base, NULL, 2, 2, pan, 4);
  } else {
    cli_error("out of memory");
  }
  for (size_t k = 0; w.ld != NULL && k < np; k++) free(w.ld[k]);
  free(w.ld);
  free(w.label);
  free(w.sr);
  return rc ? CLI_EXIT_OUTPUT : 0;
}

int fig_polars(const char *dir, const char *section, const fig_polar *p, size_t np)
{
  char t0[200], base[4200];
  snprintf(t0, sizeof t0, "lift, %s", section);
  snprintf(base, sizeof base, "%s/polar", dir);
  return fig_polar_set(base, t0, p, np);
}

/* distinct values of v (at most max), ascending */
static size_t distinct(const fig_rotor_point *p, size_t np, int which, double *out, size_t max)
{
  size_t n = 0;
  for (size_t i = 0; i < np; i++) {
    double v = which == 2 ? p[i].J : which ? p[i].speed : p[i].rpm;
    if (!isfinite(v)) continue;
    size_t k = 0;
    while (k < n && fabs(out[k] - v) > 1e-9 * (1.0 + fabs(v))) k++;
    if (k == n && n < max) out[n++] = v;
  }
  for (size_t i = 1; i < n; i++) {
    for (size_t j = i; j > 0 && out[j] < out[j - 1]; j--) {
      double t = out[j];
      out[j] = out[j - 1];
      out[j - 1] = t;
    }
  }
  return n;
}

/* the points of p at rpm (or, with rpm NaN, at speed 0) ordered by J (or by rpm) into x, y1..y3;
 * returns the count */
static size_t compare_series(const fig_rotor_point *p, size_t np, double rpm, double *x, double *y1,
                             double *y2, double *y3)
{
  size_t m = 0;
  for (size_t i = 0; i < np; i++) {
    int in = isnan(rpm) ? p[i].speed == 0.0 : fabs(p[i].rpm - rpm) <= 1e-9 * rpm;
    if (!in || !isfinite(p[i].thrust)) continue;
    double key = isnan(rpm) ? p[i].rpm : p[i].J;
    size_t j = m++;
    for (; j > 0 && x[j - 1] > key; j--) {
      x[j] = x[j - 1];
      y1[j] = y1[j - 1];
      y2[j] = y2[j - 1];
      y3[j] = y3[j - 1];
    }
    x[j] = key;
    y1[j] = isnan(rpm) ? p[i].thrust : p[i].CT;
    y2[j] = isnan(rpm) ? p[i].power : p[i].CP;
    y3[j] = p[i].eta;
  }
  return m;
}

int fig_rotor_compare(const char *dir, const char *const *names, const fig_rotor_point *const *p,
                      const size_t *np, size_t nc)
{
  enum { MAXC = 8, MAXG = 64 };
  if (nc > MAXC) nc = MAXC;
  size_t tot = 0;
  for (size_t k = 0; k < nc; k++) tot += np[k];
  double *buf = calloc(8 * tot + 1, sizeof *buf);
  if (buf == NULL) {
    cli_error("out of memory");
    return CLI_EXIT_INTERNAL;
  }
  plot_series sr[5 * MAXC];
  char lab[MAXC][64];
  double *q = buf;
  for (size_t k = 0; k < nc; k++) {
    /* the rpm with the most points; among equals (an rpm x speed map), the middle one */
    double rpms[MAXG], best = NAN;
    size_t nr = distinct(p[k], np[k], 0, rpms, MAXG), most = 0, cnt[MAXG];
    for (size_t g = 0; g < nr; g++) {
      cnt[g] = 0;
      for (size_t i = 0; i < np[k]; i++) cnt[g] += (size_t)(fabs(p[k][i].rpm - rpms[g]) <= 1e-9 * rpms[g]);
      if (cnt[g] > most) most = cnt[g];
    }
    size_t ntie = 0, g0 = 0;
    for (size_t g = 0; g < nr; g++) ntie += (size_t)(cnt[g] == most);
    for (size_t g = 0, t = 0; g < nr; g++) {
      if (cnt[g] != most) continue;
      if (t++ == ntie / 2) g0 = g;
    }
    if (nr > 0) best = rpms[g0];
    double *J = q, *CT = q + np[k], *CP = q + 2 * np[k], *ET = q + 3 * np[k];
    double *R = q + 4 * np[k], *T = q + 5 * np[k], *P = q + 6 * np[k], *E0 = q + 7 * np[k];
    q += 8 * np[k];
    size_t m = isnan(best) ? 0 : compare_series(p[k], np[k], best, J, CT, CP, ET);
    size_t m0 = compare_series(p[k], np[k], NAN, R, T, P, E0);
    if (isnan(best)) snprintf(lab[k], sizeof lab[k], "%.40s", names[k]);
    else snprintf(lab[k], sizeof lab[k], "%.40s, %.0f rpm", names[k], best);
    size_t nfin = 0;
    for (size_t i = 0; i < m; i++) nfin += (size_t)isfinite(ET[i]);
    sr[k] = (plot_series){lab[k], m, J, CT, m < 2};
    sr[MAXC + k] = (plot_series){NULL, m, J, CP, m < 2};
    sr[2 * MAXC + k] = (plot_series){NULL, m, J, ET, nfin < 2};
    sr[3 * MAXC + k] = (plot_series){NULL, m0, R, T, m0 < 2};
    sr[4 * MAXC + k] = (plot_series){NULL, m0, R, P, m0 < 2};
  }
  plot_panel pan[5] = {{"thrust coefficient", "advance ratio J", "C#dT#u = T/(#gr n#u2#d D#u4#d)", sr, nc},
                       {"power coefficient", "advance ratio J", "C#dP#u = P/(#gr n#u3#d D#u5#d)", sr + MAXC, nc},
                       {"efficiency", "advance ratio J", "#gy = T V / P", sr + 2 * MAXC, nc},
                       {"static thrust", "rotation rate (rpm)", "thrust (N)", sr + 3 * MAXC, nc},
                       {"static shaft power", "rotation rate (rpm)", "power (W)", sr + 4 * MAXC, nc}};
  char base[4200];
  snprintf(base, sizeof base, "%s/compare-rotor", dir);
  int rc = plot_figure(base, NULL, 2, 3, pan, 5);
  free(buf);
  return rc;
}

int fig_rotor(const char *dir, const char *blade, const fig_rotor_point *p, size_t np)
{
  enum { MAXG = 12 };
  double rpms[MAXG], spds[MAXG];
  size_t nr = distinct(p, np, 0, rpms, MAXG), nv = distinct(p, np, 1, spds, MAXG);
  double *buf = calloc(16 * np + 1, sizeof *buf);
  plot_series *sr = calloc(9 * MAXG + 1, sizeof *sr);
  char (*lab)[48] = calloc(2 * MAXG, sizeof *lab);
  if (buf == NULL || sr == NULL || lab == NULL) {
    free(buf);
    free(sr);
    free(lab);
    cli_error("out of memory");
    return CLI_EXIT_INTERNAL;
  }
  /* by rpm: J, CT, CP, eta ordered by speed; by speed: rpm, thrust ordered by rpm */
  double *J = buf, *CT = buf + np, *CP = buf + 2 * np, *ET = buf + 3 * np;
  double *RP = buf + 4 * np, *TH = buf + 5 * np, *PW = buf + 6 * np;
  /* bands: per speed series of m points, the x values twice and the lower then upper edges */
  double *BX = buf + 7 * np, *BT = buf + 9 * np, *BP = buf + 11 * np;
  plot_series *thr = sr + 5 * MAXG, *pwr = sr + 3 * MAXG; /* up to 2 nv each (band, line) */
  size_t nthr = 0, npwr = 0, boff = 0;
  size_t off = 0;
  for (size_t g = 0; g < nr; g++) {
    size_t start = off;
    for (size_t v = 0; v < nv; v++) {
      for (size_t i = 0; i < np; i++) {
        if (p[i].rpm == rpms[g] && p[i].speed == spds[v]) {
          J[off] = p[i].J;
          CT[off] = p[i].CT;
          CP[off] = p[i].CP;
          ET[off] = p[i].eta;
          off++;
        }
      }
    }
    snprintf(lab[g], sizeof lab[g], "%.0f rpm", rpms[g]);
    sr[g] = (plot_series){lab[g], off - start, J + start, CT + start, off - start < 2};
    sr[MAXG + g] = (plot_series){NULL, off - start, J + start, CP + start, off - start < 2};
    /* efficiency exists only in forward flight: markers where a series has fewer than two
     * finite values (a hover point and one forward point drew nothing) */
    size_t nfin = 0;
    for (size_t q = start; q < off; q++) nfin += (size_t)isfinite(ET[q]);
    sr[2 * MAXG + g] = (plot_series){NULL, off - start, J + start, ET + start, nfin < 2};
  }
  /* points on a grid of advance ratios (rotor --advance-ratio: every rpm at every J): the
   * rpm panels by J instead of by airspeed, which then differs from point to point */
  double jv[MAXG];
  size_t nj = distinct(p, np, 2, jv, MAXG);
  int jgrid = nj >= 1 && nj < MAXG && nv > nj && nr >= 2;
  for (size_t q = 0; jgrid && q < nj; q++) {
    size_t c = 0;
    for (size_t i = 0; i < np; i++) c += (size_t)(fabs(p[i].J - jv[q]) <= 1e-9 * (1.0 + jv[q]));
    jgrid = c >= 2;
  }
  size_t ngrp = jgrid ? nj : nv;
  off = 0;
  for (size_t v = 0; v < ngrp; v++) {
    size_t start = off;
    for (size_t g = 0; g < nr; g++) {
      for (size_t i = 0; i < np; i++) {
        int in = jgrid ? fabs(p[i].J - jv[v]) <= 1e-9 * (1.0 + jv[v]) : p[i].speed == spds[v];
        if (p[i].rpm == rpms[g] && in) {
          RP[off] = p[i].rpm;
          TH[off] = p[i].thrust;
          PW[off] = p[i].power;
          off++;
        }
      }
    }
    if (jgrid) snprintf(lab[MAXG + v], sizeof lab[MAXG + v], "J %.3g", jv[v]);
    else snprintf(lab[MAXG + v], sizeof lab[MAXG + v], "%.3g m/s", spds[v]);
    size_t m = off - start;
    int banded = 0;
    for (size_t g = 0, q = 0; g < nr; g++) {
      for (size_t i = 0; i < np; i++) {
        int in = jgrid ? fabs(p[i].J - jv[v]) <= 1e-9 * (1.0 + jv[v]) : p[i].speed == spds[v];
        if (p[i].rpm == rpms[g] && in) {
          BX[boff + q] = BX[boff + m + q] = p[i].rpm;
          BT[boff + q] = p[i].thrust_band[0];
          BT[boff + m + q] = p[i].thrust_band[1];
          BP[boff + q] = p[i].power_band[0];
          BP[boff + m + q] = p[i].power_band[1];
          banded |= isfinite(p[i].thrust_band[0]);
          q++;
        }
      }
    }
    if (banded && m >= 2) {
      thr[nthr++] = (plot_series){NULL, 2 * m, BX + boff, BT + boff, 2};
      pwr[npwr++] = (plot_series){NULL, 2 * m, BX + boff, BP + boff, 2};
    }
    boff += 2 * m;
    thr[nthr++] = (plot_series){lab[MAXG + v], m, RP + start, TH + start, m < 2};
    pwr[npwr++] = (plot_series){NULL, m, RP + start, PW + start, m < 2};
  }
  /* Reynolds-number study (small-prop test practice): CT and CP against the chord Re at
   * 0.75 R, one line per advance ratio, where the points hold fixed J at two or more rpm
   * (rotor --advance-ratio); x as log10 Re */
  size_t nre = 0;
  double *RX = buf + 13 * np, *RT = buf + 14 * np, *RC = buf + 15 * np;
  plot_series *rct = sr + 7 * MAXG, *rcp = sr + 8 * MAXG;
  char (*jl)[24] = calloc(MAXG, sizeof *jl);
  off = 0;
  for (size_t q = 0; jl != NULL && jgrid && q < nj; q++) {
    size_t start = off;
    for (size_t g = 0; g < nr; g++) {
      for (size_t i = 0; i < np; i++) {
        if (p[i].rpm == rpms[g] && fabs(p[i].J - jv[q]) <= 1e-9 * (1.0 + jv[q]) &&
            isfinite(p[i].CT) && p[i].re_075 > 0.0) {
          RX[off] = log10(p[i].re_075);
          RT[off] = p[i].CT;
          RC[off] = p[i].CP;
          off++;
        }
      }
    }
    if (off - start >= 2) {
      snprintf(jl[q], sizeof jl[q], "J %.3g", jv[q]);
      rct[nre] = (plot_series){jl[q], off - start, RX + start, RT + start, 0};
      rcp[nre] = (plot_series){NULL, off - start, RX + start, RC + start, 0};
      nre++;
    }
  }
  char t0[160], base[4200];
  snprintf(t0, sizeof t0, "thrust coefficient, %.28s", blade);
  plot_panel pan[8] = {{t0, "advance ratio J", "C#dT#u = T/(#gr n#u2#d D#u4#d)", sr, nr},
                       {"power coefficient", "advance ratio J", "C#dP#u = P/(#gr n#u3#d D#u5#d)", sr + MAXG, nr},
                       {"efficiency", "advance ratio J", "#gy = T V / P", sr + 2 * MAXG, nr},
                       {"thrust", "rotation rate (rpm)", "thrust (N)", thr, nthr},
                       {"shaft power", "rotation rate (rpm)", "power (W)", pwr, npwr},
                       {"thrust coefficient at fixed J", "Re at 0.75 R", "C#dT#u", rct, nre},
                       {"power coefficient at fixed J", "Re at 0.75 R", "C#dP#u", rcp, nre},
                       {"", "", "", NULL, 0}};
  const int logx[8] = {0, 0, 0, 0, 0, 1, 1, 0};
  snprintf(base, sizeof base, "%s/rotor", dir);
  int rc = nre > 0 ? plot_figure_logx(base, NULL, 2, 4, pan, 7, logx) : plot_figure(base, NULL, 2, 3, pan, 5);
  free(jl);
  /* spanwise loading of up to eight points with stations */
  plot_series ss[8];
  char sl[8][48];
  size_t ns = 0;
  for (size_t i = 0; rc == 0 && i < np && ns < 8; i++) {
    if (p[i].ns == 0 || p[i].r_over_R == NULL || !isfinite(p[i].thrust)) continue;
    snprintf(sl[ns], sizeof sl[ns], "%.0f rpm, %.3g m/s", p[i].rpm, p[i].speed);
    ss[ns] = (plot_series){sl[ns], p[i].ns, p[i].r_over_R, p[i].dT_dr, 0};
    ns++;
  }
  if (rc == 0 && ns > 0) {
    plot_panel sp[1] = {{"spanwise thrust loading", "r/R", "dT/dr, all blades (N/m)", ss, ns}};
    snprintf(base, sizeof base, "%s/rotor-spanwise", dir);
    rc = plot_figure(base, NULL, 1, 1, sp, 1);
  }
  free(buf);
  free(sr);
  free(lab);
  return rc ? CLI_EXIT_OUTPUT : 0;
}

int fig_flow(const char *dir, const char *title, size_t ns, const int *side, const double *x,
             const double *cp, const double *dstar, const double *h, const double *cf,
             const int *turb, size_t n_inv, const double *x_inv, const double *cp_inv)
{
  /* per side: x, -Cp, dstar, H, Cf (NaN elsewhere, so each side is its own line) */
  double *b = calloc(17 * (ns + 1) + n_inv + 1, sizeof *b);
  if (b == NULL) {
    cli_error("out of memory");
    return CLI_EXIT_INTERNAL;
  }
  double *xs[3], *mcp[3], *dss[3], *hs[3], *cfs[3];
  for (int q = 0; q < 3; q++) {
    xs[q] = b + (5 * (size_t)q + 0) * ns;
    mcp[q] = b + (5 * (size_t)q + 1) * ns;
    dss[q] = b + (5 * (size_t)q + 2) * ns;
    hs[q] = b + (5 * (size_t)q + 3) * ns;
    cfs[q] = b + (5 * (size_t)q + 4) * ns;
  }
  double *tx = b + 15 * ns, *ty = tx + 4, *sx = b + 16 * ns, *sy = sx + ns / 2 + 1;
  double *mci = b + 17 * (ns + 1);
  size_t cnt[3] = {0, 0, 0}, ntr = 0, nsep = 0;
  for (size_t k = 0; k < ns; k++) {
    int q = side[k] < 0 || side[k] > 2 ? 2 : side[k];
    size_t i = cnt[q]++;
    xs[q][i] = x[k];
    mcp[q][i] = q < 2 ? -cp[k] : NAN;
    dss[q][i] = dstar[k];
    hs[q][i] = h[k];
    /* skin friction from x/c 0.02: at the stagnation point it grows without bound and would
     * flatten the rest of the curve */
    cfs[q][i] = q < 2 && x[k] >= 0.02 ? cf[k] : NAN;
    if (q < 2 && k > 0 && side[k - 1] == q && turb[k] && !turb[k - 1] && ntr < 2) {
      tx[ntr] = x[k];
      ty[ntr] = -cp[k];
      ntr++;
    }
    if (q < 2 && cf[k] < 0.0 && nsep < ns / 2) {
      sx[nsep] = x[k];
      sy[nsep] = -cp[k];
      nsep++;
    }
  }
  for (size_t i = 0; i < n_inv; i++) mci[i] = -cp_inv[i];
  plot_series cps[5] = {{"viscous, upper", cnt[0], xs[0], mcp[0], 0},
                        {"viscous, lower", cnt[1], xs[1], mcp[1], 0},
                        {"inviscid", n_inv, x_inv, mci, 0},
                        {"transition", ntr, tx, ty, 1},
                        {"separated (C#df#u < 0)", nsep, sx, sy, 1}};
  plot_panel pc[1] = {{title, "x/c", "-C#dp#u", cps, nsep > 0 ? 5 : 4}};
  char base[4200];
  snprintf(base, sizeof base, "%s/flow-cp", dir);
  int rc = plot_figure(base, NULL, 1, 1, pc, 1);
  if (rc == 0) {
    plot_series sd[3] = {{"upper", cnt[0], xs[0], dss[0], 0}, {"lower", cnt[1], xs[1], dss[1], 0},
                         {"wake", cnt[2], xs[2], dss[2], 0}};
    plot_series sh[3] = {{NULL, cnt[0], xs[0], hs[0], 0}, {NULL, cnt[1], xs[1], hs[1], 0},
                         {NULL, cnt[2], xs[2], hs[2], 0}};
    plot_series sc[2] = {{NULL, cnt[0], xs[0], cfs[0], 0}, {NULL, cnt[1], xs[1], cfs[1], 0}};
    plot_panel pb[3] = {{"displacement thickness", "x/c", "#gd#u*#d/c", sd, 3},
                        {"shape factor", "x/c", "H = #gd#u*#d/#gh", sh, 3},
                        {"skin friction (from x/c 0.02)", "x/c", "C#df#u", sc, 2}};
    snprintf(base, sizeof base, "%s/flow-bl", dir);
    rc = plot_figure(base, NULL, 3, 1, pb, 3);
  }
  free(b);
  return rc ? CLI_EXIT_OUTPUT : 0;
}

void fig_re_series_bind(fig_re_series *f, double mach, size_t n, double *b)
{
  snprintf(f->label, sizeof f->label, "Mach %.2g", mach);
  f->n = n;
  f->re = b;
  f->cd_min = b + n;
  f->ld_max = b + 2 * n;
  f->cl_max = b + 3 * n;
  f->alpha0 = b + 4 * n;
  f->slope = b + 5 * n;
  f->x_sep = b + 6 * n;
  f->x_re = b + 7 * n;
}

int fig_re_study(const char *dir, const char *section, double bubble_cl, const fig_re_series *s,
                 size_t ns)
{
  enum { MAXS = 8 };
  if (ns > MAXS) ns = MAXS;
  size_t nre = 0;
  for (size_t k = 0; k < ns; k++) nre = s[k].n > nre ? s[k].n : nre;
  double *lx = calloc(ns * nre + 1, sizeof *lx);
  plot_series *sr = calloc(7 * MAXS, sizeof *sr);
  char (*lab)[64] = calloc(2 * MAXS, sizeof *lab);
  if (lx == NULL || sr == NULL || lab == NULL) {
    free(lx);
    free(sr);
    free(lab);
    cli_error("out of memory");
    return CLI_EXIT_INTERNAL;
  }
  /* markers only: a study has a few Reynolds numbers, and a figure undetermined at one of them
   * must not hide its neighbours (a line needs two finite points in a row) */
  for (size_t k = 0; k < ns; k++) {
    double *x = lx + k * nre;
    for (size_t i = 0; i < s[k].n; i++) x[i] = s[k].re[i] > 0.0 ? log10(s[k].re[i]) : NAN;
    const double *ys[5] = {s[k].cd_min, s[k].ld_max, s[k].cl_max, s[k].alpha0, s[k].slope};
    for (int f = 0; f < 5; f++) {
      sr[f * MAXS + k] = (plot_series){f == 0 ? s[k].label : NULL, s[k].n, x, ys[f], 1};
    }
    snprintf(lab[2 * k], sizeof lab[0], "separation, %s", s[k].label);
    snprintf(lab[2 * k + 1], sizeof lab[0], "reattachment, %s", s[k].label);
    sr[5 * MAXS + 2 * k] = (plot_series){lab[2 * k], s[k].n, x, s[k].x_sep, 1};
    sr[5 * MAXS + 2 * k + 1] = (plot_series){lab[2 * k + 1], s[k].n, x, s[k].x_re, 1};
  }
  char t0[200], t5[96], base[4200];
  snprintf(t0, sizeof t0, "smallest drag, %s", section);
  snprintf(t5, sizeof t5, "upper-surface bubble at c#dl#u = %.3g", bubble_cl);
  snprintf(base, sizeof base, "%s/polar-re", dir);
  plot_panel pan[6] = {
    {t0, "Reynolds number", "smallest c#dd#u", sr, ns},
    {"best lift-to-drag ratio", "Reynolds number", "largest L/D", sr + MAXS, ns},
    {"maximum lift", "Reynolds number", "c#dl,max#u", sr + 2 * MAXS, ns},
    {"zero-lift angle", "Reynolds number", "#ga#d0#u (deg)", sr + 3 * MAXS, ns},
    {"lift slope near zero lift", "Reynolds number", "dc#dl#u/d#ga (1/deg)", sr + 4 * MAXS, ns},
    {t5, "Reynolds number", "x/c", sr + 5 * MAXS, 2 * ns}};
  static const int logx[6] = {1, 1, 1, 1, 1, 1};
  int rc = plot_figure_logx(base, "Reynolds-number study", 2, 3, pan, 6, logx);
  free(lx);
  free(sr);
  free(lab);
  return rc;
}

int fig_drive(const char *dir, const ascr_drive_linearity *lin, size_t ns)
{
  enum { MAXS = 12, NP = ASCR_DRIVE_MAP_POINTS };
  if (ns > MAXS) ns = MAXS;
  plot_series sr[5 * MAXS + 1];
  char lab[MAXS][48], flab[MAXS][48];
  double fx[MAXS][2], fy[MAXS][2];
  double v[MAXS][5][NP]; /* throttle %, thrust, rpm, current, power */
  size_t nt = 0;
  for (size_t k = 0; k < ns; k++) {
    for (size_t i = 0; i < NP; i++) {
      const ascr_drive_point *p = &lin[k].grid[i];
      int ok = p->converged;
      v[k][0][i] = 100.0 * p->throttle;
      v[k][1][i] = ok ? p->rotor.thrust_N : NAN;
      v[k][2][i] = ok ? p->rotor.rpm : NAN;
      v[k][3][i] = ok ? p->power.battery_current_A : NAN;
      v[k][4][i] = ok ? p->power.electrical_power_W : NAN;
    }
    snprintf(lab[k], sizeof lab[k], "%.3g m/s", lin[k].speed_m_s);
    sr[nt++] = (plot_series){lab[k], NP, v[k][0], v[k][1], 0};
  }
  /* the best straight lines over the usable bands after every map, so that a map has the same
   * colour in every panel */
  for (size_t k = 0; k < ns; k++) {
    if (isfinite(lin[k].band[0]) && isfinite(lin[k].fit_slope_N)) {
      fx[k][0] = 100.0 * lin[k].band[0];
      fx[k][1] = 100.0;
      fy[k][0] = lin[k].fit_offset_N + lin[k].fit_slope_N * lin[k].band[0];
      fy[k][1] = lin[k].fit_offset_N + lin[k].fit_slope_N;
      snprintf(flab[k], sizeof flab[k], "best line, %.3g m/s", lin[k].speed_m_s);
      sr[nt++] = (plot_series){flab[k], 2, fx[k], fy[k], 0};
    }
  }
  plot_series *rp = sr + nt, *cu = rp + ns, *pw = cu + ns;
  for (size_t k = 0; k < ns; k++) {
    rp[k] = (plot_series){NULL, NP, v[k][0], v[k][2], 0};
    cu[k] = (plot_series){NULL, NP, v[k][0], v[k][3], 0};
    pw[k] = (plot_series){NULL, NP, v[k][0], v[k][4], 0};
  }
  char base[4200];
  plot_panel pan[4] = {{"thrust against throttle", "throttle (%)", "thrust (N)", sr, nt},
                       {"rotation rate", "throttle (%)", "rpm", rp, ns},
                       {"battery current (the pack's)", "throttle (%)", "current (A)", cu, ns},
                       {"electrical power from the pack", "throttle (%)", "power (W)", pw, ns}};
  snprintf(base, sizeof base, "%s/drive", dir);
  return plot_figure(base, NULL, 2, 2, pan, 4) ? CLI_EXIT_OUTPUT : 0;
}

int fig_campbell(const char *dir, const char *blade, const ascr_blade_modes *m, size_t n,
                 int max_order)
{
  enum { MAXO = 24 };
  if (max_order > MAXO) max_order = MAXO;
  size_t nm = n > 0 ? m[0].n_modes : 0;
  double *buf = calloc((3 * ASCR_MODES_MAX + 1) * n + 4 * MAXO + 1, sizeof *buf);
  if (buf == NULL) {
    cli_error("out of memory");
    return CLI_EXIT_INTERNAL;
  }
  plot_series sr[3 * ASCR_MODES_MAX + MAXO];
  static const char *const fam[3] = {"flap", "lag", "torsion"};
  char lab[3 * ASCR_MODES_MAX + MAXO][32];
  size_t ns = 0;
  double *x = buf, *q = buf + n;
  for (size_t i = 0; i < n; i++) x[i] = m[i].rpm;
  /* modes far above the highest engine order are left out (they would set the scale) */
  double fmax_shown = 1.5 * max_order * (n > 0 ? m[n - 1].rpm : 0.0) / 60.0;
  for (int f = 0; f < 3; f++) {
    for (size_t j = 0; j < nm; j++) {
      double lo = HUGE_VAL;
      for (size_t i = 0; i < n; i++) {
        q[i] = f == 0 ? m[i].flap_hz[j] : f == 1 ? m[i].lag_hz[j] : m[i].torsion_hz[j];
        if (isfinite(q[i])) lo = fmin(lo, q[i]);
      }
      if (!(lo <= fmax_shown)) continue;
      snprintf(lab[ns], sizeof lab[ns], "%s %zu", fam[f], j + 1);
      sr[ns] = (plot_series){lab[ns], n, x, q, n < 2};
      ns++;
      q += n;
    }
  }
  /* engine orders: two points each, from 0 to the highest rpm */
  double *ox = q, *oy = q + 2 * MAXO;
  double top = n > 0 ? m[n - 1].rpm : 0.0;
  for (int k = 1; k <= max_order; k++) {
    ox[2 * (k - 1)] = 0.0;
    ox[2 * (k - 1) + 1] = top;
    oy[2 * (k - 1)] = 0.0;
    oy[2 * (k - 1) + 1] = k * top / 60.0;
    snprintf(lab[ns], sizeof lab[ns], "%dP", k);
    sr[ns] = (plot_series){k == 1 || k == max_order ? lab[ns] : NULL, 2, ox + 2 * (k - 1),
                           oy + 2 * (k - 1), 0};
    ns++;
  }
  char t0[200], base[4200];
  snprintf(t0, sizeof t0, "Campbell diagram, %.60s", blade);
  plot_panel pan[1] = {{t0, "rotation rate (rpm)", "frequency (Hz)", sr, ns}};
  snprintf(base, sizeof base, "%s/structure", dir);
  int rc = plot_figure(base, NULL, 1, 1, pan, 1);
  free(buf);
  return rc;
}
