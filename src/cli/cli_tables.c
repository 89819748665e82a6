/* src/cli/cli_tables.c
 * Section tables for the rotor commands (see cli_tables.h). Curves are independent jobs run in
 * parallel with OpenMP when available; each job calls the reentrant library only.
 */
#define _POSIX_C_SOURCE 200809L
#include "cli_tables.h"

#include <errno.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

void cli_table_opts_init(cli_table_opts *o)
{
  memset(o, 0, sizeof *o);
  cli_visc_opts_init(&o->vo);
  ascr_curve_request d = ascr_curve_request_defaults(1e5);
  o->alpha_lo = d.alpha_lo_deg;
  o->alpha_hi = d.alpha_hi_deg;
  o->alpha_step = d.alpha_step_deg;
  o->panels = d.n_panels;
}

const char *cli_default_cache_dir(void)
{
  static char buf[4096];
  const char *e = getenv("AIRSCREW_CACHE_DIR");
  if (e != NULL && e[0] != '\0') {
    snprintf(buf, sizeof buf, "%s", e);
    return buf;
  }
  e = getenv("XDG_CACHE_HOME");
  if (e != NULL && e[0] == '/') {
    snprintf(buf, sizeof buf, "%s/airscrew", e);
    return buf;
  }
  e = getenv("HOME");
  if (e != NULL && e[0] == '/') {
    snprintf(buf, sizeof buf, "%s/.cache/airscrew", e);
    return buf;
  }
  return NULL;
}

/* mkdir -p; 0 on success */
static int make_dirs(const char *path)
{
  char tmp[4096];
  size_t n = strlen(path);
  if (n == 0 || n >= sizeof tmp) return -1;
  memcpy(tmp, path, n + 1);
  for (size_t i = 1; i <= n; i++) {
    if (tmp[i] == '/' || tmp[i] == '\0') {
      char c = tmp[i];
      tmp[i] = '\0';
      if (mkdir(tmp, 0755) != 0 && errno != EEXIST) return -1;
      tmp[i] = c;
    }
  }
  struct stat sb;
  return stat(path, &sb) == 0 && S_ISDIR(sb.st_mode) ? 0 : -1;
}

typedef struct job {
  size_t section;
  ascr_curve_request rq;
  char key[17];
  char key_text[512];
  char path[4200];
  ascr_curve_data curve;
  int from_cache;
  int damaged;          /* a cache entry existed but was refused */
  ascr_status st;
  ascr_errbuf err;
} job;

void cli_tables_free(cli_tables *t)
{
  if (t == NULL) return;
  for (size_t i = 0; i < t->n; i++) {
    if (t->tables != NULL) ascr_polar_table_free(t->tables[i]);
    if (t->info != NULL) {
      for (size_t k = 0; k < t->info[i].n_curve; k++) ascr_curve_data_clear(&t->info[i].curve[k]);
      free(t->info[i].curve);
    }
  }
  free(t->tables);
  free(t->info);
  memset(t, 0, sizeof *t);
}

static int user_file_for(const cli_table_opts *o, const char *name, const char **path)
{
  for (size_t i = 0; i < o->n_files; i++) {
    if (strcmp(o->file_section[i], name) == 0) {
      *path = o->file_path[i];
      return 1;
    }
  }
  return 0;
}

