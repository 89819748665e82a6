/* src/shape/loft.c
 * A blade (and the propeller around its hub) as a closed triangle mesh lofted through its
 * sections (include/airscrew/ascr_shape.h; docs/theory/structure.md, "The printable shape").
 */
#include "core/core_impl.h"
#include "rotor/rotor_impl.h"
#include "airscrew/ascr_shape.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

#define DEG (ASCR_PI / 180.0)
#define ROOT_RINGS 8 /* rings of the blended root between the hub surface and the root station */

ascr_shape_params ascr_shape_params_defaults(void)
{
  ascr_shape_params p;
  memset(&p, 0, sizeof p);
  p.n_chord = 41;
  p.n_span = 61;
  p.pitch_axis = 0.25;
  p.hub_segments = 48;
  p.root_thickening = 2.0;
  return p;
}

typedef struct mesh_build {
  ascr_mesh *m;
  size_t cap_v, cap_t;
  int failed;
} mesh_build;

static size_t add_vertex(mesh_build *b, double x, double y, double z)
{
  ascr_mesh *m = b->m;
  if (m->n_vertices == b->cap_v) {
    size_t c = b->cap_v ? 2 * b->cap_v : 1024;
    double *v = realloc(m->v, 3 * c * sizeof *v);
    if (v == NULL) {
      b->failed = 1;
      return 0;
    }
    m->v = v;
    b->cap_v = c;
  }
  double *q = m->v + 3 * m->n_vertices;
  q[0] = x;
  q[1] = y;
  q[2] = z;
  return m->n_vertices++;
}

static void add_tri(mesh_build *b, size_t i, size_t j, size_t k)
{
  ascr_mesh *m = b->m;
  if (i == j || j == k || k == i) return; /* a merged trailing edge: no triangle */
  if (m->n_triangles == b->cap_t) {
    size_t c = b->cap_t ? 2 * b->cap_t : 2048;
    size_t *t = realloc(m->t, 3 * c * sizeof *t);
    if (t == NULL) {
      b->failed = 1;
      return;
    }
    m->t = t;
    b->cap_t = c;
  }
  size_t *q = m->t + 3 * m->n_triangles;
  q[0] = i;
  q[1] = j;
  q[2] = k;
  m->n_triangles++;
}

/* y of one surface of section s at chord fraction xi (0 LE, 1 TE): the side runs from the
 * leading-edge node le towards node end; x interpolated linearly along it. 0 if xi is not
 * bracketed. */
static int side_y(const ascr_geom_section *s, size_t le, size_t end, double xi, double *y)
{
  const double *x = ascr_geom_section_x(s), *yy = ascr_geom_section_y(s);
  double x0 = x[le], x1 = x[end], xt = x0 + xi * (x1 - x0);
  long step = end > le ? 1 : -1;
  for (size_t i = le; i != end; i = (size_t)((long)i + step)) {
    size_t j = (size_t)((long)i + step);
    double a = x[i], c = x[j];
    if ((a <= xt && xt <= c) || (c <= xt && xt <= a)) {
      double f = c != a ? (xt - a) / (c - a) : 0.0;
      *y = yy[i] + f * (yy[j] - yy[i]);
      return 1;
    }
  }
  if (xi >= 1.0) {
    *y = yy[end];
    return 1;
  }
  return 0;
}

/* chord fractions xi[k] and the upper and lower y of section s there (chord units, x from the
 * leading edge), k < K */
static int sample(const ascr_geom_section *s, size_t K, double *xi, double *yu, double *yl)
{
  size_t n = ascr_geom_section_size(s), le = ascr_geom_section_le_index(s);
  if (n < 5 || le == 0 || le + 1 >= n) return 0;
  for (size_t k = 0; k < K; k++) {
    xi[k] = 0.5 * (1.0 - cos(ASCR_PI * (double)k / (double)(K - 1)));
    if (!side_y(s, le, 0, xi[k], &yu[k]) || !side_y(s, le, n - 1, xi[k], &yl[k])) return 0;
  }
  return 1;
}

