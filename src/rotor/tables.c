/* src/rotor/tables.c
 * The section tables of a blade (include/airscrew/ascr_blade_tables.h): the Re ladder of each
 * section, cache look-ups, the curve jobs (OpenMP where available), the cache stores, the ends
 * of the ladder extended past unusable curves, and the tables.
 */
#define _POSIX_C_SOURCE 200809L
#include "airscrew/ascr_blade_tables.h"
#include "airscrew/ascr_geom.h"
#include "core/core_impl.h"
#include "rotor/rotor_impl.h"

#include <errno.h>
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

#define MAXC ASCR_BLADE_TABLES_MAX_CURVES

ascr_blade_tables_options ascr_blade_tables_options_defaults(void)
{
  ascr_blade_tables_options o;
  memset(&o, 0, sizeof o);
  o.curve = ascr_curve_request_defaults(1e5);
  return o;
}

typedef struct job {
  size_t section;
  ascr_curve_request rq;
  char key[17];
  char key_text[512];
  char *path;           /* cache entry (NULL: no cache) */
  ascr_curve_data curve;
  int from_cache, done;
  ascr_status st;
  ascr_errbuf err;
} job;

typedef struct jobs {
  job *j;
  size_t n, cap;
} jobs;

static void note(ascr_blade_tables *t, const char *fmt, ...)
{
  char buf[1024];
  va_list ap;
  va_start(ap, fmt);
  vsnprintf(buf, sizeof buf, fmt, ap);
  va_end(ap);
  char **nn = realloc(t->notes, (t->n_notes + 1) * sizeof *nn);
  if (nn == NULL) return;
  t->notes = nn;
  size_t len = strlen(buf) + 1;
  t->notes[t->n_notes] = malloc(len);
  if (t->notes[t->n_notes] != NULL) {
    memcpy(t->notes[t->n_notes], buf, len);
    t->n_notes++;
  }
}

/* Where a curve's trip bound nothing (the stagnation point behind it, transition free there:
 * ascr_curve_data.trip_not_applied), one note per section and surface with the count and the
 * smallest angle of a side, so that a table built with trips does not pass free-transition
 * points off as tripped ones. */
static void trip_note(ascr_blade_tables *t, const char *name, const ascr_curve_data *cv, size_t k)
{
  static const char *const side[2] = {"upper", "lower"};
  size_t cnt[2] = {0, 0}, tot = 0;
  for (size_t q = 0; q < k; q++) {
    size_t n[2];
    ascr_curve_trip_counts(&cv[q], n);
    cnt[0] += n[0];
    cnt[1] += n[1];
    for (size_t i = 0; i < cv[q].n; i++) tot += (size_t)(cv[q].converged[i] != 0);
  }
  for (int b = 0; b < 2; b++) {
    if (cnt[b] == 0) continue;
    /* the angles nearest zero on each side where it does */
    double a_pos = INFINITY, a_neg = -INFINITY;
    for (size_t q = 0; q < k; q++) {
      for (size_t i = 0; cv[q].trip_not_applied != NULL && i < cv[q].n; i++) {
        if (!cv[q].converged[i] || !(cv[q].trip_not_applied[i] & (1 << b))) continue;
        double a = cv[q].alpha_deg[i];
        if (a >= 0.0 && a < a_pos) a_pos = a;
        if (a < 0.0 && a > a_neg) a_neg = a;
      }
    }
    char from[64];
    if (isfinite(a_pos) && isfinite(a_neg)) snprintf(from, sizeof from, "from %.1f and below %.1f deg", a_pos, a_neg);
    else snprintf(from, sizeof from, "%s %.1f deg", isfinite(a_pos) ? "from" : "below", isfinite(a_pos) ? a_pos : a_neg);
    note(t, "section '%s': the %s trip binds nothing at %zu of %zu computed points (%s: the "
         "stagnation point lies behind it), where the curves have free transition on that side",
         name, side[b], cnt[b], tot, from);
  }
}