int cli_tables_prepare(const ascr_blade *b, const ascr_rotor_params *p, double rpm_lo,
                       double rpm_hi, double v_lo, double v_hi, const cli_table_opts *o,
                       cli_tables *out)
{
  memset(out, 0, sizeof *out);
  for (size_t i = 0; i < o->n_files; i++) {
    size_t k = 0;
    while (k < b->n_sections && strcmp(b->section_name[k], o->file_section[i]) != 0) k++;
    if (k == b->n_sections) {
      cli_error("--polar-table %s=%s: the blade has no section named '%s'", o->file_section[i],
                o->file_path[i], o->file_section[i]);
      return CLI_EXIT_USAGE;
    }
  }
  out->n = b->n_sections;
  out->tables = calloc(out->n, sizeof *out->tables);
  out->info = calloc(out->n, sizeof *out->info);
  ascr_geom_section **secs = calloc(out->n, sizeof *secs);
  job *jobs = calloc(out->n * CLI_MAX_LIST, sizeof *jobs);
  if (out->tables == NULL || out->info == NULL || secs == NULL || jobs == NULL) {
    free(secs);
    free(jobs);
    cli_tables_free(out);
    cli_error("out of memory");
    return CLI_EXIT_INTERNAL;
  }
  int rc = 0;
  const char *cache = o->cache_dir;
  if (cache != NULL && make_dirs(cache) != 0) {
    cli_warn("cache folder %s cannot be created (%s); tables are computed without a cache",
             cache, strerror(errno));
    cache = NULL;
  }
  /* a folder that cannot take new entries: read from, not written to, said once */
  int cache_ro = 0;
  if (cache != NULL && !cli_dir_writable(cache)) {
    cli_warn("cache folder %s is not writable (%s): curves are read from it but not stored",
             cache, strerror(errno));
    cache_ro = 1;
  }
  ascr_visc_params vp = cli_visc_params(&o->vo, 1e5, 0.0);
  size_t njobs = 0;
  for (size_t s = 0; s < out->n && rc == 0; s++) {
    cli_section_info *in = &out->info[s];
    const char *upath;
    if (user_file_for(o, b->section_name[s], &upath)) {
      in->user_file = upath;
      continue;
    }
    int from_file;
    rc = cli_load_section(b->section_source[s], &secs[s], NULL, &from_file);
    if (rc) {
      cli_error("(section '%s' of the blade)", b->section_name[s]);
      break;
    }
    ascr_section_fingerprint(secs[s], in->fingerprint);
    ascr_errbuf err;
    ascr_status st = ascr_rotor_section_re_range(b, s, p, rpm_lo, rpm_hi, v_lo, v_hi, &in->re_lo,
                                                 &in->re_hi, &err);
    if (st != ASCR_OK) {
      cli_error("%s", err.msg);
      rc = cli_exit_for(st);
      break;
    }
    double lo = in->re_lo < 1e3 ? 1e3 : in->re_lo, hi = in->re_hi > 1e8 ? 1e8 : in->re_hi;
    if (hi < lo) hi = lo;
    size_t nr = ascr_table_re_ladder(lo, hi, in->re, CLI_MAX_LIST);
    if (nr > CLI_MAX_LIST) {
      cli_error("section '%s': Re %.0f .. %.0f needs %zu table curves, more than %d; narrow the rpm "
                "or speed range", b->section_name[s], lo, hi, nr, CLI_MAX_LIST);
      rc = CLI_EXIT_USAGE;
      break;
    }
    in->n_curves = nr;
    for (size_t k = 0; k < nr; k++) {
      job *j = &jobs[njobs++];
      j->section = s;
      j->rq = ascr_curve_request_defaults(in->re[k]);
      j->rq.ncrit = vp.ncrit;
      j->rq.trip_upper = vp.trip_upper;
      j->rq.trip_lower = vp.trip_lower;
      j->rq.alpha_lo_deg = o->alpha_lo;
      j->rq.alpha_hi_deg = o->alpha_hi;
      j->rq.alpha_step_deg = o->alpha_step;
      j->rq.n_panels = o->panels;
      ascr_curve_cache_key(in->fingerprint, &j->rq, j->key, j->key_text, sizeof j->key_text);
      if (cache != NULL) {
        snprintf(j->path, sizeof j->path, "%s/%s.json", cache, j->key);
      }
    }
  }
  if (rc == 0) {
    /* cache look-ups first (cheap), then the computations in parallel */
    size_t todo = 0;
    for (size_t i = 0; i < njobs; i++) {
      job *j = &jobs[i];
      if (j->path[0] == '\0') {
        todo++;
        continue;
      }
      struct stat sb;
      if (stat(j->path, &sb) != 0) {
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
        cli_warn("cache entry refused, recomputing: %s", err.msg);
        j->damaged = 1;
        todo++;
      }
    }
    int tty = cli_isatty(stderr);
    if (todo > 0 && tty) {
      fprintf(stderr, "computing %zu section polar curve(s) with the viscous solver...\n", todo);
    }
    size_t done = 0;
#pragma omp parallel for schedule(dynamic, 1)
    for (long i = 0; i < (long)njobs; i++) {
      job *j = &jobs[i];
      if (j->from_cache) continue;
      j->st = ascr_table_curve_compute(secs[j->section], &j->rq, &j->curve, &j->err);
#pragma omp critical
      {
        done++;
        if (tty) {
          fprintf(stderr, "\r  %zu/%zu curves", done, todo);
          if (done == todo) fputc('\n', stderr);
          fflush(stderr);
        }
      }
    }
    for (size_t i = 0; i < njobs && rc == 0; i++) {
      job *j = &jobs[i];
      if (j->st != ASCR_OK) {
        cli_error("section '%s', Re %.0f: %s", b->section_name[j->section], j->rq.re, j->err.msg);
        rc = cli_exit_for(j->st);
        break;
      }
      if (!j->from_cache && j->path[0] != '\0' && !cache_ro) {
        ascr_errbuf err;
        char *text = NULL;
        size_t len = 0;
        if (ascr_table_file_format(b->section_name[j->section], j->key_text, &j->curve, 1, &text,
                                   &len, &err) != ASCR_OK) {
          cli_warn("cache entry not stored: %s", err.msg);
        } else if (cli_write_atomic(j->path, text, len, 1) != 0) {
          cli_warn("cache entry not stored (see above); the result is not affected");
        }
        free(text);
      }
    }
  }
  /* tables */
  for (size_t s = 0; s < out->n && rc == 0; s++) {
    cli_section_info *in = &out->info[s];
    ascr_errbuf err;
    ascr_status st;
    if (in->user_file != NULL) {
      ascr_curve_data *cv = NULL;
      size_t nc = 0;
      st = ascr_table_file_read(in->user_file, NULL, &cv, &nc, &err);
      if (st == ASCR_OK) {
        st = ascr_polar_table_from_curves(cv, nc, NULL, &out->tables[s], &err);
        in->n_curves = nc < CLI_MAX_LIST ? nc : CLI_MAX_LIST;
        for (size_t k = 0; k < in->n_curves; k++) {
          in->re[k] = cv[k].re;
          in->points[k] = cv[k].n;
          for (size_t i = 0; i < cv[k].n; i++) in->converged[k] += (size_t)cv[k].converged[i];
        }
      }
      in->curve = cv; /* kept for the caller (plots) */
      in->n_curve = nc;
      if (st != ASCR_OK) {
        cli_error("--polar-table for section '%s': %s", b->section_name[s], err.msg);
        rc = st == ASCR_EDOM ? CLI_EXIT_ANALYSIS : CLI_EXIT_INPUT;
      }
      continue;
    }
    ascr_curve_data *cv = calloc(in->n_curves, sizeof *cv);
    if (cv == NULL) {
      cli_error("out of memory");
      rc = CLI_EXIT_INTERNAL;
      break;
    }
    size_t k = 0;
    for (size_t i = 0; i < njobs; i++) {
      if (jobs[i].section != s) continue;
      cv[k] = jobs[i].curve;
      in->points[k] = jobs[i].curve.n;
      for (size_t q = 0; q < jobs[i].curve.n; q++) in->converged[k] += (size_t)jobs[i].curve.converged[q];
      in->from_cache += (size_t)jobs[i].from_cache;
      in->computed += (size_t)!jobs[i].from_cache;
      k++;
    }
    st = ascr_polar_table_from_curves(cv, k, NULL, &out->tables[s], &err);
    /* the curves move to the section info (kept for plots) */
    in->curve = cv;
    in->n_curve = k;
    for (size_t i = 0; i < njobs; i++) {
      if (jobs[i].section == s) memset(&jobs[i].curve, 0, sizeof jobs[i].curve);
    }
    if (st != ASCR_OK) {
      cli_error("section '%s': %s", b->section_name[s], err.msg);
      rc = st == ASCR_EDOM ? CLI_EXIT_ANALYSIS : cli_exit_for(st);
      break;
    }
    size_t used = ascr_polar_table_curves(out->tables[s]);
    if (used < k) {
      cli_warn("section '%s': %zu of %zu Re curves had too few converged points and are left out of "
               "its table", b->section_name[s], k - used, k);
    }
  }
  for (size_t i = 0; i < njobs; i++) ascr_curve_data_clear(&jobs[i].curve);
  free(jobs);
  for (size_t s = 0; s < out->n; s++) ascr_geom_section_free(secs[s]);
  free(secs);
  if (rc != 0) cli_tables_free(out);
  return rc;
}