/* the section at radius r: chord, twist, and the blended upper and lower surfaces at xi */
typedef struct st_ring {
  double r, chord, twist_deg;
  int closed;
} st_ring;

/* Thickness factor of the blended root at radius r (rh the hub radius, r0 the root station):
 * 1 from the root station out, rising to k at the hub surface as 3 s^2 - 2 s^3 of s = (r0 - r) /
 * (r0 - rh) (level at both ends: the blade's surface goes on smoothly from the root station),
 * k inside the hub. */
static double root_factor(const ascr_shape_params *p, double r, double r0, double rh)
{
  if (p->blade_only || r >= r0 || !(p->root_thickening > 1.0)) return 1.0;
  double s = rh < r0 ? (r0 - r) / (r0 - rh) : 1.0;
  if (s > 1.0) s = 1.0;
  return 1.0 + (p->root_thickening - 1.0) * s * s * (3.0 - 2.0 * s);
}

static ascr_status ring_at(const ascr_blade *bl, const ascr_geom_section *const *secs,
                           const ascr_shape_params *p, double r, double *xi, double *yu, double *yl,
                           double *yu1, double *yl1, st_ring *out, ascr_errbuf *err)
{
  size_t K = p->n_chord, s0, s1;
  double w;
  out->r = r;
  rotor_blade_at(bl, fmax(r, bl->stations[0].r_m), &out->chord, &out->twist_deg, &s0, &s1, &w);
  out->twist_deg += bl->pitch_offset_deg;
  if (!sample(secs[s0], K, xi, yu, yl)) {
    return core_fail(err, ASCR_EGEOM, "shape: section %zu: its surfaces cannot be sampled along "
                     "the chord (each must run from the leading to the trailing edge)", s0);
  }
  if (s1 != s0 && w > 0.0) {
    if (!sample(secs[s1], K, xi, yu1, yl1)) {
      return core_fail(err, ASCR_EGEOM, "shape: section %zu: its surfaces cannot be sampled "
                       "along the chord", s1);
    }
    for (size_t k = 0; k < K; k++) {
      yu[k] = (1.0 - w) * yu[k] + w * yu1[k];
      yl[k] = (1.0 - w) * yl[k] + w * yl1[k];
    }
  }
  /* the blended root: the thickness about the mean line scaled (a closed trailing edge stays
   * closed) */
  double rh = p->hub_radius_m > 0.0 ? p->hub_radius_m : bl->r_hub_m > 0.0 ? bl->r_hub_m : 0.8 * bl->stations[0].r_m;
  double kf = root_factor(p, r, bl->stations[0].r_m, rh);
  if (kf != 1.0) {
    for (size_t k = 0; k < K; k++) {
      double yc = 0.5 * (yu[k] + yl[k]), ht = 0.5 * (yu[k] - yl[k]);
      yu[k] = yc + kf * ht;
      yl[k] = yc - kf * ht;
    }
  }
  out->closed = fabs(yu[K - 1] - yl[K - 1]) < 1e-9;
  return ASCR_OK;
}

/* the point at ring position q (counter-clockwise in the section: upper TE to LE to lower TE),
 * counter-clockwise rotation (the caller mirrors y for clockwise) */
static void ring_point(const st_ring *r, const ascr_shape_params *p, size_t q, size_t K,
                       const double *xi, const double *yu, const double *yl, double *X, double *Y,
                       double *Z)
{
  size_t k;
  int side;
  if (q <= K - 1) {
    side = 0;
    k = K - 1 - q;
  } else {
    side = 1;
    k = q - (K - 1);
  }
  double th = r->twist_deg * DEG, c = cos(th), s = sin(th);
  double u = (xi[k] - p->pitch_axis) * r->chord, v = (side == 0 ? yu[k] : yl[k]) * r->chord;
  /* chord direction (0, -cos, -sin), suction-side normal (0, -sin, cos) */
  *X = r->r;
  *Y = -u * c - v * s;
  *Z = -u * s + v * c;
}