/* mkdir -p; 0 on success */
static int make_dirs(const char *path)
{
  size_t n = strlen(path);
  char *tmp = malloc(n + 1);
  if (n == 0 || tmp == NULL) {
    free(tmp);
    return -1;
  }
  memcpy(tmp, path, n + 1);
  for (size_t i = 1; i <= n; i++) {
    if (tmp[i] == '/' || tmp[i] == '\0') {
      char c = tmp[i];
      tmp[i] = '\0';
      if (mkdir(tmp, 0755) != 0 && errno != EEXIST) {
        free(tmp);
        return -1;
      }
      tmp[i] = c;
    }
  }
  free(tmp);
  struct stat sb;
  return stat(path, &sb) == 0 && S_ISDIR(sb.st_mode) ? 0 : -1;
}

/* A new file can be made in dir (probe created and removed). */
static int dir_writable(const char *dir)
{
  size_t n = strlen(dir) + 32;
  char *probe = malloc(n);
  if (probe == NULL) return 0;
  snprintf(probe, n, "%s/.airscrew-probe-XXXXXX", dir);
  int fd = mkstemp(probe);
  if (fd >= 0) {
    close(fd);
    unlink(probe);
  }
  free(probe);
  return fd >= 0;
}

/* Store text as the cache entry path: a temporary beside it (".airscrew-tmp-XXXXXX", which the
 * cache command knows as a leftover), then renamed. Only over a regular file or nothing. */
static int store(const char *path, const char *text, size_t len, const ascr_blade_tables_options *o,
                 char *why, size_t why_size)
{
  struct stat sb;
  if (lstat(path, &sb) == 0 && !S_ISREG(sb.st_mode)) {
    snprintf(why, why_size, "%s is not a regular file", path);
    return -1;
  }
  const char *slash = strrchr(path, '/');
  size_t dl = slash != NULL ? (size_t)(slash - path) + 1 : 0;
  char *tmp = malloc(dl + 24);
  if (tmp == NULL) {
    snprintf(why, why_size, "out of memory");
    return -1;
  }
  memcpy(tmp, path, dl);
  memcpy(tmp + dl, ".airscrew-tmp-XXXXXX", 21);
  int fd = mkstemp(tmp);
  if (fd < 0) {
    snprintf(why, why_size, "%s: %s", path, strerror(errno));
    free(tmp);
    return -1;
  }
  if (o->temp_file != NULL) o->temp_file(tmp, o->ctx);
  size_t off = 0;
  int ok = 1;
  while (off < len) {
    ssize_t w = write(fd, text + off, len - off);
    if (w < 0) {
      if (errno == EINTR) continue;
      ok = 0;
      break;
    }
    off += (size_t)w;
  }
  mode_t um = umask(0);
  umask(um);
  if (ok) fchmod(fd, 0666 & ~um);
  if (close(fd) != 0) ok = 0;
  if (!ok || rename(tmp, path) != 0) {
    snprintf(why, why_size, "%s: %s", path, strerror(errno));
    unlink(tmp);
    ok = 0;
  }
  if (o->temp_file != NULL) o->temp_file(NULL, o->ctx);
  free(tmp);
  return ok ? 0 : -1;
}

static job *add_job(jobs *js, size_t section, double re, const ascr_blade_tables_options *o,
                    const char *fingerprint, const char *cache)
{
  if (js->n == js->cap) {
    size_t cap = js->cap ? 2 * js->cap : 64;
    job *nj = realloc(js->j, cap * sizeof *nj);
    if (nj == NULL) return NULL;
    js->j = nj;
    js->cap = cap;
  }
  job *j = &js->j[js->n];
  memset(j, 0, sizeof *j);
  j->section = section;
  j->rq = o->curve;
  j->rq.re = re;
  ascr_curve_cache_key(fingerprint, &j->rq, j->key, j->key_text, sizeof j->key_text);
  if (cache != NULL) {
    size_t n = strlen(cache) + 32;
    j->path = malloc(n);
    if (j->path == NULL) return NULL;
    snprintf(j->path, n, "%s/%s.json", cache, j->key);
  }
  js->n++;
  return j;
}

