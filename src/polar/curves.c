/* src/polar/curves.c
 * Curves for section tables: computing them with the viscous solver, fingerprints and cache
 * keys, and polar-table files (JSON through jansson, schema ours: docs/file-formats.md) with a
 * checksum so that a damaged cache entry is detected and recomputed, never trusted.
 */
#define _POSIX_C_SOURCE 200809L /* mkstemp, fdopen */
#include "airscrew/ascr_table.h"
#include "airscrew/ascr_geom.h"
#include "airscrew/ascr_panel.h"
#include "airscrew/ascr_polar.h"
#include "airscrew/ascr_visc.h"
#include "core/core_impl.h"

#include <errno.h>
#include <jansson.h>
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <fcntl.h>
#include <unistd.h>

/* largest polar-table file read (a table of a few dozen curves is well under 1 MiB) */
#define TABLE_FILE_MAX ((size_t)64 << 20)

#define TABLE_FORMAT "airscrew-polar-table-1"

void ascr_curve_data_clear(ascr_curve_data *c)
{
  if (c == NULL) {
    return;
  }
  free(c->alpha_deg);
  free(c->cl);
  free(c->cd);
  free(c->cm);
  free(c->converged);
  free(c->trip_not_applied);
  memset(c, 0, sizeof *c);
}

void ascr_curve_trip_counts(const ascr_curve_data *c, size_t n[2])
{
  n[0] = n[1] = 0;
  for (size_t i = 0; c->trip_not_applied != NULL && i < c->n; i++) {
    if (!c->converged[i]) continue;
    n[0] += (size_t)(c->trip_not_applied[i] & 1);
    n[1] += (size_t)((c->trip_not_applied[i] >> 1) & 1);
  }
}

static int curve_alloc(ascr_curve_data *c, size_t n)
{
  c->n = n;
  c->alpha_deg = core_calloc(n, sizeof *c->alpha_deg);
  c->cl = core_calloc(n, sizeof *c->cl);
  c->cd = core_calloc(n, sizeof *c->cd);
  c->cm = core_calloc(n, sizeof *c->cm);
  c->converged = core_calloc(n, sizeof *c->converged);
  c->trip_not_applied = core_calloc(n, sizeof *c->trip_not_applied);
  if (c->alpha_deg == NULL || c->cl == NULL || c->cd == NULL || c->cm == NULL || c->converged == NULL ||
      c->trip_not_applied == NULL) {
    ascr_curve_data_clear(c);
    return 0;
  }
  return 1;
}

/* the panel count of a request: its own, or the one for its Re (0); the cache key holds the
 * count used, so that a request by Re and one naming the same count share their entries */
static size_t curve_panels(const ascr_curve_request *rq)
{
  return rq->n_panels > 0 ? rq->n_panels : ascr_geom_panels_for_re(rq->re);
}

ascr_curve_request ascr_curve_request_defaults(double re)
{
  ascr_curve_request r;
  r.re = re;
  r.mach = 0.0;
  r.ncrit = 9.0;
  r.trip_upper = 2.0;
  r.trip_lower = 2.0;
  r.alpha_lo_deg = -8.0;
  r.alpha_hi_deg = 16.0;
  r.alpha_step_deg = 1.0;
  r.n_panels = 0; /* by Re: ascr_geom_panels_for_re */
  return r;
}

