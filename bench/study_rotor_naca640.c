/* bench/study_rotor_naca640.c
 * The rotor chain at a Reynolds number where section polars are not in doubt: the full-scale
 * 10-ft two-blade Navy 5868-9 propeller (Clark Y sections, blade angle 15 deg at 0.75 R, 1200
 * rpm, Re about 1.8e6 at 0.75 R, tip Mach 0.56) of NACA Report 640 (Hartman & Biermann 1938),
 * as re-plotted by Deters, Ananda & Selig (AIAA 2014-2151, Figs. 62-63;
 * reference/naca640_5868-9_2blade_15deg_fullscale.csv) with the chord, twist and thickness of
 * their Fig. 20 (reference/nr640_navy5868-9_geometry_fig20.csv). Both read by eye off the
 * figures (about +-0.003 in CT and CP).
 *
 * Sections: the UIUC Clark Y coordinates (reference/clarky_coords_uiuc.csv) with every ordinate
 * scaled to the station's thickness ratio (the flat lower surface stays flat; camber scales
 * with thickness: an assumption of ours, the report's section family is not in the files).
 * Stations at the figure's radii from 0.3 R (where its curves start; the shank inboard is left
 * out), values missing at a radius interpolated linearly in r/R between its neighbours, t/c at
 * the tip taken as at 0.95 R. Air: ISA sea level. Tables: the library's pipeline
 * (ascr_blade_tables_prepare), N_crit 9 unless given, curves -8..16 deg; BEMT and the vortex
 * model. Figures only (a study, not a test).
 * Arguments: [reference folder] [scratch folder or -] [N_crit].
 */
#include <airscrew/airscrew.h>
#include <gsl/gsl_errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

void openblas_set_num_threads(int num_threads);

#define NST 7
#define MAXC 400

static int read_rows(const char *path, int ncol, double rows[][4], size_t max, size_t *n)
{
  FILE *f = fopen(path, "r");
  if (f == NULL) {
    fprintf(stderr, "cannot open %s\n", path);
    return 1;
  }
  char line[512];
  *n = 0;
  while (fgets(line, sizeof line, f) != NULL && *n < max) {
    if (line[0] == '#' || !(line[0] == '-' || line[0] == '.' || (line[0] >= '0' && line[0] <= '9'))) continue;
    char *p = line;
    for (int c = 0; c < ncol; c++) {
      char *e = strchr(p, ',');
      if (e != NULL) *e = '\0';
      char *end;
      double v = strtod(p, &end);
      rows[*n][c] = end == p ? NAN : v; /* an empty field: NaN */
      p = e != NULL ? e + 1 : p + strlen(p);
    }
    (*n)++;
  }
  fclose(f);
  return 0;
}

/* column c at r/R x: the row's value, else linear between the nearest rows that have one */
static double column_at(double rows[][4], size_t n, int c, double x)
{
  double xa = NAN, va = NAN, xb = NAN, vb = NAN;
  for (size_t i = 0; i < n; i++) {
    if (!isfinite(rows[i][c])) continue;
    if (fabs(rows[i][0] - x) < 1e-9) return rows[i][c];
    if (rows[i][0] < x) { xa = rows[i][0]; va = rows[i][c]; }
    if (rows[i][0] > x && isnan(xb)) { xb = rows[i][0]; vb = rows[i][c]; }
  }
  if (isnan(xb)) return va;
  if (isnan(xa)) return vb;
  return va + (x - xa) / (xb - xa) * (vb - va);
}

