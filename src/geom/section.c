/* src/geom/section.c
 * The section object and the pipeline that turns a raw point list into a normalised,
 * counter-clockwise contour.
 *
 * Method. A point list comes in one of two layouts:
 *   contour       - one run from the trailing edge round the nose back to the trailing edge
 *                   (either sense); its first and last points both lie near the largest x;
 *   two surfaces  - two runs, each from the leading edge to the trailing edge; the first
 *                   point lies near the smallest x and x falls back by more than half the
 *                   x-range where the second run starts (or a count row says where).
 * Two surfaces are joined into one contour (the one with the higher mean y becomes the upper
 * surface, reversed to run TE -> LE) and a leading-edge point present in both is merged.
 * The sense is fixed from the signed (shoelace) area: a clockwise list is reversed.
 * Normalisation: if the points already sit in chord coordinates (a node at (0,0) to 1e-6 and
 * the trailing-edge midpoint at (1,0) to 1e-4, the rounding of five-decimal tables) they are
 * kept as they are; otherwise the leading
 * edge is the node farthest from the trailing-edge midpoint, and the list is translated,
 * rotated and scaled so that the leading edge is at (0,0) and the trailing-edge midpoint at
 * (1,0). Validation (validate.c) rejects repeated points, crossings, surfaces that double back
 * and contours open by more than ASCR_GEOM_MAX_TE_GAP chords.
 */
#include "geom/geom_impl.h"
#include "core/core_impl.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

ascr_geom_section *geom_section_new(size_t n, const char *name)
{
  ascr_geom_section *s = calloc(1, sizeof *s);
  if (s == NULL) {
    return NULL;
  }
  s->n = n;
  s->x = core_calloc(n, sizeof(double));
  s->y = core_calloc(n, sizeof(double));
  if (s->x == NULL || s->y == NULL) {
    ascr_geom_section_free(s);
    return NULL;
  }
  snprintf(s->name, sizeof s->name, "%s", name != NULL ? name : "section");
  return s;
}

void ascr_geom_section_free(ascr_geom_section *s)
{
  if (s == NULL) {
    return;
  }
  free(s->x);
  free(s->y);
  free(s);
}

size_t ascr_geom_section_size(const ascr_geom_section *s) { return s != NULL ? s->n : 0; }
const double *ascr_geom_section_x(const ascr_geom_section *s) { return s != NULL ? s->x : NULL; }
const double *ascr_geom_section_y(const ascr_geom_section *s) { return s != NULL ? s->y : NULL; }
size_t ascr_geom_section_le_index(const ascr_geom_section *s) { return s != NULL ? s->i_le : 0; }
const char *ascr_geom_section_name(const ascr_geom_section *s) { return s != NULL ? s->name : ""; }

/* Twice the signed area enclosed by the polygon (closing segment included). */
static double shoelace2(const double *x, const double *y, size_t n)
{
  double a = 0.0;
  for (size_t i = 0; i < n; i++) {
    size_t j = (i + 1) % n;
    a += x[i] * y[j] - x[j] * y[i];
  }
  return a;
}

static void reverse3(double *x, double *y, long *line, size_t n)
{
  for (size_t i = 0, j = n - 1; i < j; i++, j--) {
    double t = x[i]; x[i] = x[j]; x[j] = t;
    t = y[i]; y[i] = y[j]; y[j] = t;
    long l = line[i]; line[i] = line[j]; line[j] = l;
  }
}

static double mean_of(const double *v, size_t n)
{
  double m = 0.0;
  for (size_t i = 0; i < n; i++) {
    m += v[i];
  }
  return n > 0 ? m / (double)n : 0.0;
}

/* Join two leading-edge-first surfaces a[0..na-1], b[0..nb-1] into a contour cx/cy/cl.
 * Returns the number of contour points. */
static size_t join_surfaces(const double *x, const double *y, const long *line, size_t na,
                            size_t n, double scale, double *cx, double *cy, long *cl,
                            int *merged)
{
  const double *xa = x, *ya = y, *xb = x + na, *yb = y + na;
  const long *la = line, *lb = line + na;
  size_t nb = n - na;
  /* the upper surface is the one with the larger mean y */
  if (mean_of(yb, nb) > mean_of(ya, na)) {
    const double *t = xa; xa = xb; xb = t;
    t = ya; ya = yb; yb = t;
    const long *tl = la; la = lb; lb = tl;
    size_t tn = na; na = nb; nb = tn;
  }
  size_t k = 0;
  for (size_t i = na; i-- > 0;) {
    cx[k] = xa[i]; cy[k] = ya[i]; cl[k] = la[i]; k++;
  }
  size_t start = 0;
  if (hypot(xb[0] - xa[0], yb[0] - ya[0]) <= 1e-9 * scale) {
    start = 1;
    *merged = 1;
  }
  for (size_t i = start; i < nb; i++) {
    cx[k] = xb[i]; cy[k] = yb[i]; cl[k] = lb[i]; k++;
  }
  return k;
}

