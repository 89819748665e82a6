/* src/geom/validate.c
 * Checks that a point list is a usable section contour: no repeated consecutive points, no
 * crossing segments, and surfaces that run forward (in x) from the nose to the trailing edge.
 *
 * Method. Repeats: consecutive points closer than 1e-9 of the x-range. Crossings: all pairs of
 * non-adjacent segments are tested with the orientation (cross-product sign) test (touching
 * counts: a contour that passes a point twice is not a section), after a
 * sweep over segments sorted by their smallest x so that only pairs whose x-ranges overlap are
 * compared (O(n log n) for a section, where few segments share an x-range); a crossing of the
 * segments next to the trailing edge within 1e-4 chord of it is tolerated (five-decimal
 * rounding in tabulated files makes them cross there). Doubling back:
 * walking each surface away from the leading edge, x must not fall by more than 1e-6 chord
 * once past the nose region x/c < 0.05 (where a drooped nose may legitimately turn back).
 */
#include "geom/geom_impl.h"
#include "core/core_impl.h"

#include <math.h>
#include <stdlib.h>

ascr_status geom_check_repeats(const double *x, const double *y, const long *line, size_t n,
                               double scale, const char *src, ascr_errbuf *err)
{
  for (size_t i = 1; i < n; i++) {
    if (hypot(x[i] - x[i - 1], y[i] - y[i - 1]) <= 1e-9 * scale) {
      return core_fail(err, ASCR_EGEOM, "%s:%ld: repeated point (%.9g, %.9g) (same as line %ld)",
                       src, line[i], x[i], y[i], line[i - 1]);
    }
  }
  return ASCR_OK;
}

typedef struct seg {
  double xlo, xhi;
  size_t i; /* segment from node i to node (i+1) % n */
} seg;

static int seg_cmp(const void *a, const void *b)
{
  const seg *p = a, *q = b;
  return (p->xlo > q->xlo) - (p->xlo < q->xlo);
}

static double orient(double ax, double ay, double bx, double by, double cx, double cy)
{
  return (bx - ax) * (cy - ay) - (by - ay) * (cx - ax);
}

/* Is c inside the bounding box of segment ab (c collinear with it: c on the segment)? */
static int on_box(double ax, double ay, double bx, double by, double cx, double cy)
{
  return fmin(ax, bx) <= cx && cx <= fmax(ax, bx) && fmin(ay, by) <= cy && cy <= fmax(ay, by);
}

/* Proper or touching intersection of segments pq and rs. */
static int segments_cross(double px, double py, double qx, double qy, double rx, double ry,
                          double sx, double sy)
{
  double d1 = orient(px, py, qx, qy, rx, ry);
  double d2 = orient(px, py, qx, qy, sx, sy);
  double d3 = orient(rx, ry, sx, sy, px, py);
  double d4 = orient(rx, ry, sx, sy, qx, qy);
  if (((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0))) {
    return 1;
  }
  /* touching: an end of one segment on the other (zero orientation and inside its bounding
   * box), which includes a point the contour passes twice and exact collinear overlaps; the
   * callers skip adjacent segments, which share a node by construction */
  if (d1 == 0 && on_box(px, py, qx, qy, rx, ry)) return 1;
  if (d2 == 0 && on_box(px, py, qx, qy, sx, sy)) return 1;
  if (d3 == 0 && on_box(rx, ry, sx, sy, px, py)) return 1;
  if (d4 == 0 && on_box(rx, ry, sx, sy, qx, qy)) return 1;
  return 0;
}

/* 1 if both segments touch the trailing-edge region: each has an end node within tol of one
 * of the two trailing-edge nodes. */
static int near_te(const double *x, const double *y, size_t n, size_t i, size_t k, double tol)
{
  size_t ends[2] = {i, k};
  for (int q = 0; q < 2; q++) {
    size_t a = ends[q], b = (ends[q] + 1) % n;
    int hit = 0;
    size_t te[2] = {0, n - 1};
    for (int t = 0; t < 2 && !hit; t++) {
      if (hypot(x[a] - x[te[t]], y[a] - y[te[t]]) <= tol || hypot(x[b] - x[te[t]], y[b] - y[te[t]]) <= tol) hit = 1;
    }
    if (!hit) return 0;
  }
  return 1;
}