static void jobs_free(jobs *js)
{
  for (size_t i = 0; i < js->n; i++) {
    ascr_curve_data_clear(&js->j[i].curve);
    free(js->j[i].path);
  }
  free(js->j);
  memset(js, 0, sizeof *js);
}

/* Run the jobs first..n-1: cache look-ups (cheap), then the computations in parallel, then
 * the stores. Returns the first failed job or NULL. */
static job *run_jobs(jobs *js, size_t first, const char *cache, int cache_ro,
                     const ascr_blade_tables_options *o, const ascr_blade *b, ascr_blade_tables *t,
                     ascr_geom_section **secs)
{
  size_t todo = 0;
  for (size_t i = first; i < js->n; i++) {
    job *j = &js->j[i];
    struct stat sb;
    if (j->path == NULL || stat(j->path, &sb) != 0) {
      todo++;
      continue;
    }
    ascr_curve_data *cv = NULL;
    size_t nc = 0;
    ascr_errbuf err;
    if (ascr_table_file_read(j->path, j->key_text, &cv, &nc, &err) == ASCR_OK && nc == 1) {
      j->curve = cv[0];
      free(cv);
      j->from_cache = 1;
    } else {
      for (size_t k = 0; k < nc; k++) ascr_curve_data_clear(&cv[k]);
      free(cv);
      note(t, "cache entry refused, recomputing: %s", err.msg);
      todo++;
    }
  }
  size_t done = 0;
#pragma omp parallel for schedule(dynamic, 1)
  for (long i = (long)first; i < (long)js->n; i++) {
    job *j = &js->j[i];
    if (j->from_cache) continue;
    j->st = ascr_table_curve_compute(secs[j->section], &j->rq, &j->curve, &j->err);
    if (o->progress != NULL) {
#pragma omp critical
      {
        done++;
        o->progress(done, todo, o->ctx);
      }
    }
  }
  for (size_t i = first; i < js->n; i++) {
    job *j = &js->j[i];
    if (j->st != ASCR_OK) return j;
    if (j->from_cache || j->path == NULL || cache_ro) continue;
    ascr_errbuf err;
    char *text = NULL;
    size_t len = 0;
    char why[600];
    if (ascr_table_file_format(b->section_name[j->section], j->key_text, &j->curve, 1, &text, &len,
                               &err) != ASCR_OK) {
      note(t, "cache entry not stored: %s", err.msg);
    } else if (cache != NULL && store(j->path, text, len, o, why, sizeof why) != 0) {
      note(t, "cache entry not stored (%s); the result is not affected", why);
    }
    free(text);
  }
  (void)cache;
  return NULL;
}

/* Whether a curve can enter a table on its own (ascr_polar_table_build's rule). */
static int usable(const ascr_curve_data *c)
{
  ascr_polar_table *t = NULL;
  ascr_status st = ascr_polar_table_from_curves(c, 1, NULL, &t, NULL);
  ascr_polar_table_free(t);
  return st == ASCR_OK;
}

/* The rung next to re on the fixed ladder, up (dir > 0) or down; 0 if none (below the floor). */
static double next_rung(double re, int dir)
{
  double r[4];
  if (dir > 0) {
    size_t n = ascr_table_re_ladder(re * 1.05, re * 1.05, r, 4);
    /* the ladder of a single value holds the rung below and the one above it */
    return n >= 2 ? r[n - 1] : 0.0;
  }
  if (re * 0.95 < ASCR_TABLE_RE_FLOOR) return 0.0;
  size_t n = ascr_table_re_ladder(re * 0.95, re * 0.95, r, 4);
  return n >= 1 && r[0] < re * 0.99 ? r[0] : 0.0;
}

static int user_file_for(const ascr_blade_tables_options *o, const char *name, const char **path)
{
  for (size_t i = 0; i < o->n_files; i++) {
    if (strcmp(o->file_section[i], name) == 0) {
      *path = o->file_path[i];
      return 1;
    }
  }
  return 0;
}

