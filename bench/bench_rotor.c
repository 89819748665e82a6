/* bench/bench_rotor.c
 * Rotor-stage timings (one OpenBLAS thread; the curve computations in parallel with OpenMP
 * when available, as the CLI does):
 *   1. one BEMT point at 40 elements with the tables loaded (goal < 0.2 ms);
 *   2. one vortex-model point (goal < 50 ms);
 *   3. end to end for the example blade (docs/examples/inspection-3in.json): section files ->
 *      computed polar curves over the Re the map needs -> tables -> a 10 rpm x 10 speed map,
 *      cold (goal < 20 s on 2 cores) and warm from the cache files (goal < 1 s).
 * Run: ./build/bench/bench_rotor [SOURCE_DIR [--points-only]]
 */
#define _POSIX_C_SOURCE 200809L
#include "airscrew/airscrew.h"
#include "bench_util.h"

#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

void openblas_set_num_threads(int num_threads);

typedef struct job {
  size_t section;
  ascr_curve_request rq;
  char key[17], text[512], path[600];
  ascr_curve_data c;
} job;

static int build_tables(const ascr_blade *b, ascr_geom_section **secs, const char *dir, int warm,
                        double rpm_lo, double rpm_hi, double v_lo, double v_hi,
                        ascr_polar_table **tabs, size_t *ncurves)
{
  job jobs[64];
  size_t nj = 0;
  for (size_t s = 0; s < b->n_sections; s++) {
    double lo, hi, re[16];
    ascr_rotor_section_re_range(b, s, NULL, rpm_lo, rpm_hi, v_lo, v_hi, &lo, &hi, NULL);
    size_t nr = ascr_table_re_ladder(lo, hi, re, 16);
    char fp[17];
    ascr_section_fingerprint(secs[s], fp);
    for (size_t k = 0; k < nr && nj < 64; k++) {
      job *j = &jobs[nj++];
      memset(j, 0, sizeof *j);
      j->section = s;
      j->rq = ascr_curve_request_defaults(re[k]);
      ascr_curve_cache_key(fp, &j->rq, j->key, j->text, sizeof j->text);
      snprintf(j->path, sizeof j->path, "%s/%s.json", dir, j->key);
    }
  }
  if (warm) {
    for (size_t i = 0; i < nj; i++) {
      ascr_curve_data *cv = NULL;
      size_t n = 0;
      if (ascr_table_file_read(jobs[i].path, jobs[i].text, &cv, &n, NULL) != ASCR_OK) return 1;
      jobs[i].c = cv[0];
      free(cv);
    }
  } else {
#pragma omp parallel for schedule(dynamic, 1)
    for (long i = 0; i < (long)nj; i++) {
      ascr_table_curve_compute(secs[jobs[i].section], &jobs[i].rq, &jobs[i].c, NULL);
    }
    for (size_t i = 0; i < nj; i++) {
      ascr_table_file_write(jobs[i].path, "bench", jobs[i].text, &jobs[i].c, 1, NULL);
    }
  }
  for (size_t s = 0; s < b->n_sections; s++) {
    ascr_curve_data cv[16];
    size_t k = 0;
    for (size_t i = 0; i < nj; i++) {
      if (jobs[i].section == s) cv[k++] = jobs[i].c;
    }
    if (ascr_polar_table_from_curves(cv, k, NULL, &tabs[s], NULL) != ASCR_OK) return 1;
  }
  for (size_t i = 0; i < nj; i++) ascr_curve_data_clear(&jobs[i].c);
  *ncurves = nj;
  return 0;
}

static double run_map(const ascr_blade *b, const ascr_polar_table *const *t, const double *rpm,
                      const double *v, size_t *nconv)
{
  double t0 = bench_now();
  *nconv = 0;
  for (int i = 0; i < 10; i++) {
    for (int k = 0; k < 10; k++) {
      ascr_rotor_result r;
      ascr_rotor_bemt(b, t, NULL, rpm[i], v[k], &r, NULL, NULL);
      *nconv += (size_t)r.converged;
    }
  }
  return bench_now() - t0;
}

/* single points on the test rotor of tests/data (its table file loaded) */
static int single_points(const char *src)
{
  char bp[600], tp[600];
  snprintf(bp, sizeof bp, "%s/tests/data/blades/two-blade-4412.json", src);
  snprintf(tp, sizeof tp, "%s/tests/data/naca4412-table.json", src);
  ascr_blade *b = NULL;
  ascr_curve_data *cv = NULL;
  size_t nc = 0;
  ascr_polar_table *t = NULL;
  ascr_errbuf err;
  if (ascr_blade_read(bp, &b, &err) != ASCR_OK || ascr_table_file_read(tp, NULL, &cv, &nc, &err) != ASCR_OK ||
      ascr_polar_table_from_curves(cv, nc, NULL, &t, &err) != ASCR_OK) {
    fprintf(stderr, "%s\n", err.msg);
    return 1;
  }
  const ascr_polar_table *tv[1] = {t};
  double tb[500], tvx[40];
  ascr_rotor_result r;
  int bconv = 0, vconv = 0;
  for (int i = 0; i < 500; i++) {
    double s = bench_now();
    ascr_rotor_bemt(b, tv, NULL, 8000.0 + 10.0 * (i % 10), 8.0, &r, NULL, NULL);
    tb[i] = bench_now() - s;
    bconv += r.converged;
  }
  printf("BEMT point, 40 elements, tables loaded (8-in test rotor, 8000 rpm, 8 m/s): median %.3f ms "
         "(goal 0.2 ms; %d of 500 converged)\n", 1e3 * bench_median(tb, 500), bconv);
  for (int i = 0; i < 40; i++) {
    double s = bench_now();
    ascr_rotor_vortex(b, tv, NULL, NULL, 8000.0, i % 2 ? 12.0 : 6.0, &r, NULL, NULL);
    tvx[i] = bench_now() - s;
    vconv += r.converged;
  }
  printf("vortex point, 40 elements (same rotor, 6 and 12 m/s): median %.1f ms (goal 50 ms; %d of "
         "40 converged)\n", 1e3 * bench_median(tvx, 40), vconv);
  for (size_t k = 0; k < nc; k++) ascr_curve_data_clear(&cv[k]);
  free(cv);
  ascr_polar_table_free(t);
  ascr_blade_free(b);
  return 0;
}