int main(int argc, char **argv)
{
  gsl_set_error_handler_off();
  openblas_set_num_threads(1);
  const char *dir = argc > 1 ? argv[1] : "reference";
  char scratch_tpl[] = "/tmp/airscrew-naca640-XXXXXX";
  int own_scratch = argc <= 2 || strcmp(argv[2], "-") == 0;
  const char *scratch = own_scratch ? mkdtemp(scratch_tpl) : argv[2];
  if (scratch == NULL) return 1;
  char path[1024];
  double geo[32][4], meas[32][4];
  size_t ng, nm;
  snprintf(path, sizeof path, "%s/nr640_navy5868-9_geometry_fig20.csv", dir);
  if (read_rows(path, 4, geo, 32, &ng)) return 1;
  snprintf(path, sizeof path, "%s/naca640_5868-9_2blade_15deg_fullscale.csv", dir);
  if (read_rows(path, 4, meas, 32, &nm)) return 1;
  /* Clark Y ordinates and their thickness */
  double cx[MAXC], cy[MAXC], tmp[MAXC][4];
  size_t nc;
  snprintf(path, sizeof path, "%s/clarky_coords_uiuc.csv", dir);
  if (read_rows(path, 2, tmp, MAXC, &nc)) return 1;
  for (size_t i = 0; i < nc; i++) {
    cx[i] = tmp[i][0];
    cy[i] = tmp[i][1];
  }
  double tc0 = 0.0; /* upper minus lower at the same x, linear on the lower surface */
  for (size_t i = 0; i < nc && cx[i] > 0.0; i++) {
    for (size_t j = nc - 1; j > 0; j--) {
      if (cx[j - 1] <= cx[i] && cx[j] >= cx[i] && cx[j] > cx[j - 1]) {
        double yl = cy[j - 1] + (cx[i] - cx[j - 1]) / (cx[j] - cx[j - 1]) * (cy[j] - cy[j - 1]);
        tc0 = fmax(tc0, cy[i] - yl);
        break;
      }
    }
  }
  const double rr[NST] = {0.3, 0.4, 0.5, 0.6, 0.75, 0.9, 1.0};
  const double rtip = 1.524, rpm = 1200.0, n_rev = rpm / 60.0, d = 2.0 * rtip;
  ascr_blade_station st[NST];
  char *src[NST], *nam[NST];
  printf("Navy 5868-9, NACA Report 640: 10 ft, 2 blades, 15 deg at 0.75 R, %.0f rpm; Clark Y "
         "(t/c %.4f) scaled per station\n  r/R    c/R   beta   t/c\n", rpm, tc0);
  for (int k = 0; k < NST; k++) {
    double c = column_at(geo, ng, 1, rr[k]), b = column_at(geo, ng, 2, rr[k]);
    double t = column_at(geo, ng, 3, rr[k]);
    printf("  %.2f  %.3f  %5.1f  %.3f\n", rr[k], c, b, t);
    snprintf(path, sizeof path, "%s/clarky_t%03.0f.csv", scratch, 1000.0 * t);
    FILE *f = fopen(path, "w");
    if (f == NULL) return 1;
    fprintf(f, "# Clark Y (reference/clarky_coords_uiuc.csv) with ordinates scaled to t/c %.3f\n", t);
    for (size_t i = 0; i < nc; i++) fprintf(f, "%.6f %.6f\n", cx[i], cy[i] * t / tc0);
    fclose(f);
    src[k] = strdup(path);
    char nm_k[32];
    snprintf(nm_k, sizeof nm_k, "clarky_t%03.0f", 1000.0 * t);
    nam[k] = strdup(nm_k);
    st[k] = (ascr_blade_station){rr[k] * rtip, c * rtip, b, (size_t)k};
  }
  ascr_blade bl;
  memset(&bl, 0, sizeof bl);
  bl.name = "Navy 5868-9";
  bl.n_blades = 2;
  bl.r_tip_m = rtip;
  bl.r_hub_m = 0.3 * rtip;
  bl.rotation = 1;
  bl.n_stations = NST;
  bl.stations = st;
  bl.n_sections = NST;
  bl.section_source = src;
  bl.section_name = nam;
  ascr_rotor_params p = ascr_rotor_params_defaults();
  p.hub_loss = 0; /* the blade root is a shank, not a hub wall */
  ascr_blade_tables_options o = ascr_blade_tables_options_defaults();
  if (argc > 3) o.curve.ncrit = atof(argv[3]);
  printf("N_crit %.3g\n", o.curve.ncrit);
  ascr_blade_tables tb;
  ascr_errbuf err;
  double vmax = meas[nm - 1][0] * n_rev * d;
  if (ascr_blade_tables_prepare(&bl, &p, rpm, rpm, 0.0, vmax, &o, &tb, &err) != ASCR_OK) {
    fprintf(stderr, "tables: %s\n", err.msg);
    return 1;
  }
  for (size_t k = 0; k < tb.n; k++) {
    const ascr_section_table_info *in = &tb.info[k];
    printf("  section %zu (%s): Re %.3g-%.3g, %zu curves, %zu used\n", k, nam[k], in->re_lo,
           in->re_hi, in->n_curves, in->n_used);
  }
  for (size_t i = 0; i < tb.n_notes; i++) printf("  note: %s\n", tb.notes[i]);
  const ascr_polar_table *const *tabs = (const ascr_polar_table *const *)tb.tables;
  printf("\n    J | CT meas  BEMT (err %%)  vortex (err %%) | CP meas  BEMT (err %%)  vortex (err %%) | "
         "eta meas  BEMT | stalled flagged%%\n");
  double sct = 0.0, scp = 0.0;
  size_t nct = 0;
  for (size_t i = 0; i < nm; i++) {
    double j = meas[i][0], v = j * n_rev * d;
    ascr_rotor_result r, rv;
    if (ascr_rotor_bemt(&bl, tabs, &p, rpm, v, &r, NULL, &err) != ASCR_OK) {
      fprintf(stderr, "J %.2f: %s\n", j, err.msg);
      continue;
    }
    int okv = ascr_rotor_vortex(&bl, tabs, &p, NULL, rpm, v, &rv, NULL, &err) == ASCR_OK &&
              rv.converged;
    double ect = 100.0 * (r.CT / meas[i][1] - 1.0), ecp = 100.0 * (r.CP / meas[i][2] - 1.0);
    printf(" %.2f | %.4f  %.4f (%+5.1f)  %.4f (%+5.1f) | %.4f  %.4f (%+5.1f)  %.4f (%+5.1f) | "
           "%.3f  %.3f | %zu %.0f%s\n", j, meas[i][1], r.CT, ect, okv ? rv.CT : NAN,
           okv ? 100.0 * (rv.CT / meas[i][1] - 1.0) : NAN, meas[i][2], r.CP, ecp,
           okv ? rv.CP : NAN, okv ? 100.0 * (rv.CP / meas[i][2] - 1.0) : NAN, meas[i][3],
           r.efficiency, r.n_stalled, 100.0 * r.flagged_thrust_share, r.converged ? "" : " (not converged)");
    if (meas[i][1] > 0.03) { /* relative errors blow up as thrust goes to zero */
      sct += fabs(ect);
      scp += fabs(ecp);
      nct++;
    }
  }
  printf("mean |error| where CT > 0.03 (%zu points): CT %.1f %%, CP %.1f %%\n", nct,
         nct ? sct / (double)nct : NAN, nct ? scp / (double)nct : NAN);
  ascr_blade_tables_free(&tb);
  for (int k = 0; k < NST; k++) {
    remove(src[k]);
    free(src[k]);
    free(nam[k]);
  }
  if (own_scratch) remove(scratch);
  return 0;
}