static int cmp_job_re(const void *pa, const void *pb)
{
  const ascr_curve_data *a = pa, *b = pb;
  return (a->re > b->re) - (a->re < b->re);
}

void ascr_blade_tables_free(ascr_blade_tables *t)
{
  if (t == NULL) return;
  for (size_t i = 0; i < t->n; i++) {
    if (t->tables != NULL) ascr_polar_table_free(t->tables[i]);
    if (t->info != NULL) {
      for (size_t k = 0; k < t->info[i].n_curve; k++) ascr_curve_data_clear(&t->info[i].curve[k]);
      free(t->info[i].curve);
    }
  }
  for (size_t i = 0; i < t->n_notes; i++) free(t->notes[i]);
  free(t->notes);
  free(t->tables);
  free(t->info);
  memset(t, 0, sizeof *t);
}

static ascr_status fail(ascr_blade_tables *t, ascr_blade_tables_stage stage, ascr_status st)
{
  t->failed = stage;
  return st;
}

/* The table of user file section s. */
static ascr_status table_from_file(const ascr_blade *b, size_t s, ascr_blade_tables *t,
                                   ascr_errbuf *err)
{
  ascr_section_table_info *in = &t->info[s];
  ascr_curve_data *cv = NULL;
  size_t nc = 0;
  ascr_errbuf e;
  ascr_status st = ascr_table_file_read(in->user_file, NULL, &cv, &nc, &e);
  if (st == ASCR_OK) {
    st = ascr_polar_table_from_curves(cv, nc, NULL, &t->tables[s], &e);
    in->n_curves = nc < MAXC ? nc : MAXC;
    for (size_t k = 0; k < in->n_curves; k++) {
      in->re[k] = cv[k].re;
      in->points[k] = cv[k].n;
      for (size_t i = 0; i < cv[k].n; i++) in->converged[k] += (size_t)cv[k].converged[i];
    }
  }
  in->curve = cv;
  in->n_curve = nc;
  if (st != ASCR_OK) {
    core_fail(err, st, "polar-table file for section '%s': %s", b->section_name[s], e.msg);
    return fail(t, st == ASCR_EDOM ? ASCR_TABLES_TABLE : ASCR_TABLES_FILE, st);
  }
  in->n_used = ascr_polar_table_curves(t->tables[s]);
  return ASCR_OK;
}