ascr_status geom_build(const double *x, const double *y, const long *line, size_t n,
                       size_t count_split, const char *src, const char *name,
                       ascr_geom_section **out, ascr_geom_load_info *info, ascr_errbuf *err)
{
  ascr_status st = ASCR_OK;
  double *cx = NULL, *cy = NULL;
  long *cl = NULL;
  ascr_geom_load_info li;
  memset(&li, 0, sizeof li);
  *out = NULL;

  if (n < ASCR_GEOM_MIN_POINTS) {
    return core_fail(err, ASCR_EGEOM, "%s: too few points: %zu (a section needs at least %d)",
                     src, n, ASCR_GEOM_MIN_POINTS);
  }
  double xmin = x[0], xmax = x[0], ymin = y[0], ymax = y[0];
  for (size_t i = 1; i < n; i++) {
    xmin = fmin(xmin, x[i]); xmax = fmax(xmax, x[i]);
    ymin = fmin(ymin, y[i]); ymax = fmax(ymax, y[i]);
  }
  double xr = xmax - xmin;
  if (!(xr > 0.0) || !(ymax - ymin > 0.0)) {
    return core_fail(err, ASCR_EGEOM,
                     "%s: the points span no area (x range %.6g, y range %.6g)", src, xr,
                     ymax - ymin);
  }
  cx = core_calloc(n, sizeof *cx);
  cy = core_calloc(n, sizeof *cy);
  cl = core_calloc(n, sizeof *cl);
  if (cx == NULL || cy == NULL || cl == NULL) {
    st = core_fail(err, ASCR_ENOMEM, "%s: out of memory for %zu points", src, n);
    goto done;
  }

  /* ---- layout detection */
  const double near = 0.1 * xr;
  size_t m = 0;
  if (count_split > 0) {
    li.layout = ASCR_GEOM_LAYOUT_TWO_SURFACES;
    li.had_count_row = 1;
    if (count_split < 2 || n - count_split < 2) {
      st = core_fail(err, ASCR_EPARSE, "%s: count row gives %zu and %zu points; each surface "
                     "needs at least 2", src, count_split, n - count_split);
      goto done;
    }
    m = join_surfaces(x, y, line, count_split, n, xr, cx, cy, cl, &li.merged_le_duplicate);
  } else if (xmax - x[0] < near && xmax - x[n - 1] < near) {
    li.layout = ASCR_GEOM_LAYOUT_CONTOUR;
    memcpy(cx, x, n * sizeof *cx);
    memcpy(cy, y, n * sizeof *cy);
    memcpy(cl, line, n * sizeof *cl);
    m = n;
  } else if (x[0] - xmin < near) {
    size_t split = 0;
    for (size_t i = 1; i < n; i++) {
      if (x[i] < x[i - 1] - 0.5 * xr) {
        split = i;
        break;
      }
    }
    if (split == 0) {
      st = core_fail(err, ASCR_EGEOM,
                     "%s:%ld: the points start at the leading edge but no second surface "
                     "starting at the leading edge was found", src, line[0]);
      goto done;
    }
    if (xmax - x[split - 1] >= near || xmax - x[n - 1] >= near || x[split] - xmin >= near) {
      st = core_fail(err, ASCR_EGEOM,
                     "%s:%ld: two surfaces were expected (each from the leading edge to the "
                     "trailing edge), but the surface starting here does not run from the "
                     "leading to the trailing edge", src, line[split]);
      goto done;
    }
    li.layout = ASCR_GEOM_LAYOUT_TWO_SURFACES;
    m = join_surfaces(x, y, line, split, n, xr, cx, cy, cl, &li.merged_le_duplicate);
  } else {
    st = core_fail(err, ASCR_EGEOM,
                   "%s:%ld: cannot tell the layout: the first point (x = %.6g) is neither at the "
                   "trailing edge (largest x %.6g) nor at the leading edge (smallest x %.6g)",
                   src, line[0], x[0], xmax, xmin);
    goto done;
  }

  /* ---- repeated consecutive points */
  st = geom_check_repeats(cx, cy, cl, m, xr, src, err);
  if (st != ASCR_OK) {
    goto done;
  }
  /* ---- sense */
  double a2 = shoelace2(cx, cy, m);
  if (fabs(a2) < 1e-10 * xr * xr) {
    st = core_fail(err, ASCR_EGEOM, "%s: the contour encloses no area", src);
    goto done;
  }
  if (a2 < 0.0) {
    reverse3(cx, cy, cl, m);
    li.reversed = 1;
  }
  /* ---- closure */
  double gap0 = hypot(cx[0] - cx[m - 1], cy[0] - cy[m - 1]);
  if (gap0 > ASCR_GEOM_MAX_TE_GAP * xr) {
    st = core_fail(err, ASCR_EGEOM,
                   "%s: the contour is open: its end points (lines %ld and %ld) are %.4g chords "
                   "apart; a trailing-edge gap above %.2g chords is not accepted",
                   src, cl[0], cl[m - 1], gap0 / xr, ASCR_GEOM_MAX_TE_GAP);
    goto done;
  }
  /* ---- crossings */
  st = geom_check_crossing(cx, cy, cl, m, gap0 > 1e-12 * xr, src, err);
  if (st != ASCR_OK) {
    goto done;
  }

  /* ---- normalisation */
  double tx = 0.5 * (cx[0] + cx[m - 1]), ty = 0.5 * (cy[0] + cy[m - 1]);
  size_t ile = 0;
  int already = 0;
  if (fabs(tx - 1.0) < 1e-4 && fabs(ty) < 1e-4) {
    for (size_t i = 1; i + 1 < m; i++) {
      if (hypot(cx[i], cy[i]) < 1e-6) {
        ile = i;
        already = 1;
        break;
      }
    }
  }
  if (!already) {
    double dmax = -1.0;
    for (size_t i = 1; i + 1 < m; i++) {
      double d = hypot(cx[i] - tx, cy[i] - ty);
      if (d > dmax) {
        dmax = d;
        ile = i;
      }
    }
  }
  double lx = cx[ile], ly = cy[ile];
  double chord = hypot(tx - lx, ty - ly);
  double rot = atan2(ty - ly, tx - lx);
  li.chord_orig = already ? 1.0 : chord;
  li.rotation_deg = already ? 0.0 : -rot * 180.0 / ASCR_PI;
  li.le_x_orig = already ? 0.0 : lx;
  li.le_y_orig = already ? 0.0 : ly;
  if (!already) {
    double c = cos(rot), s = sin(rot);
    for (size_t i = 0; i < m; i++) {
      double dx = cx[i] - lx, dy = cy[i] - ly;
      cx[i] = (c * dx + s * dy) / chord;
      cy[i] = (-s * dx + c * dy) / chord;
    }
    cx[ile] = 0.0;
    cy[ile] = 0.0;
  }
  if (ile == 0 || ile + 1 >= m) {
    st = core_fail(err, ASCR_EGEOM, "%s: no leading edge between the two trailing-edge points",
                   src);
    goto done;
  }
  /* ---- a wing section lies within half a chord of its chord line (the thickest sections in
   * use are near 40 % thick) and between its nose and tail: a far-off point is a typo or a
   * stray number (and would make the arc length lose its precision) */
  for (size_t i = 0; i < m; i++) {
    if (!(fabs(cy[i]) <= 0.5) || !(cx[i] >= -0.1 && cx[i] <= 1.1)) {
      st = core_fail(err, ASCR_EGEOM,
                     "%s:%ld: point lies at (%.4g, %.4g) chords from the nose, far outside a wing "
                     "section (within 0.5 chord of the chord line expected)",
                     src, cl[i], cx[i], cy[i]);
      goto done;
    }
  }
  /* ---- surfaces must run forward from the nose */
  st = geom_check_monotone(cx, cl, m, ile, src, err);
  if (st != ASCR_OK) {
    goto done;
  }

  ascr_geom_section *s = geom_section_new(m, name);
  if (s == NULL) {
    st = core_fail(err, ASCR_ENOMEM, "%s: out of memory", src);
    goto done;
  }
  memcpy(s->x, cx, m * sizeof *cx);
  memcpy(s->y, cy, m * sizeof *cy);
  s->i_le = ile;
  li.n_points_read = n;
  li.te_gap = hypot(cx[0] - cx[m - 1], cy[0] - cy[m - 1]);
  if (info != NULL) {
    char title[sizeof li.title];
    memcpy(title, info->title, sizeof title);
    *info = li;
    memcpy(info->title, title, sizeof title);
  }
  *out = s;

done:
  free(cx);
  free(cy);
  free(cl);
  return st;
}