ascr_status ascr_table_curve_compute(const ascr_geom_section *sec, const ascr_curve_request *rq,
                                     ascr_curve_data *out, ascr_errbuf *err)
{
  if (sec == NULL || rq == NULL || out == NULL) {
    return core_fail(err, ASCR_EINVAL, "table curve: bad arguments");
  }
  memset(out, 0, sizeof *out);
  size_t np = ascr_polar_grid_size(rq->alpha_lo_deg, rq->alpha_hi_deg, rq->alpha_step_deg);
  if (np == 0 || np > 2000) {
    return core_fail(err, ASCR_EINVAL, "table curve: bad angle range %g:%g:%g deg",
                     rq->alpha_lo_deg, rq->alpha_hi_deg, rq->alpha_step_deg);
  }
  ascr_geom_repanel_params rp = ascr_geom_repanel_defaults();
  rp.n_panels = curve_panels(rq);
  ascr_geom_section *s = NULL;
  ascr_panel_solver *ps = NULL;
  ascr_visc_solver *vs = NULL;
  ascr_polar_point *pts = NULL;
  ascr_status st = ascr_geom_section_repanel(sec, &rp, &s, err);
  if (st != ASCR_OK) {
    return st;
  }
  size_t nn = ascr_geom_section_size(s);
  ps = ascr_panel_solver_alloc(nn);
  vs = ascr_visc_solver_alloc(nn, ascr_visc_default_wake_nodes(nn));
  pts = core_calloc(np, sizeof *pts);
  if (ps == NULL || vs == NULL || pts == NULL) {
    st = core_fail(err, ASCR_ENOMEM, "table curve: out of memory");
    goto done;
  }
  st = ascr_panel_solver_set(ps, s, err);
  if (st != ASCR_OK) {
    goto done;
  }
  ascr_visc_params vp = ascr_visc_params_defaults();
  vp.re = rq->re;
  vp.mach = rq->mach;
  vp.ncrit = rq->ncrit;
  vp.trip_upper = rq->trip_upper;
  vp.trip_lower = rq->trip_lower;
  st = ascr_visc_solver_set(vs, ps, &vp, err);
  if (st != ASCR_OK) {
    goto done;
  }
  ascr_polar_summary sum;
  st = ascr_polar_sweep(vs, rq->alpha_lo_deg, rq->alpha_hi_deg, rq->alpha_step_deg, pts, &sum,
                        NULL, NULL, err);
  if (st != ASCR_OK) {
    goto done;
  }
  if (!curve_alloc(out, np)) {
    st = core_fail(err, ASCR_ENOMEM, "table curve: out of memory");
    goto done;
  }
  out->re = rq->re;
  out->mach = rq->mach;
  out->ncrit = rq->ncrit;
  out->trip_upper = rq->trip_upper;
  out->trip_lower = rq->trip_lower;
  for (size_t i = 0; i < np; i++) {
    out->alpha_deg[i] = pts[i].alpha_deg;
    out->converged[i] = pts[i].converged;
    out->trip_not_applied[i] = pts[i].converged ? pts[i].trip_not_applied & 3 : 0;
    out->cl[i] = pts[i].converged ? pts[i].cl : NAN;
    out->cd[i] = pts[i].converged ? pts[i].cd : NAN;
    out->cm[i] = pts[i].converged ? pts[i].cm : NAN;
  }
done:
  free(pts);
  ascr_visc_solver_free(vs);
  ascr_panel_solver_free(ps);
  ascr_geom_section_free(s);
  return st;
}

/* ---- fingerprints and keys -------------------------------------------------------------- */

static uint64_t fnv1a(uint64_t h, const char *s, size_t n)
{
  for (size_t i = 0; i < n; i++) {
    h ^= (unsigned char)s[i];
    h *= 0x100000001b3ULL;
  }
  return h;
}

#define FNV_OFFSET 0xcbf29ce484222325ULL

void ascr_section_fingerprint(const ascr_geom_section *sec, char out[17])
{
  uint64_t h = FNV_OFFSET;
  size_t n = ascr_geom_section_size(sec);
  const double *x = ascr_geom_section_x(sec), *y = ascr_geom_section_y(sec);
  for (size_t i = 0; i < n; i++) {
    char b[64];
    int k = snprintf(b, sizeof b, "%.9e %.9e\n", x[i], y[i]);
    h = fnv1a(h, b, (size_t)k);
  }
  snprintf(out, 17, "%016llx", (unsigned long long)h);
}

