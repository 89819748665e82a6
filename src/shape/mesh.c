/* src/shape/mesh.c
 * Checks and output of a closed triangle mesh (include/airscrew/ascr_shape.h): the edge and
 * degeneracy checks, the volume by the divergence theorem, binary STL.
 */
#include "core/core_impl.h"
#include "airscrew/ascr_shape.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

typedef struct edge {
  size_t a, b; /* a < b */
  int dir;     /* +1 if the triangle runs a -> b, -1 if b -> a */
} edge;

static int cmp_edge(const void *pa, const void *pb)
{
  const edge *x = pa, *y = pb;
  if (x->a != y->a) return x->a < y->a ? -1 : 1;
  if (x->b != y->b) return x->b < y->b ? -1 : 1;
  return x->dir - y->dir;
}

size_t ascr_mesh_defects(const ascr_mesh *m)
{
  if (m == NULL || m->n_triangles == 0) return 1;
  size_t ne = 3 * m->n_triangles, bad = 0;
  edge *e = malloc(ne * sizeof *e);
  if (e == NULL) return (size_t)-1;
  for (size_t t = 0; t < m->n_triangles; t++) {
    const size_t *q = m->t + 3 * t;
    const double *p0 = m->v + 3 * q[0], *p1 = m->v + 3 * q[1], *p2 = m->v + 3 * q[2];
    double u[3] = {p1[0] - p0[0], p1[1] - p0[1], p1[2] - p0[2]};
    double w[3] = {p2[0] - p0[0], p2[1] - p0[1], p2[2] - p0[2]};
    double c[3] = {u[1] * w[2] - u[2] * w[1], u[2] * w[0] - u[0] * w[2], u[0] * w[1] - u[1] * w[0]};
    double lu = u[0] * u[0] + u[1] * u[1] + u[2] * u[2], lw = w[0] * w[0] + w[1] * w[1] + w[2] * w[2];
    /* degenerate: zero area against the edges' lengths (a sliver of 1e-12 relative) */
    if (!(c[0] * c[0] + c[1] * c[1] + c[2] * c[2] > 1e-24 * lu * lw)) bad++;
    for (int k = 0; k < 3; k++) {
      size_t a = q[k], b = q[(k + 1) % 3];
      e[3 * t + (size_t)k] = a < b ? (edge){a, b, 1} : (edge){b, a, -1};
    }
  }
  qsort(e, ne, sizeof *e, cmp_edge);
  /* each undirected edge exactly twice, once in each direction */
  for (size_t i = 0; i < ne;) {
    size_t j = i;
    while (j < ne && e[j].a == e[i].a && e[j].b == e[i].b) j++;
    if (j - i != 2 || e[i].dir == e[i + 1].dir) bad++;
    i = j;
  }
  free(e);
  return bad;
}

double ascr_mesh_volume(const ascr_mesh *m)
{
  double v = 0.0;
  for (size_t t = 0; m != NULL && t < m->n_triangles; t++) {
    const double *a = m->v + 3 * m->t[3 * t], *b = m->v + 3 * m->t[3 * t + 1], *c = m->v + 3 * m->t[3 * t + 2];
    v += a[0] * (b[1] * c[2] - b[2] * c[1]) - a[1] * (b[0] * c[2] - b[2] * c[0]) +
         a[2] * (b[0] * c[1] - b[1] * c[0]);
  }
  return v / 6.0;
}

static void put_f32(unsigned char *p, double x)
{
  float f = (float)x;
  uint32_t u;
  memcpy(&u, &f, 4);
  p[0] = (unsigned char)(u & 0xff);
  p[1] = (unsigned char)((u >> 8) & 0xff);
  p[2] = (unsigned char)((u >> 16) & 0xff);
  p[3] = (unsigned char)((u >> 24) & 0xff);
}

ascr_status ascr_mesh_stl(const ascr_mesh *m, const char *header, unsigned char **buf, size_t *len,
                          ascr_errbuf *err)
{
  if (m == NULL || buf == NULL || len == NULL || m->n_triangles > 0xffffffffu) {
    return core_fail(err, ASCR_EINVAL, "STL: bad arguments");
  }
  size_t n = 84 + 50 * m->n_triangles;
  unsigned char *b = calloc(n, 1);
  if (b == NULL) return core_fail(err, ASCR_ENOMEM, "STL: out of memory");
  /* the header must not begin with "solid" (that marks the text form) */
  const char *h = header != NULL ? header : "airscrew blade, millimetres";
  size_t hl = strlen(h);
  memcpy(b, h, hl < 80 ? hl : 80);
  if (hl >= 5 && memcmp(b, "solid", 5) == 0) b[0] = 'S';
  uint32_t nt = (uint32_t)m->n_triangles;
  b[80] = (unsigned char)(nt & 0xff);
  b[81] = (unsigned char)((nt >> 8) & 0xff);
  b[82] = (unsigned char)((nt >> 16) & 0xff);
  b[83] = (unsigned char)((nt >> 24) & 0xff);
  for (size_t t = 0; t < m->n_triangles; t++) {
    unsigned char *p = b + 84 + 50 * t;
    const double *v[3];
    for (int k = 0; k < 3; k++) v[k] = m->v + 3 * m->t[3 * t + (size_t)k];
    double u[3], w[3];
    for (int k = 0; k < 3; k++) {
      u[k] = v[1][k] - v[0][k];
      w[k] = v[2][k] - v[0][k];
    }
    double c[3] = {u[1] * w[2] - u[2] * w[1], u[2] * w[0] - u[0] * w[2], u[0] * w[1] - u[1] * w[0]};
    double l = sqrt(c[0] * c[0] + c[1] * c[1] + c[2] * c[2]);
    for (int k = 0; k < 3; k++) put_f32(p + 4 * k, l > 0.0 ? c[k] / l : 0.0);
    for (int q = 0; q < 3; q++) {
      for (int k = 0; k < 3; k++) put_f32(p + 12 + 12 * q + 4 * k, 1000.0 * v[q][k]); /* mm */
    }
  }
  *buf = b;
  *len = n;
  return ASCR_OK;
}