typedef struct ring_geo {
  size_t K;
  int closed_te;          /* the upper and lower trailing edges coincide: one vertex */
} ring_geo;

/* ring position of the upper (side 0) or lower (side 1) surface point k (0: the LE) */
static size_t ring_pos(const ring_geo *g, int side, size_t k)
{
  if (k == 0) return g->K - 1;
  if (side == 0) return g->K - 1 - k;
  if (g->closed_te && k == g->K - 1) return 0;
  return g->K - 1 + k;
}

static size_t ring_size(const ring_geo *g) { return g->closed_te ? 2 * g->K - 2 : 2 * g->K - 1; }

/* the ends: strips between the surfaces, in ring order (face toward +r) or reversed */
static void cap(mesh_build *b, const ring_geo *g, size_t base, int reversed)
{
  for (size_t k = 0; k + 1 < g->K; k++) {
    size_t u0 = base + ring_pos(g, 0, k), l0 = base + ring_pos(g, 1, k);
    size_t u1 = base + ring_pos(g, 0, k + 1), l1 = base + ring_pos(g, 1, k + 1);
    if (k == 0) {
      if (reversed) add_tri(b, u0, u1, l1);
      else add_tri(b, u0, l1, u1);
      continue;
    }
    if (reversed) {
      add_tri(b, u0, u1, l0);
      add_tri(b, u1, l1, l0);
    } else {
      add_tri(b, u0, l0, u1);
      add_tri(b, u1, l0, l1);
    }
  }
}

/* one blade as a closed shell, rotated by angle psi about z; rings at radii rr[0 .. nr-1] (the
 * first ones inside the hub use the root station's section, chord and twist) */
static ascr_status blade_shell(mesh_build *b, const ascr_blade *bl, const ascr_geom_section *const *secs,
                               const ascr_shape_params *p, const double *rr, size_t nr, double psi,
                               double *xi, double *yu, double *yl, double *yu1, double *yl1,
                               ascr_errbuf *err)
{
  size_t K = p->n_chord;
  ring_geo g = {K, 0};
  double sgn = bl->rotation < 0 ? -1.0 : 1.0, cps = cos(psi), sps = sin(psi);
  size_t first = b->m->n_vertices;
  for (size_t j = 0; j < nr; j++) {
    st_ring r;
    ascr_status st = ring_at(bl, secs, p, rr[j], xi, yu, yl, yu1, yl1, &r, err);
    if (st != ASCR_OK) return st;
    if (j == 0) g.closed_te = r.closed;
    else if (r.closed && !g.closed_te) yl[K - 1] -= 1e-6; /* keep the first ring's topology */
    size_t R = ring_size(&g);
    for (size_t q = 0; q < R; q++) {
      double X, Y, Z;
      ring_point(&r, p, q, K, xi, yu, yl, &X, &Y, &Z);
      Y *= sgn;
      add_vertex(b, cps * X - sps * Y, sps * X + cps * Y, Z);
    }
  }
  if (b->failed) return core_fail(err, ASCR_ENOMEM, "shape: out of memory");
  size_t R = ring_size(&g);
  for (size_t j = 0; j + 1 < nr; j++) {
    size_t a0 = first + j * R, a1 = first + (j + 1) * R;
    for (size_t q = 0; q < R; q++) {
      size_t qn = (q + 1) % R;
      add_tri(b, a0 + q, a0 + qn, a1 + qn);
      add_tri(b, a0 + q, a1 + qn, a1 + q);
    }
  }
  cap(b, &g, first, 1);
  cap(b, &g, first + (nr - 1) * R, 0);
  b->m->n_shells++;
  return b->failed ? core_fail(err, ASCR_ENOMEM, "shape: out of memory") : ASCR_OK;
}