/* Raised whenever the viscous numerics change their results (so that cached curves computed by
 * the earlier numerics are not used): 2 = smooth transition crossing and transition check;
 * 3 = a cold retry computes its stagnation contexts from the inviscid edge velocities;
 * 4 = the exact transition formulation is the default (docs/theory/viscous.md);
 * 5 = warm starts begin at the secant predictor (which state a sweep reaches where two exist);
 * 6 = the march start's trailing edge and the predictor after a plain retry (which points
 * converge); 7 = the shape floor at the first stations and the line search's own contexts
 * (which points converge); 8 = the shape floor at the first stations with their stagnation-flow
 * ue, and the continuation's step control (which branch a sweep follows); 9 = a sweep's first
 * point reached from the zero-lift angle as a single point is (which branch a sweep follows);
 * 10 = upstream transition moves limited, a failed continuation step retried in halves
 * (2026-12-04, thirteenth session; the revision was not raised then) and the fresh start
 * through a provisional trip (which points converge, which branch a sweep follows); 11 = the
 * turbulent fits held above Preston's minimum Re_theta (every point with a young turbulent layer
 * or a wake at low Re) and the fresh starts from a lower floor (2026-12-04); 12 = the lag
 * thickness bounded by Coles' wake law (turbulent layers relaxing behind bubbles, post-stall
 * states; 2026-12-04); 13 = the single point's walk from zero lift along the 0.5-deg lattice
 * (a sweep's first point: which branch it follows; 2026-12-05); 14 = the Newton iteration
 * stops on the contraction estimate of its error (every point changes below the tolerance;
 * which branch a sweep follows in a few bistable places; 2026-12-05). */
#define CURVE_NUMERICS_REVISION 14

void ascr_curve_cache_key(const char *fingerprint, const ascr_curve_request *rq, char key[17],
                          char *text, size_t text_size)
{
  char tu[32], tl[32], buf[512];
  if (rq->trip_upper > 1.0) {
    snprintf(tu, sizeof tu, "none");
  } else {
    snprintf(tu, sizeof tu, "%.5f", rq->trip_upper);
  }
  if (rq->trip_lower > 1.0) {
    snprintf(tl, sizeof tl, "none");
  } else {
    snprintf(tl, sizeof tl, "%.5f", rq->trip_lower);
  }
  int k = snprintf(buf, sizeof buf,
                   "airscrew %s numerics %d; section %s; Re %.6e; Mach %.4f; ncrit %.4f; trip upper %s; trip lower "
                   "%s; alpha %.4f:%.4f:%.4f deg; panels %zu",
                   ascr_version(), CURVE_NUMERICS_REVISION, fingerprint, rq->re, rq->mach, rq->ncrit, tu, tl,
                   rq->alpha_lo_deg, rq->alpha_hi_deg, rq->alpha_step_deg, curve_panels(rq));
  if (k < 0) {
    k = 0;
  }
  /* a tripped curve's entry holds the points where a trip bound nothing (since 2026-12-05):
   * entries stored before then do not, and are not found by this key */
  if ((rq->trip_upper <= 1.0 || rq->trip_lower <= 1.0) && (size_t)k < sizeof buf) {
    int e = snprintf(buf + k, sizeof buf - (size_t)k, "; trip flags");
    if (e > 0) k += e;
  }
  size_t len = (size_t)k < sizeof buf ? (size_t)k : sizeof buf - 1;
  uint64_t h = fnv1a(FNV_OFFSET, buf, len);
  snprintf(key, 17, "%016llx", (unsigned long long)h);
  if (text != NULL && text_size > 0) {
    snprintf(text, text_size, "%s", buf);
  }
}

size_t ascr_table_re_ladder(double re_lo, double re_hi, double *out, size_t max)
{
  if (!(re_lo > 0.0 && re_hi >= re_lo && isfinite(re_hi))) {
    return 0;
  }
  re_lo = fmax(re_lo, ASCR_TABLE_RE_FLOOR);
  re_hi = fmax(re_hi, ASCR_TABLE_RE_FLOOR);
  int k0 = (int)floor(4.0 * log10(re_lo) - 1e-9);
  int kmin = (int)ceil(4.0 * log10(ASCR_TABLE_RE_FLOOR) - 1e-9);
  if (k0 < kmin) k0 = kmin; /* no rung below the floor */
  int k1 = (int)ceil(4.0 * log10(re_hi) + 1e-9);
  size_t n = 0;
  for (int k = k0; k <= k1; k++) {
    if (n < max) {
      /* round to 3 significant figures so the keys are stable text */
      double v = pow(10.0, k / 4.0);
      double m = pow(10.0, floor(log10(v)) - 2.0);
      out[n] = round(v / m) * m;
    }
    n++;
  }
  return n;
}

/* ---- polar-table files ------------------------------------------------------------------ */

static json_t *num_or_null(double v, int ok)
{
  return ok && isfinite(v) ? json_real(v) : json_null();
}