ascr_status ascr_geom_section_from_points(const double *x, const double *y, size_t n,
                                          const char *name, ascr_geom_section **out,
                                          ascr_geom_load_info *info, ascr_errbuf *err)
{
  if (out == NULL) {
    return core_fail(err, ASCR_EINVAL, "section from points: NULL output pointer");
  }
  *out = NULL;
  if (x == NULL || y == NULL) {
    return core_fail(err, ASCR_EINVAL, "section from points: NULL coordinate array");
  }
  for (size_t i = 0; i < n; i++) {
    if (!isfinite(x[i]) || !isfinite(y[i])) {
      return core_fail(err, ASCR_EPARSE, "%s: point %zu: non-finite coordinate",
                       name != NULL ? name : "points", i + 1);
    }
  }
  long *line = core_calloc(n > 0 ? n : 1, sizeof *line);
  if (line == NULL) {
    return core_fail(err, ASCR_ENOMEM, "section from points: out of memory");
  }
  for (size_t i = 0; i < n; i++) {
    line[i] = (long)i + 1;
  }
  if (info != NULL) {
    info->title[0] = '\0';
  }
  const char *nm = name != NULL ? name : "points";
  ascr_status st = geom_build(x, y, line, n, 0, nm, nm, out, info, err);
  free(line);
  return st;
}