/* a closed cylinder about z: radius rh, z from -h/2 to h/2 */
static void hub_shell(mesh_build *b, double rh, double h, size_t nseg)
{
  size_t base = b->m->n_vertices;
  for (size_t i = 0; i < nseg; i++) {
    double a = 2.0 * ASCR_PI * (double)i / (double)nseg;
    add_vertex(b, rh * cos(a), rh * sin(a), -0.5 * h);
    add_vertex(b, rh * cos(a), rh * sin(a), 0.5 * h);
  }
  size_t cb = add_vertex(b, 0.0, 0.0, -0.5 * h), ct = add_vertex(b, 0.0, 0.0, 0.5 * h);
  for (size_t i = 0; i < nseg; i++) {
    size_t j = (i + 1) % nseg;
    size_t b0 = base + 2 * i, t0 = b0 + 1, b1 = base + 2 * j, t1 = b1 + 1;
    add_tri(b, b0, b1, t1); /* outward: counter-clockwise seen from outside */
    add_tri(b, b0, t1, t0);
    add_tri(b, cb, b1, b0);
    add_tri(b, ct, t0, t1);
  }
  b->m->n_shells++;
}

void ascr_mesh_free(ascr_mesh *m)
{
  if (m == NULL) return;
  free(m->v);
  free(m->t);
  memset(m, 0, sizeof *m);
}

ascr_status ascr_blade_mesh(const ascr_blade *bl, const ascr_geom_section *const *secs,
                            const ascr_shape_params *pin, ascr_mesh *out, ascr_errbuf *err)
{
  ascr_shape_params p = pin != NULL ? *pin : ascr_shape_params_defaults();
  if (bl == NULL || secs == NULL || out == NULL || p.n_chord < 5 || p.n_chord > 2000 ||
      p.n_span < 2 || p.n_span > 5000 || !(p.pitch_axis >= 0.0 && p.pitch_axis <= 1.0) ||
      p.hub_segments < 8 || p.hub_segments > 4096 || !(p.hub_radius_m >= 0.0) || !(p.hub_height_m >= 0.0) ||
      !(p.root_thickening >= 1.0 && p.root_thickening <= 5.0)) {
    return core_fail(err, ASCR_EINVAL, "shape: bad arguments (5 .. 2000 chord points, 2 .. 5000 "
                     "rings, pitch axis 0 .. 1, 8 .. 4096 hub facets, root thickening 1 .. 5)");
  }
  ascr_status st = ascr_blade_validate(bl, err);
  if (st != ASCR_OK) return st;
  for (size_t i = 0; i < bl->n_sections; i++) {
    if (secs[i] == NULL) return core_fail(err, ASCR_EINVAL, "shape: no contour for section %zu", i);
  }
  memset(out, 0, sizeof *out);
  mesh_build b = {out, 0, 0, 0};
  size_t K = p.n_chord;
  double *buf = calloc(5 * K + p.n_span + 8 + ROOT_RINGS, sizeof *buf);
  if (buf == NULL) return core_fail(err, ASCR_ENOMEM, "shape: out of memory");
  double *xi = buf, *yu = xi + K, *yl = yu + K, *yu1 = yl + K, *yl1 = yu1 + K, *rr = yl1 + K;
  double r0 = bl->stations[0].r_m, r1 = bl->r_tip_m;
  /* the hub: the blade's hub radius, else 80 % of the root radius */
  double rh = p.hub_radius_m > 0.0 ? p.hub_radius_m : bl->r_hub_m > 0.0 ? bl->r_hub_m : 0.8 * r0;
  size_t nr = 0;
  if (!p.blade_only) {
    /* the root section carried into the hub (to half its radius) so that the shells overlap,
     * blended from the root station to the hub surface (root_factor) over ROOT_RINGS rings */
    double rin = fmin(0.5 * rh, 0.9 * r0);
    rr[nr++] = rin;
    if (rh < r0 && rh > rin) {
      for (size_t j = 0; j < ROOT_RINGS; j++) rr[nr++] = rh + (r0 - rh) * (double)j / (double)ROOT_RINGS;
    }
  }
  for (size_t j = 0; j < p.n_span; j++) rr[nr++] = r0 + (r1 - r0) * (double)j / (double)(p.n_span - 1);
  int nb = p.blade_only ? 1 : bl->n_blades;
  for (int k = 0; k < nb && st == ASCR_OK; k++) {
    st = blade_shell(&b, bl, secs, &p, rr, nr, 2.0 * ASCR_PI * k / nb, xi, yu, yl, yu1, yl1, err);
  }
  if (st == ASCR_OK && !p.blade_only) {
    double h = p.hub_height_m;
    if (!(h > 0.0)) {
      /* 1.2 x the axial extent of the first ring */
      double zl = HUGE_VAL, zh = -HUGE_VAL;
      size_t R = 2 * K - 1;
      for (size_t q = 0; q < R && q < out->n_vertices; q++) {
        zl = fmin(zl, out->v[3 * q + 2]);
        zh = fmax(zh, out->v[3 * q + 2]);
      }
      h = 1.2 * (zh - zl);
    }
    hub_shell(&b, rh, h, p.hub_segments);
  }
  free(buf);
  if (st == ASCR_OK && b.failed) st = core_fail(err, ASCR_ENOMEM, "shape: out of memory");
  if (st != ASCR_OK) {
    ascr_mesh_free(out);
    return st;
  }
  /* outward orientation: each blade shell was built with one convention; if its volume is
   * negative every blade triangle is turned (the hub is built outward) */
  size_t nbt = out->n_triangles - (p.blade_only ? 0 : 4 * p.hub_segments);
  double vol = 0.0;
  for (size_t t = 0; t < nbt; t++) {
    const double *a = out->v + 3 * out->t[3 * t], *c = out->v + 3 * out->t[3 * t + 1],
                 *d = out->v + 3 * out->t[3 * t + 2];
    vol += a[0] * (c[1] * d[2] - c[2] * d[1]) - a[1] * (c[0] * d[2] - c[2] * d[0]) +
           a[2] * (c[0] * d[1] - c[1] * d[0]);
  }
  if (vol < 0.0) {
    for (size_t t = 0; t < nbt; t++) {
      size_t s = out->t[3 * t + 1];
      out->t[3 * t + 1] = out->t[3 * t + 2];
      out->t[3 * t + 2] = s;
    }
  }
  return ASCR_OK;
}