static json_t *curves_to_json(const ascr_curve_data *c, size_t n)
{
  json_t *arr = json_array();
  for (size_t k = 0; k < n && arr != NULL; k++) {
    json_t *o = json_object();
    json_t *al = json_array(), *cl = json_array(), *cd = json_array(), *cm = json_array(),
           *cv = json_array();
    for (size_t i = 0; i < c[k].n; i++) {
      int ok = c[k].converged[i];
      json_array_append_new(al, json_real(c[k].alpha_deg[i]));
      json_array_append_new(cl, num_or_null(c[k].cl[i], ok));
      json_array_append_new(cd, num_or_null(c[k].cd[i], ok));
      json_array_append_new(cm, num_or_null(c[k].cm[i], ok));
      json_array_append_new(cv, json_boolean(ok));
    }
    json_object_set_new(o, "re", json_real(c[k].re));
    json_object_set_new(o, "mach", json_real(c[k].mach));
    json_object_set_new(o, "ncrit", json_real(c[k].ncrit));
    json_object_set_new(o, "trip_upper", num_or_null(c[k].trip_upper, c[k].trip_upper <= 1.0));
    json_object_set_new(o, "trip_lower", num_or_null(c[k].trip_lower, c[k].trip_lower <= 1.0));
    json_object_set_new(o, "alpha_deg", al);
    json_object_set_new(o, "cl", cl);
    json_object_set_new(o, "cd", cd);
    json_object_set_new(o, "cm", cm);
    json_object_set_new(o, "converged", cv);
    /* the points where a trip bound nothing, where there are any (bit 0 upper, bit 1 lower) */
    int any = 0;
    for (size_t i = 0; c[k].trip_not_applied != NULL && i < c[k].n; i++) any |= c[k].trip_not_applied[i];
    if (any) {
      json_t *tn = json_array();
      for (size_t i = 0; i < c[k].n; i++) json_array_append_new(tn, json_integer(c[k].trip_not_applied[i] & 3));
      json_object_set_new(o, "trip_not_applied", tn);
    }
    json_array_append_new(arr, o);
  }
  return arr;
}

static void checksum_of(json_t *curves, char out[32])
{
  char *s = json_dumps(curves, JSON_COMPACT | JSON_SORT_KEYS | JSON_REAL_PRECISION(17));
  uint64_t h = s != NULL ? fnv1a(FNV_OFFSET, s, strlen(s)) : 0;
  free(s);
  snprintf(out, 32, "fnv1a64:%016llx", (unsigned long long)h);
}

ascr_status ascr_table_file_format(const char *section_name, const char *key_text,
                                   const ascr_curve_data *curves, size_t n, char **text,
                                   size_t *len, ascr_errbuf *err)
{
  if (curves == NULL || n == 0 || text == NULL || len == NULL) {
    return core_fail(err, ASCR_EINVAL, "polar-table file: nothing to write");
  }
  *text = NULL;
  *len = 0;
  json_t *root = json_object();
  json_t *cj = curves_to_json(curves, n);
  if (root == NULL || cj == NULL) {
    json_decref(root);
    json_decref(cj);
    return core_fail(err, ASCR_ENOMEM, "polar-table file: out of memory");
  }
  char sum[32];
  checksum_of(cj, sum);
  json_object_set_new(root, "format", json_string(TABLE_FORMAT));
  json_object_set_new(root, "section", section_name != NULL ? json_string(section_name) : json_null());
  json_object_set_new(root, "key", key_text != NULL ? json_string(key_text) : json_null());
  json_object_set_new(root, "curves", cj);
  json_object_set_new(root, "checksum", json_string(sum));
  char *s = json_dumps(root, JSON_INDENT(1) | JSON_REAL_PRECISION(17));
  json_decref(root);
  if (s == NULL) {
    return core_fail(err, ASCR_ENOMEM, "polar-table file: out of memory");
  }
  size_t l = strlen(s);
  char *t = realloc(s, l + 2);
  if (t == NULL) {
    free(s);
    return core_fail(err, ASCR_ENOMEM, "polar-table file: out of memory");
  }
  t[l] = '\n';
  t[l + 1] = '\0';
  *text = t;
  *len = l + 1;
  return ASCR_OK;
}