ascr_status geom_check_crossing(const double *x, const double *y, const long *line, size_t n,
                                int closed_base, const char *src, ascr_errbuf *err)
{
  double xmin = x[0], xmax = x[0];
  for (size_t i = 1; i < n; i++) {
    xmin = fmin(xmin, x[i]);
    xmax = fmax(xmax, x[i]);
  }
  /* a crossing between segments that both end at a trailing-edge node is tolerated when those
   * nodes lie within 1e-4 of the x-range (rounding in tabulated files) */
  const double tol_te = 1e-4 * (xmax - xmin);
  size_t ns = closed_base ? n : n - 1;
  seg *sg = core_calloc(ns, sizeof *sg);
  if (sg == NULL) {
    return core_fail(err, ASCR_ENOMEM, "%s: out of memory checking crossings", src);
  }
  for (size_t i = 0; i < ns; i++) {
    size_t j = (i + 1) % n;
    sg[i].xlo = fmin(x[i], x[j]);
    sg[i].xhi = fmax(x[i], x[j]);
    sg[i].i = i;
  }
  qsort(sg, ns, sizeof *sg, seg_cmp);
  ascr_status st = ASCR_OK;
  for (size_t a = 0; a < ns && st == ASCR_OK; a++) {
    for (size_t b = a + 1; b < ns && sg[b].xlo <= sg[a].xhi; b++) {
      size_t i = sg[a].i, k = sg[b].i;
      size_t i1 = (i + 1) % n, k1 = (k + 1) % n;
      /* adjacent segments share a node; also the first and last segments when closed */
      if (i1 == k || k1 == i || i == k) {
        continue;
      }
      if (!closed_base && ((i == 0 && k == n - 2) || (k == 0 && i == n - 2))) {
        /* first and last segments of a contour closed at one trailing-edge point */
        if (x[0] == x[n - 1] && y[0] == y[n - 1]) {
          continue;
        }
      }
      if (segments_cross(x[i], y[i], x[i1], y[i1], x[k], y[k], x[k1], y[k1])) {
        /* tabulated files rounded to five decimals often make the two trailing-edge segments
         * cross within a few 1e-5 chords of the trailing edge: tolerated there */
        if (near_te(x, y, n, i, k, tol_te)) {
          continue;
        }
        size_t lo = i < k ? i : k, hi = i < k ? k : i;
        st = core_fail(err, ASCR_EGEOM,
                       "%s:%ld: the contour crosses itself: the segment from line %ld to line %ld "
                       "crosses the segment from line %ld to line %ld",
                       src, line[hi], line[lo], line[(lo + 1) % n], line[hi], line[(hi + 1) % n]);
      }
    }
  }
  free(sg);
  return st;
}

ascr_status geom_check_monotone(const double *x, const long *line, size_t n, size_t i_le,
                                const char *src, ascr_errbuf *err)
{
  const double nose = 0.05, tol = 1e-6;
  /* upper surface: from the leading edge (i_le) toward node 0 */
  for (size_t i = i_le; i-- > 0;) {
    if (x[i] > nose && x[i + 1] > nose && x[i] < x[i + 1] - tol) {
      return core_fail(err, ASCR_EGEOM,
                       "%s:%ld: the upper surface doubles back: x/c falls from %.4f (line %ld) to "
                       "%.4f", src, line[i], x[i + 1], line[i + 1], x[i]);
    }
  }
  for (size_t i = i_le + 1; i < n; i++) {
    if (x[i] > nose && x[i - 1] > nose && x[i] < x[i - 1] - tol) {
      return core_fail(err, ASCR_EGEOM,
                       "%s:%ld: the lower surface doubles back: x/c falls from %.4f (line %ld) to "
                       "%.4f", src, line[i], x[i - 1], line[i - 1], x[i]);
    }
  }
  return ASCR_OK;
}