ascr_status ascr_blade_section_points(const ascr_blade *bl, const ascr_geom_section *const *secs,
                                      const ascr_shape_params *pin, double r_m, double *xyz,
                                      size_t *n, ascr_errbuf *err)
{
  ascr_shape_params p = pin != NULL ? *pin : ascr_shape_params_defaults();
  if (bl == NULL || secs == NULL || xyz == NULL || n == NULL || p.n_chord < 5 || p.n_chord > 2000 ||
      !(r_m >= bl->stations[0].r_m && r_m <= bl->r_tip_m)) {
    return core_fail(err, ASCR_EINVAL, "shape: bad arguments (a radius on the blade)");
  }
  size_t K = p.n_chord;
  double *buf = calloc(5 * K, sizeof *buf);
  if (buf == NULL) return core_fail(err, ASCR_ENOMEM, "shape: out of memory");
  st_ring r;
  ascr_status st = ring_at(bl, secs, &p, r_m, buf, buf + K, buf + 2 * K, buf + 3 * K, buf + 4 * K, &r, err);
  if (st == ASCR_OK) {
    for (size_t q = 0; q < 2 * K - 1; q++) {
      ring_point(&r, &p, q, K, buf, buf + K, buf + 2 * K, &xyz[3 * q], &xyz[3 * q + 1], &xyz[3 * q + 2]);
      if (bl->rotation < 0) xyz[3 * q + 1] = -xyz[3 * q + 1];
    }
    *n = 2 * K - 1;
  }
  free(buf);
  return st;
}