ascr_status ascr_table_file_write(const char *path, const char *section_name, const char *key_text,
                                  const ascr_curve_data *curves, size_t n, ascr_errbuf *err)
{
  if (path == NULL) {
    return core_fail(err, ASCR_EINVAL, "polar-table file: no path");
  }
  char *text = NULL;
  size_t len = 0;
  ascr_status st = ascr_table_file_format(section_name, key_text, curves, n, &text, &len, err);
  if (st != ASCR_OK) {
    return st;
  }
  size_t pl = strlen(path);
  char *tmp = malloc(pl + 8);
  if (tmp == NULL) {
    free(text);
    return core_fail(err, ASCR_ENOMEM, "polar-table file: out of memory");
  }
  snprintf(tmp, pl + 8, "%s.XXXXXX", path);
  int fd = mkstemp(tmp);
  if (fd < 0) {
    st = core_fail(err, ASCR_EIO, "%s: cannot create a temporary file: %s", path, strerror(errno));
  } else {
    fchmod(fd, 0644); /* mkstemp makes 0600; a table is an ordinary output file */
    size_t off = 0;
    while (off < len) {
      ssize_t w = write(fd, text + off, len - off);
      if (w < 0) {
        if (errno == EINTR) continue;
        break;
      }
      off += (size_t)w;
    }
    int bad = off != len;
    bad |= close(fd) != 0;
    if (bad || rename(tmp, path) != 0) {
      st = core_fail(err, ASCR_EIO, "%s: cannot write: %s", path, strerror(errno));
      remove(tmp);
    }
  }
  free(tmp);
  free(text);
  return st;
}

static ascr_status read_array(const char *path, size_t k, json_t *o, const char *key, size_t n,
                              double *dst, const int *ok, ascr_errbuf *err)
{
  json_t *a = json_object_get(o, key);
  if (!json_is_array(a) || json_array_size(a) != n) {
    return core_fail(err, ASCR_EPARSE, "%s: curves[%zu].%s: must be a list of %zu entries", path,
                     k, key, n);
  }
  for (size_t i = 0; i < n; i++) {
    json_t *v = json_array_get(a, i);
    if (ok != NULL && !ok[i]) {
      if (!json_is_null(v)) {
        return core_fail(err, ASCR_EPARSE,
                         "%s: curves[%zu].%s[%zu]: an unconverged point must hold null", path, k,
                         key, i);
      }
      dst[i] = NAN;
      continue;
    }
    if (!json_is_number(v)) {
      return core_fail(err, ASCR_EPARSE, "%s: curves[%zu].%s[%zu]: must be a number", path, k,
                       key, i);
    }
    dst[i] = json_number_value(v);
  }
  return ASCR_OK;
}

static ascr_status read_scalar(const char *path, size_t k, json_t *o, const char *key,
                               int nullable, double *dst, ascr_errbuf *err)
{
  json_t *v = json_object_get(o, key);
  if (nullable && json_is_null(v)) {
    *dst = 2.0;
    return ASCR_OK;
  }
  if (!json_is_number(v)) {
    return core_fail(err, ASCR_EPARSE, "%s: curves[%zu].%s: missing or not a number", path, k, key);
  }
  *dst = json_number_value(v);
  return ASCR_OK;
}