int main(int argc, char **argv)
{
  openblas_set_num_threads(1);
  const char *src = argc > 1 ? argv[1] : ".";
  if (single_points(src)) return 1;
  if (argc > 2 && strcmp(argv[2], "--points-only") == 0) return 0;
  char path[600];
  snprintf(path, sizeof path, "%s/docs/examples/inspection-3in.json", src);
  ascr_blade *b = NULL;
  ascr_errbuf err;
  if (ascr_blade_read(path, &b, &err) != ASCR_OK) {
    fprintf(stderr, "%s\n", err.msg);
    return 1;
  }
  ascr_geom_section *secs[8] = {NULL};
  for (size_t s = 0; s < b->n_sections; s++) {
    ascr_status st = ascr_geom_is_spec(b->section_source[s])
                         ? ascr_geom_section_from_spec(b->section_source[s], &secs[s], &err)
                         : ascr_geom_section_read(b->section_source[s], &secs[s], NULL, &err);
    if (st != ASCR_OK) {
      fprintf(stderr, "%s\n", err.msg);
      return 1;
    }
  }
  char dir[] = "/tmp/ascr-bench-XXXXXX";
  if (mkdtemp(dir) == NULL) return 1;
  double rpm[10], v[10];
  for (int i = 0; i < 10; i++) {
    rpm[i] = 12000.0 + 1500.0 * i;
    v[i] = 1.5 * i;
  }
  ascr_polar_table *tabs[8] = {NULL};
  size_t ncur = 0, nconv = 0;
  double t0 = bench_now();
  if (build_tables(b, secs, dir, 0, rpm[0], rpm[9], v[0], v[9], tabs, &ncur)) {
    fprintf(stderr, "table build failed\n");
    return 1;
  }
  double tcurves = bench_now() - t0;
  double tmap = run_map(b, (const ascr_polar_table *const *)tabs, rpm, v, &nconv);
  printf("end to end, cold: %zu polar curves in %.2f s + 10x10 BEMT map %.3f s = %.2f s "
         "(%zu of 100 points converged; goal 20 s)\n", ncur, tcurves, tmap, tcurves + tmap, nconv);
  for (size_t s = 0; s < b->n_sections; s++) ascr_polar_table_free(tabs[s]);
  t0 = bench_now();
  if (build_tables(b, secs, dir, 1, rpm[0], rpm[9], v[0], v[9], tabs, &ncur)) {
    fprintf(stderr, "warm table build failed\n");
    return 1;
  }
  double twarm = bench_now() - t0;
  tmap = run_map(b, (const ascr_polar_table *const *)tabs, rpm, v, &nconv);
  printf("end to end, warm: %zu cached curves read in %.3f s + map %.3f s = %.3f s (goal 1 s)\n",
         ncur, twarm, tmap, twarm + tmap);

  /* single points */
  const ascr_polar_table *const *tv = (const ascr_polar_table *const *)tabs;
  double tb[200], tvx[20];
  ascr_rotor_result r;
  for (int i = 0; i < 200; i++) {
    double s = bench_now();
    ascr_rotor_bemt(b, tv, NULL, 20000.0, 5.0, &r, NULL, NULL);
    tb[i] = bench_now() - s;
  }
  printf("example blade: BEMT point, 40 elements, tables loaded: median %.3f ms\n",
         1e3 * bench_median(tb, 200));
  int vconv = 0;
  for (int i = 0; i < 20; i++) {
    double s = bench_now();
    ascr_rotor_vortex(b, tv, NULL, NULL, 20000.0, i % 2 ? 5.0 : 0.0, &r, NULL, NULL);
    tvx[i] = bench_now() - s;
    vconv += r.converged;
  }
  printf("example blade: vortex point, 40 elements (hover and 5 m/s alternately): median %.1f ms "
         "(%d of 20 converged)\n", 1e3 * bench_median(tvx, 20), vconv);
  for (size_t s = 0; s < b->n_sections; s++) {
    ascr_polar_table_free(tabs[s]);
    ascr_geom_section_free(secs[s]);
  }
  ascr_blade_free(b);
  char cmd[700];
  snprintf(cmd, sizeof cmd, "rm -rf '%s'", dir);
  return system(cmd) == 0 ? 0 : 1;
}