ascr_status ascr_blade_tables_prepare(const ascr_blade *b, const ascr_rotor_params *p,
                                      double rpm_lo, double rpm_hi, double v_lo, double v_hi,
                                      const ascr_blade_tables_options *oin,
                                      ascr_blade_tables *out, ascr_errbuf *err)
{
  if (out == NULL || b == NULL) {
    return core_fail(err, ASCR_EINVAL, "blade tables: no blade or no result");
  }
  memset(out, 0, sizeof *out);
  ascr_blade_tables_options o = oin != NULL ? *oin : ascr_blade_tables_options_defaults();
  for (size_t i = 0; i < o.n_files; i++) {
    size_t k = 0;
    while (k < b->n_sections && strcmp(b->section_name[k], o.file_section[i]) != 0) k++;
    if (k == b->n_sections) {
      core_fail(err, ASCR_EINVAL, "polar-table file %s: the blade has no section named '%s'",
                o.file_path[i], o.file_section[i]);
      return fail(out, ASCR_TABLES_ARGUMENTS, ASCR_EINVAL);
    }
  }
  out->n = b->n_sections;
  out->tables = core_calloc(out->n, sizeof *out->tables);
  out->info = core_calloc(out->n, sizeof *out->info);
  ascr_geom_section **secs = core_calloc(out->n, sizeof *secs);
  jobs js = {NULL, 0, 0};
  if (out->tables == NULL || out->info == NULL || secs == NULL) {
    free(secs);
    return core_fail(err, ASCR_ENOMEM, "blade tables: out of memory");
  }
  ascr_status st = ASCR_OK;
  const char *cache = o.cache_dir;
  if (cache != NULL && make_dirs(cache) != 0) {
    note(out, "cache folder %s cannot be created (%s); tables are computed without a cache", cache,
         strerror(errno));
    cache = NULL;
  }
  /* a folder that cannot take new entries: read from, not written to */
  int cache_ro = 0;
  if (cache != NULL && !dir_writable(cache)) {
    note(out, "cache folder %s is not writable (%s): curves are read from it but not stored",
         cache, strerror(errno));
    cache_ro = 1;
  }
  for (size_t s = 0; s < out->n && st == ASCR_OK; s++) {
    ascr_section_table_info *in = &out->info[s];
    const char *upath;
    if (user_file_for(&o, b->section_name[s], &upath)) {
      in->user_file = upath;
      continue;
    }
    ascr_errbuf e;
    st = ascr_geom_section_open(b->section_source[s], &secs[s], &e);
    if (st != ASCR_OK) {
      core_fail(err, st, "%s (section '%s' of the blade)", e.msg, b->section_name[s]);
      st = fail(out, ASCR_TABLES_SECTION, st);
      break;
    }
    ascr_section_fingerprint(secs[s], in->fingerprint);
    /* the blade's own envelope, where its file gives one, joins the request's range: every
     * request then builds the same curves (the cache serves them all) */
    double rl = rpm_lo, rh = rpm_hi, vl = v_lo, vh = v_hi;
    if (b->envelope_rpm[0] > 0.0 && b->envelope_rpm[1] >= b->envelope_rpm[0]) { /* NaN, 0: none */
      rl = fmin(rl, b->envelope_rpm[0]);
      rh = fmax(rh, b->envelope_rpm[1]);
      vl = fmin(vl, 0.0);
      if (b->envelope_airspeed_max_m_s > 0.0) vh = fmax(vh, b->envelope_airspeed_max_m_s);
    }
    st = ascr_rotor_section_re_range(b, s, p, rl, rh, vl, vh, &in->re_lo, &in->re_hi, err);
    if (st != ASCR_OK) {
      st = fail(out, ASCR_TABLES_ARGUMENTS, st);
      break;
    }
    double lo = in->re_lo < 1e3 ? 1e3 : in->re_lo, hi = in->re_hi > 1e8 ? 1e8 : in->re_hi;
    if (hi < lo) hi = lo;
    size_t nr = ascr_table_re_ladder(lo, hi, in->re, MAXC);
    if (nr + 2 * ASCR_BLADE_TABLES_MAX_EXTRA > MAXC) {
      core_fail(err, ASCR_EINVAL,
                "section '%s': Re %.0f .. %.0f needs %zu table curves, more than %d; narrow the "
                "rpm or speed range", b->section_name[s], lo, hi, nr,
                MAXC - 2 * ASCR_BLADE_TABLES_MAX_EXTRA);
      st = fail(out, ASCR_TABLES_ARGUMENTS, ASCR_EINVAL);
      break;
    }
    in->n_curves = nr;
    for (size_t k = 0; k < nr && st == ASCR_OK; k++) {
      if (add_job(&js, s, in->re[k], &o, in->fingerprint, cache) == NULL) {
        st = core_fail(err, ASCR_ENOMEM, "blade tables: out of memory");
      }
    }
  }
  /* rounds: the ladders, then extension rungs where an end curve is not usable */
  size_t first = 0;
  for (int round = 0; st == ASCR_OK && round <= ASCR_BLADE_TABLES_MAX_EXTRA; round++) {
    job *bad = run_jobs(&js, first, cache, cache_ro, &o, b, out, secs);
    if (bad != NULL) {
      core_fail(err, bad->st, "section '%s', Re %.0f: %s", b->section_name[bad->section],
                bad->rq.re, bad->err.msg);
      st = fail(out, ASCR_TABLES_CURVE, bad->st);
      break;
    }
    size_t added = js.n;
    first = js.n;
    for (size_t s = 0; s < out->n && round < ASCR_BLADE_TABLES_MAX_EXTRA; s++) {
      ascr_section_table_info *in = &out->info[s];
      if (in->user_file != NULL || in->n_curves == 0) continue;
      /* the section's lowest and highest curves so far */
      const job *jl = NULL, *jh = NULL;
      for (size_t i = 0; i < first; i++) {
        if (js.j[i].section != s) continue;
        if (jl == NULL || js.j[i].rq.re < jl->rq.re) jl = &js.j[i];
        if (jh == NULL || js.j[i].rq.re > jh->rq.re) jh = &js.j[i];
      }
      double up = usable(&jh->curve) ? 0.0 : next_rung(jh->rq.re, 1);
      double dn = usable(&jl->curve) ? 0.0 : next_rung(jl->rq.re, -1);
      double rr[2] = {dn, up};
      for (int q = 0; q < 2; q++) {
        if (rr[q] > 0.0 && rr[q] <= 1e8 && in->n_curves < MAXC) {
          in->re[in->n_curves++] = rr[q];
          in->n_extra++;
          if (add_job(&js, s, rr[q], &o, in->fingerprint, cache) == NULL) {
            st = core_fail(err, ASCR_ENOMEM, "blade tables: out of memory");
          }
        }
      }
    }
    if (js.n == added) break; /* nothing added: done */
  }
  /* tables */
  for (size_t s = 0; s < out->n && st == ASCR_OK; s++) {
    ascr_section_table_info *in = &out->info[s];
    if (in->user_file != NULL) {
      st = table_from_file(b, s, out, err);
      continue;
    }
    ascr_curve_data *cv = core_calloc(in->n_curves, sizeof *cv);
    if (cv == NULL) {
      st = core_fail(err, ASCR_ENOMEM, "blade tables: out of memory");
      break;
    }
    size_t k = 0;
    for (size_t i = 0; i < js.n; i++) {
      if (js.j[i].section != s) continue;
      cv[k++] = js.j[i].curve; /* the curves move to the section info */
      memset(&js.j[i].curve, 0, sizeof js.j[i].curve);
      in->from_cache += (size_t)js.j[i].from_cache;
      in->computed += (size_t)!js.j[i].from_cache;
    }
    qsort(cv, k, sizeof *cv, cmp_job_re);
    for (size_t q = 0; q < k; q++) {
      in->re[q] = cv[q].re;
      in->points[q] = cv[q].n;
      in->converged[q] = 0;
      for (size_t i = 0; i < cv[q].n; i++) in->converged[q] += (size_t)cv[q].converged[i];
    }
    in->curve = cv;
    in->n_curve = k;
    ascr_errbuf e;
    st = ascr_polar_table_from_curves(cv, k, NULL, &out->tables[s], &e);
    if (st != ASCR_OK) {
      if (st == ASCR_EDOM) {
        core_fail(err, st,
                  "section '%s': no usable polar curve at Re %.0f .. %.0f (%s). Its shape may "
                  "not converge at these Reynolds numbers: widen the angle range of the curves, "
                  "check the section file, or give the section a polar-table file",
                  b->section_name[s], cv[0].re, cv[k - 1].re, e.msg);
      } else {
        core_fail(err, st, "section '%s': %s", b->section_name[s], e.msg);
      }
      st = fail(out, ASCR_TABLES_TABLE, st);
      break;
    }
    in->n_used = ascr_polar_table_curves(out->tables[s]);
    if (in->n_used < k) {
      note(out, "section '%s': %zu of %zu Re curves had too few converged points and are left out "
           "of its table", b->section_name[s], k - in->n_used, k);
    }
    trip_note(out, b->section_name[s], cv, k);
  }
  jobs_free(&js);
  for (size_t s = 0; s < out->n; s++) ascr_geom_section_free(secs[s]);
  free(secs);
  if (st != ASCR_OK) {
    /* keep the notes and the stage; drop the rest */
    char **notes = out->notes;
    size_t nn = out->n_notes;
    ascr_blade_tables_stage stage = out->failed;
    out->notes = NULL;
    out->n_notes = 0;
    ascr_blade_tables_free(out);
    out->notes = notes;
    out->n_notes = nn;
    out->failed = stage;
  }
  return st;
}