ascr_status ascr_table_file_read(const char *path, const char *key_text, ascr_curve_data **curves,
                                 size_t *n, ascr_errbuf *err)
{
  if (path == NULL || curves == NULL || n == NULL) {
    return core_fail(err, ASCR_EINVAL, "polar-table file: bad arguments");
  }
  *curves = NULL;
  *n = 0;
  /* only a regular file: a FIFO would block (opened without waiting, then refused), a device
   * such as /dev/zero never ends; and a limit counted while reading, not after */
  int fd = open(path, O_RDONLY | O_NONBLOCK | O_CLOEXEC);
  if (fd < 0) {
    return core_fail(err, ASCR_EIO, "%s: cannot open polar-table file", path);
  }
  struct stat sb;
  if (fstat(fd, &sb) != 0 || !S_ISREG(sb.st_mode)) {
    close(fd);
    return core_fail(err, ASCR_EIO, "%s: not a regular file (a polar-table file must be one)", path);
  }
  int fl = fcntl(fd, F_GETFL);
  if (fl >= 0) fcntl(fd, F_SETFL, fl & ~O_NONBLOCK);
  FILE *f = fdopen(fd, "rb");
  if (f == NULL) {
    close(fd);
    return core_fail(err, ASCR_EIO, "%s: cannot open polar-table file", path);
  }
  char *buf = NULL;
  size_t len = 0, total = 0;
  FILE *m = open_memstream(&buf, &len);
  char chunk[65536];
  size_t got;
  int too_big = 0;
  while (m != NULL && (got = fread(chunk, 1, sizeof chunk, f)) > 0) {
    total += got;
    if (total > TABLE_FILE_MAX) {
      too_big = 1;
      break;
    }
    fwrite(chunk, 1, got, m);
  }
  int bad = ferror(f);
  fclose(f);
  if (m == NULL) {
    return core_fail(err, ASCR_ENOMEM, "%s: out of memory", path);
  }
  fclose(m);
  ascr_status st;
  if (bad) {
    st = core_fail(err, ASCR_EIO, "%s: read error", path);
  } else if (too_big) {
    st = core_fail(err, ASCR_EPARSE, "%s: larger than 64 MiB, not a polar-table file", path);
  } else {
    st = ascr_table_file_parse(buf, len, path, key_text, curves, n, err);
  }
  free(buf);
  return st;
}

ascr_status ascr_table_file_parse(const char *text, size_t len, const char *name,
                                  const char *key_text, ascr_curve_data **curves, size_t *n,
                                  ascr_errbuf *err)
{
  if ((text == NULL && len > 0) || curves == NULL || n == NULL) {
    return core_fail(err, ASCR_EINVAL, "polar-table file: bad arguments");
  }
  const char *path = name != NULL ? name : "(polar table)";
  *curves = NULL;
  *n = 0;
  if (len > 0 && memchr(text, '\0', len) != NULL) {
    return core_fail(err, ASCR_EPARSE, "%s: binary data (NUL byte), not a polar-table file", path);
  }
  json_error_t je;
  json_t *root = json_loadb(text != NULL ? text : "", len, JSON_REJECT_DUPLICATES, &je);
  if (root == NULL) {
    return core_fail(err, ASCR_EPARSE, "%s:%d:%d: JSON syntax: %s", path, je.line, je.column, je.text);
  }
  ascr_status st = ASCR_OK;
  ascr_curve_data *cv = NULL;
  size_t nc = 0;
  json_t *fmt = json_object_get(root, "format");
  json_t *cj = json_object_get(root, "curves");
  json_t *sum = json_object_get(root, "checksum");
  json_t *key = json_object_get(root, "key");
  if (!json_is_object(root) || !json_is_string(fmt) || strcmp(json_string_value(fmt), TABLE_FORMAT) != 0) {
    st = core_fail(err, ASCR_EPARSE, "%s: format: must be \"" TABLE_FORMAT "\"", path);
    goto done;
  }
  if (!json_is_array(cj) || json_array_size(cj) == 0 || json_array_size(cj) > 1000) {
    st = core_fail(err, ASCR_EPARSE, "%s: curves: must be a list of 1 .. 1000 curves", path);
    goto done;
  }
  if (key_text != NULL && (!json_is_string(key) || strcmp(json_string_value(key), key_text) != 0)) {
    st = core_fail(err, ASCR_EPARSE, "%s: key: does not match the request (not this table)", path);
    goto done;
  }
  if (sum != NULL || key_text != NULL) {
    char want[32];
    checksum_of(cj, want);
    if (!json_is_string(sum) || strcmp(json_string_value(sum), want) != 0) {
      st = core_fail(err, ASCR_EPARSE, "%s: checksum: does not match the contents (damaged file)", path);
      goto done;
    }
  }
  nc = json_array_size(cj);
  cv = core_calloc(nc, sizeof *cv);
  if (cv == NULL) {
    st = core_fail(err, ASCR_ENOMEM, "%s: out of memory", path);
    goto done;
  }
  for (size_t k = 0; k < nc && st == ASCR_OK; k++) {
    json_t *o = json_array_get(cj, k);
    json_t *al = json_object_get(o, "alpha_deg"), *ok = json_object_get(o, "converged");
    if (!json_is_object(o) || !json_is_array(al) || json_array_size(al) == 0 ||
        json_array_size(al) > 100000 || !json_is_array(ok) || json_array_size(ok) != json_array_size(al)) {
      st = core_fail(err, ASCR_EPARSE,
                     "%s: curves[%zu]: needs alpha_deg and converged lists of equal length", path, k);
      break;
    }
    size_t m = json_array_size(al);
    if (!curve_alloc(&cv[k], m)) {
      st = core_fail(err, ASCR_ENOMEM, "%s: out of memory", path);
      break;
    }
    for (size_t i = 0; i < m; i++) {
      json_t *b = json_array_get(ok, i);
      if (!json_is_boolean(b)) {
        st = core_fail(err, ASCR_EPARSE, "%s: curves[%zu].converged[%zu]: must be true or false",
                       path, k, i);
        break;
      }
      cv[k].converged[i] = json_is_true(b);
    }
    if (st == ASCR_OK) st = read_array(path, k, o, "alpha_deg", m, cv[k].alpha_deg, NULL, err);
    if (st == ASCR_OK) st = read_array(path, k, o, "cl", m, cv[k].cl, cv[k].converged, err);
    if (st == ASCR_OK) st = read_array(path, k, o, "cd", m, cv[k].cd, cv[k].converged, err);
    if (st == ASCR_OK) st = read_array(path, k, o, "cm", m, cv[k].cm, cv[k].converged, err);
    if (st == ASCR_OK) st = read_scalar(path, k, o, "re", 0, &cv[k].re, err);
    if (st == ASCR_OK) st = read_scalar(path, k, o, "mach", 0, &cv[k].mach, err);
    if (st == ASCR_OK) st = read_scalar(path, k, o, "ncrit", 0, &cv[k].ncrit, err);
    if (st == ASCR_OK) st = read_scalar(path, k, o, "trip_upper", 1, &cv[k].trip_upper, err);
    if (st == ASCR_OK) st = read_scalar(path, k, o, "trip_lower", 1, &cv[k].trip_lower, err);
    json_t *tn = json_object_get(o, "trip_not_applied");
    if (st == ASCR_OK && tn != NULL) {
      if (!json_is_array(tn) || json_array_size(tn) != m) {
        st = core_fail(err, ASCR_EPARSE, "%s: curves[%zu].trip_not_applied: must be a list as long as alpha_deg",
                       path, k);
      }
      for (size_t i = 0; st == ASCR_OK && i < m; i++) {
        json_t *v = json_array_get(tn, i);
        if (!json_is_integer(v) || json_integer_value(v) < 0 || json_integer_value(v) > 3) {
          st = core_fail(err, ASCR_EPARSE, "%s: curves[%zu].trip_not_applied[%zu]: must be 0, 1, 2 or 3",
                         path, k, i);
          break;
        }
        cv[k].trip_not_applied[i] = (int)json_integer_value(v);
      }
    }
  }
done:
  json_decref(root);
  if (st != ASCR_OK) {
    for (size_t k = 0; cv != NULL && k < nc; k++) {
      ascr_curve_data_clear(&cv[k]);
    }
    free(cv);
    return st;
  }
  *curves = cv;
  *n = nc;
  return ASCR_OK;
}

ascr_status ascr_polar_table_from_curves(const ascr_curve_data *curves, size_t n,
                                         const ascr_table_options *opt, ascr_polar_table **out,
                                         ascr_errbuf *err)
{
  if (curves == NULL || n == 0) {
    return core_fail(err, ASCR_EINVAL, "polar table: no curves");
  }
  ascr_table_curve *tc = core_calloc(n, sizeof *tc);
  if (tc == NULL) {
    return core_fail(err, ASCR_ENOMEM, "polar table: out of memory");
  }
  for (size_t k = 0; k < n; k++) {
    tc[k].re = curves[k].re;
    tc[k].n = curves[k].n;
    tc[k].alpha_deg = curves[k].alpha_deg;
    tc[k].cl = curves[k].cl;
    tc[k].cd = curves[k].cd;
    tc[k].cm = curves[k].cm;
    tc[k].converged = curves[k].converged;
    tc[k].trip_not_applied = curves[k].trip_not_applied;
  }
  ascr_status st = ascr_polar_table_build(tc, n, opt, out, err);
  free(tc);
  return st;
}
