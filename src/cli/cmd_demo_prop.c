/* src/cli/cmd_demo_prop.c
 * The propeller scenario of "airscrew demo" (our own): a three-inch, three-blade propeller for
 * an indoor inspection micro-drone of 140 g on four rotors. From its thin-plate sections to
 * polars at the blade Reynolds numbers, the rotor map with both inflow models, and the hover
 * point; written to a folder as CSV/JSON, SVG/PNG plots and a one-page HTML report.
 */
#define _POSIX_C_SOURCE 200809L
#include "cli.h"
#include "cli_figures.h"
#include "cli_plot.h"
#include "cli_tables.h"
#include "commands.h"
#include "demo_drive.h"
#include "demo_design.h"
#include "demo_structure.h"

#include <dirent.h>
#include <errno.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>

/* the blade of docs/examples/inspection-3in.json, with the tip section as its generator spec */
static const char demo_blade[] =
  "{\n"
  "  \"format\": \"airscrew-blade-1\",\n"
  "  \"name\": \"3-inch three-blade prop for an indoor inspection micro-drone (airscrew demo)\",\n"
  "  \"blades\": 3,\n"
  "  \"length_unit\": \"mm\",\n"
  "  \"tip_radius\": 38.1,\n"
  "  \"hub_radius\": 6.0,\n"
  "  \"rotation\": \"ccw\",\n"
  "  \"sections\": {\n"
  "    \"root\": \"plate:t=4,f=4,xf=40,nose=1.2,taper=25,te=0.4\",\n"
  "    \"blade\": \"plate:t=2.5,f=4.5,xf=42,nose=1.2,taper=25,te=0.3\"\n"
  "  },\n"
  "  \"stations\": [\n"
  "    {\"r\": 7.0,  \"chord\": 7.0, \"twist_deg\": 26.0, \"section\": \"root\"},\n"
  "    {\"r\": 10.0, \"chord\": 8.5, \"twist_deg\": 25.0, \"section\": \"root\"},\n"
  "    {\"r\": 15.0, \"chord\": 9.0, \"twist_deg\": 22.0, \"section\": \"blade\"},\n"
  "    {\"r\": 20.0, \"chord\": 8.5, \"twist_deg\": 19.0, \"section\": \"blade\"},\n"
  "    {\"r\": 25.0, \"chord\": 7.6, \"twist_deg\": 16.0, \"section\": \"blade\"},\n"
  "    {\"r\": 30.0, \"chord\": 6.4, \"twist_deg\": 13.5, \"section\": \"blade\"},\n"
  "    {\"r\": 34.0, \"chord\": 5.2, \"twist_deg\": 12.0, \"section\": \"blade\"},\n"
  "    {\"r\": 38.1, \"chord\": 3.0, \"twist_deg\": 10.5, \"section\": \"blade\"}\n"
  "  ]\n"
  "}\n";

#define CRAFT_MASS_KG 0.140
#define CRAFT_ROTORS 4
#define NRPM 8
#define NSPD 7
static const double demo_rpm[NRPM] = {12000, 14000, 16000, 18000, 20000, 22000, 24000, 26000};
static const double demo_speed[NSPD] = {0, 2, 4, 6, 8, 10, 12};

static const char *const cautions[] = {
    "These are estimates from published methods with known limits; confirm them on a guarded "
    "thrust stand before flight.",
    "A spinning propeller cuts, and blades and hubs can fail at high rpm: keep people out of the "
    "plane of rotation, use guards, and follow local rules and qualified practice.",
    NULL};

static int write_text(const char *dir, const char *name, const char *text, size_t len)
{
  char path[4200];
  snprintf(path, sizeof path, "%s/%s", dir, name);
  return cli_write_atomic(path, text, len, 1);
}

/* memory stream helpers */
typedef struct mbuf {
  char *p;
  size_t n;
  FILE *f;
} mbuf;

static int mopen(mbuf *m)
{
  m->p = NULL;
  m->n = 0;
  m->f = open_memstream(&m->p, &m->n);
  return m->f == NULL;
}

static int mwrite(mbuf *m, const char *dir, const char *name)
{
  fclose(m->f);
  int rc = write_text(dir, name, m->p, m->n);
  free(m->p);
  return rc;
}

/* Write an SVG document inline with its ids (and the references to them: href="#...",
 * url(#...)) prefixed, so that several figures in one HTML page keep their own glyph and clip
 * definitions (issue 17: the plotting library names them alike in every figure, and a browser
 * drew every figure after the first with the first one's glyphs). */
static void write_svg_scoped(FILE *f, const char *svg, const char *prefix)
{
  static const char *const marks[] = {" id=\"", "href=\"#", "url(#"};
  const char *p = svg;
  for (;;) {
    const char *best = NULL;
    size_t blen = 0;
    for (size_t m = 0; m < sizeof marks / sizeof marks[0]; m++) {
      const char *q = strstr(p, marks[m]);
      if (q != NULL && (best == NULL || q < best)) {
        best = q;
        blen = strlen(marks[m]);
      }
    }
    if (best == NULL) break;
    fwrite(p, 1, (size_t)(best - p) + blen, f);
    fputs(prefix, f);
    p = best + blen;
  }
  fputs(p, f);
}

static char *slurp(const char *path, size_t *len)
{
  FILE *f = fopen(path, "rb");
  if (f == NULL) return NULL;
  char *b = NULL;
  size_t n = 0;
  FILE *m = open_memstream(&b, &n);
  char chunk[8192];
  size_t got;
  while ((got = fread(chunk, 1, sizeof chunk, f)) > 0) fwrite(chunk, 1, got, m);
  fclose(f);
  fclose(m);
  *len = n;
  return b;
}

typedef struct demo_point {
  ascr_rotor_result r;
  int solved;
} demo_point;

static void num(FILE *f, int ok, double v, const char *fmt)
{
  if (ok && isfinite(v)) fprintf(f, fmt, v);
}

int demo_prop(int argc, char **argv)
{
  const char *outdir = "airscrew-demo", *cache_dir = NULL;
  int force = 0, no_cache = 0;
  for (int i = 1; i < argc; i++) {
    if (strcmp(argv[i], "--out") == 0 && i + 1 < argc) {
      outdir = argv[++i];
    } else if (strcmp(argv[i], "--cache-dir") == 0 && i + 1 < argc) {
      cache_dir = argv[++i];
    } else if (strcmp(argv[i], "--no-cache") == 0) {
      no_cache = 1;
    } else if (strcmp(argv[i], "--force") == 0) {
      force = 1;
    } else {
      cli_error("demo: unexpected '%s' (see airscrew demo --help)", argv[i]);
      return CLI_EXIT_USAGE;
    }
  }
  if (no_cache && cache_dir != NULL) {
    cli_error("demo: --no-cache and --cache-dir exclude each other");
    return CLI_EXIT_USAGE;
  }
  if (cli_check_options_only) return CLI_EXIT_OK;
  /* the output folder: created, or empty, or replaced file by file with --force */
  struct stat sb;
  if (stat(outdir, &sb) == 0) {
    if (!S_ISDIR(sb.st_mode)) {
      cli_error("%s: exists and is not a folder", outdir);
      return CLI_EXIT_OUTPUT;
    }
    DIR *d = opendir(outdir);
    int nonempty = 0;
    struct dirent *e;
    while (d != NULL && (e = readdir(d)) != NULL) {
      if (strcmp(e->d_name, ".") != 0 && strcmp(e->d_name, "..") != 0) nonempty = 1;
    }
    if (d != NULL) closedir(d);
    if (nonempty && !force) {
      cli_error("%s: exists and is not empty; not overwritten (add --force to replace the demo's "
                "files in it)", outdir);
      return CLI_EXIT_OUTPUT;
    }
  } else if (mkdir(outdir, 0755) != 0) {
    cli_error("%s: cannot create the output folder: %s", outdir, strerror(errno));
    return CLI_EXIT_OUTPUT;
  }

  ascr_errbuf err;
  ascr_blade *b = NULL;
  ascr_status st = ascr_blade_parse(demo_blade, sizeof demo_blade - 1, "built-in demo blade", NULL, &b, &err);
  if (st != ASCR_OK) {
    cli_error("%s", err.msg);
    return CLI_EXIT_INTERNAL;
  }
  ascr_rotor_params rp = ascr_rotor_params_defaults();
  ascr_isa(0.0, &rp.density_kg_m3, &rp.viscosity_pa_s, &rp.sound_speed_m_s, NULL);
  cli_table_opts to;
  cli_table_opts_init(&to);
  to.cache_dir = no_cache ? NULL : (cache_dir != NULL ? cache_dir : cli_default_cache_dir());
  /* progress only: the demo's title heads the summary on standard output */
  fprintf(stderr, "airscrew demo: section polars over the blade Reynolds numbers (cached after the "
                  "first run)...\n");
  cli_tables tabs;
  int rc = cli_tables_prepare(b, &rp, demo_rpm[0], demo_rpm[NRPM - 1], demo_speed[0],
                              demo_speed[NSPD - 1], &to, &tabs);
  if (rc) {
    ascr_blade_free(b);
    return rc;
  }
  const ascr_polar_table *const *tv = (const ascr_polar_table *const *)tabs.tables;
  fprintf(stderr, "  rotor map: %d rpm x %d speeds, BEMT and vortex models...\n", NRPM, NSPD);
  static demo_point map[2][NRPM][NSPD];
  size_t nconv[2] = {0, 0};
  for (int m = 0; m < 2; m++) {
    for (int i = 0; i < NRPM; i++) {
      for (int k = 0; k < NSPD; k++) {
        demo_point *p = &map[m][i][k];
        st = ascr_rotor_point(b, tv, &rp, m ? ASCR_INFLOW_VORTEX : ASCR_INFLOW_BEMT, NULL,
                              demo_rpm[i], demo_speed[k], &p->r, NULL, &err);
        p->solved = st == ASCR_OK;
        nconv[m] += (size_t)(p->solved && p->r.converged);
      }
    }
  }
  /* hover for the craft's weight */
  double thrust_hover = CRAFT_MASS_KG * 9.80665 / CRAFT_ROTORS;
  ascr_rotor_result hov[2];
  static ascr_rotor_element hel[2][400];
  int hov_ok[2];
  char hov_msg[2][ASCR_ERRBUF_SIZE];
  for (int m = 0; m < 2; m++) {
    /* the vortex model searches near the BEMT answer (it is the slower and, at very low rpm
     * where the blade stalls, the less robust of the two) */
    double lo = m && hov_ok[0] ? 0.8 * hov[0].rpm : 6000.0, hi = m && hov_ok[0] ? 1.25 * hov[0].rpm : 45000.0;
    st = ascr_rotor_rpm_for_thrust(b, tv, &rp, m ? ASCR_INFLOW_VORTEX : ASCR_INFLOW_BEMT, NULL,
                                   thrust_hover, 0.0, lo, hi, &hov[m], hel[m], &err);
    hov_ok[m] = st == ASCR_OK && hov[m].converged;
    snprintf(hov_msg[m], sizeof hov_msg[m], "%s", hov_ok[m] ? "" : err.msg);
  }

  /* ---- the prop on its powertrain (its own tables, as "airscrew drive" makes them) ---- */
  fprintf(stderr, "  powertrain: hover, climb and throttle maps...\n");
  demo_drive_out dd;
  rc = demo_drive_section(b, &rp, &to, outdir, &dd);
  if (rc) {
    cli_tables_free(&tabs);
    ascr_blade_free(b);
    return rc;
  }

  /* ---- the blade of least induced loss for the same hover, beside the hand-drawn one ---- */
  demo_design_out dz;
  rc = demo_design_section(b, tv, &rp, thrust_hover, outdir, &dz);
  if (rc) {
    demo_drive_out_free(&dd);
    cli_tables_free(&tabs);
    ascr_blade_free(b);
    return rc;
  }

  /* ---- the blade as a part: stresses, modes, the printable propeller ---- */
  fprintf(stderr, "  structure: stresses, rotating modes, STL...\n");
  demo_structure_out ds;
  memset(&ds, 0, sizeof ds);
  if (hov_ok[0]) {
    rc = demo_structure_section(b, tv, &rp, hov[0].rpm, hel[0], dd.full_throttle_rpm, outdir, &ds);
    if (rc) {
      demo_design_out_free(&dz);
      demo_drive_out_free(&dd);
      demo_structure_out_free(&ds);
      cli_tables_free(&tabs);
      ascr_blade_free(b);
      return rc;
    }
  }

  /* ---- files ---- */
  rc = write_text(outdir, "blade.json", demo_blade, sizeof demo_blade - 1);
  mbuf mb;
  if (rc == 0 && mopen(&mb) == 0) {
    fputs("# section polars computed by airscrew (viscous panel method); unconverged points have empty numbers\n"
          "section,re,alpha_deg,cl,cd,cm,converged\n", mb.f);
    for (size_t s = 0; s < tabs.n; s++) {
      for (size_t k = 0; k < tabs.info[s].n_curve; k++) {
        const ascr_curve_data *c = &tabs.info[s].curve[k];
        for (size_t i = 0; i < c->n; i++) {
          fprintf(mb.f, "%s,%.6g,%.3f,", b->section_name[s], c->re, c->alpha_deg[i]);
          num(mb.f, c->converged[i], c->cl[i], "%.6f");
          fputc(',', mb.f);
          num(mb.f, c->converged[i], c->cd[i], "%.6f");
          fputc(',', mb.f);
          num(mb.f, c->converged[i], c->cm[i], "%.6f");
          fprintf(mb.f, ",%s\n", c->converged[i] ? "true" : "false");
        }
      }
    }
    rc = mwrite(&mb, outdir, "polars.csv");
  }
  if (rc == 0 && mopen(&mb) == 0) {
    for (int q = 0; cautions[q] != NULL; q++) fprintf(mb.f, "# caution: %s\n", cautions[q]);
    fputs("model,rpm,speed_m_s,J,thrust_N,torque_Nm,power_W,CT,CP,efficiency,figure_of_merit,converged\n", mb.f);
    for (int m = 0; m < 2; m++) {
      for (int i = 0; i < NRPM; i++) {
        for (int k = 0; k < NSPD; k++) {
          const demo_point *p = &map[m][i][k];
          int ok = p->solved && p->r.converged;
          fprintf(mb.f, "%s,%.0f,%.2f,%.5f,", m ? "vortex" : "bemt", demo_rpm[i], demo_speed[k],
                  ok ? p->r.J : NAN);
          num(mb.f, ok, p->r.thrust_N, "%.6f");
          fputc(',', mb.f);
          num(mb.f, ok, p->r.torque_Nm, "%.7f");
          fputc(',', mb.f);
          num(mb.f, ok, p->r.power_W, "%.5f");
          fputc(',', mb.f);
          num(mb.f, ok, p->r.CT, "%.6f");
          fputc(',', mb.f);
          num(mb.f, ok, p->r.CP, "%.6f");
          fputc(',', mb.f);
          num(mb.f, ok, p->r.efficiency, "%.5f");
          fputc(',', mb.f);
          num(mb.f, ok, p->r.figure_of_merit, "%.5f");
          fprintf(mb.f, ",%s\n", ok ? "true" : "false");
        }
      }
    }
    rc = mwrite(&mb, outdir, "rotor-map.csv");
  }
  if (rc == 0) {
    json_t *o = json_object(), *ms = json_array();
    json_object_set_new(o, "scenario", json_string(b->name));
    json_object_set_new(o, "craft_mass_kg", json_real(CRAFT_MASS_KG));
    json_object_set_new(o, "rotors", json_integer(CRAFT_ROTORS));
    json_object_set_new(o, "thrust_per_rotor_N", json_real(thrust_hover));
    for (int m = 0; m < 2; m++) {
      json_t *h = json_object(), *sa = json_array();
      json_object_set_new(h, "inflow", json_string(m ? "vortex" : "bemt"));
      json_object_set_new(h, "converged", json_boolean(hov_ok[m]));
      json_object_set_new(h, "rpm", cli_json_num(hov_ok[m], hov[m].rpm));
      json_object_set_new(h, "thrust_N", cli_json_num(hov_ok[m], hov[m].thrust_N));
      json_object_set_new(h, "torque_Nm", cli_json_num(hov_ok[m], hov[m].torque_Nm));
      json_object_set_new(h, "power_W", cli_json_num(hov_ok[m], hov[m].power_W));
      json_object_set_new(h, "figure_of_merit", cli_json_num(hov_ok[m], hov[m].figure_of_merit));
      json_object_set_new(h, "tip_mach", cli_json_num(hov_ok[m], hov[m].tip_mach));
      json_object_set_new(h, "CT_over_sigma", cli_json_num(hov_ok[m], hov[m].CT_over_sigma));
      json_object_set_new(h, "confidence",
                          hov_ok[m] ? json_string(hov[m].low_confidence ? "low" : "normal") : json_null());
      if (!hov_ok[m]) json_object_set_new(h, "message", json_string(hov_msg[m]));
      for (size_t e = 0; hov_ok[m] && e < rp.n_elements; e++) {
        const ascr_rotor_element *el = &hel[m][e];
        json_t *eo = json_object();
        json_object_set_new(eo, "r_over_R", json_real(el->r_m / b->r_tip_m));
        json_object_set_new(eo, "alpha_deg", cli_json_num(1, el->alpha_deg));
        json_object_set_new(eo, "re", cli_json_num(1, el->re));
        json_object_set_new(eo, "cl", cli_json_num(1, el->cl));
        json_object_set_new(eo, "cd", cli_json_num(1, el->cd));
        json_object_set_new(eo, "dT_dr_N_per_m", cli_json_num(1, el->dT_dr_N_m));
        json_object_set_new(eo, "stalled", json_boolean(el->stalled));
        json_array_append_new(sa, eo);
      }
      json_object_set_new(h, "stations", sa);
      json_array_append_new(ms, h);
    }
    json_object_set_new(o, "hover", ms);
    json_t *ca = json_array();
    for (int q = 0; cautions[q] != NULL; q++) json_array_append_new(ca, json_string(cautions[q]));
    json_object_set_new(o, "cautions", ca);
    char *txt = json_dumps(o, JSON_INDENT(1) | JSON_REAL_PRECISION(8));
    rc = txt != NULL ? write_text(outdir, "hover.json", txt, strlen(txt)) : CLI_EXIT_INTERNAL;
    free(txt);
    json_decref(o);
  }

  /* ---- plots ---- */
  char base[4200];
  for (size_t s = 0; rc == 0 && s < tabs.n; s++) {
    const cli_section_info *in = &tabs.info[s];
    size_t nc = in->n_curve;
    fig_polar *fp = calloc(nc + 1, sizeof *fp);
    int mem = fp == NULL;
    for (size_t k = 0; !mem && k < nc; k++) {
      const ascr_curve_data *c = &in->curve[k];
      fig_polar *f = &fp[k];
      f->n = c->n;
      f->alpha = c->alpha_deg;
      f->cl = calloc(c->n + 1, sizeof *f->cl);
      f->cd = calloc(c->n + 1, sizeof *f->cd);
      f->cm = calloc(c->n + 1, sizeof *f->cm);
      if (f->cl == NULL || f->cd == NULL || f->cm == NULL) {
        mem = 1;
        break;
      }
      for (size_t i = 0; i < c->n; i++) {
        int ok = c->converged[i];
        f->cl[i] = ok ? c->cl[i] : NAN;
        f->cd[i] = ok ? c->cd[i] : NAN;
        f->cm[i] = ok ? c->cm[i] : NAN;
      }
      snprintf(f->label, sizeof f->label, "Re %.0f, N#dcrit#u %.0f", c->re, c->ncrit);
    }
    char t0[160];
    snprintf(t0, sizeof t0, "lift, section '%s'", b->section_name[s]);
    snprintf(base, sizeof base, "%s/polars-%s", outdir, b->section_name[s]);
    if (mem) {
      cli_error("out of memory");
      rc = CLI_EXIT_INTERNAL;
    } else if (nc > 0 && fig_polar_set(base, t0, fp, nc) != 0) {
      rc = CLI_EXIT_OUTPUT;
    }
    for (size_t k = 0; fp != NULL && k < nc; k++) {
      free(fp[k].cl);
      free(fp[k].cd);
      free(fp[k].cm);
    }
    free(fp);
  }
  if (rc == 0) {
    /* rotor map: CT, CP, efficiency against J per rpm (BEMT), and static thrust against rpm */
    static double J[NRPM][NSPD], CT[NRPM][NSPD], CP[NRPM][NSPD], ET[NRPM][NSPD];
    static char lab[NRPM][32];
    plot_series sct[NRPM], scp[NRPM], set[NRPM], sth[2];
    double rpmv[NRPM], th[2][NRPM];
    for (int i = 0; i < NRPM; i++) {
      for (int k = 0; k < NSPD; k++) {
        const demo_point *p = &map[0][i][k];
        int ok = p->solved && p->r.converged;
        J[i][k] = ok ? p->r.J : NAN;
        CT[i][k] = ok ? p->r.CT : NAN;
        CP[i][k] = ok ? p->r.CP : NAN;
        ET[i][k] = ok && k > 0 ? p->r.efficiency : NAN;
      }
      snprintf(lab[i], sizeof lab[i], "%.0f rpm", demo_rpm[i]);
      sct[i] = (plot_series){i % 2 == 0 ? lab[i] : NULL, NSPD, J[i], CT[i], 0};
      scp[i] = (plot_series){NULL, NSPD, J[i], CP[i], 0};
      set[i] = (plot_series){NULL, NSPD, J[i], ET[i], 0};
      rpmv[i] = demo_rpm[i];
      for (int m = 0; m < 2; m++) {
        const demo_point *p = &map[m][i][0];
        th[m][i] = p->solved && p->r.converged ? p->r.thrust_N : NAN;
      }
    }
    sth[0] = (plot_series){"BEMT", NRPM, rpmv, th[0], 0};
    sth[1] = (plot_series){"vortex", NRPM, rpmv, th[1], 1};
    plot_panel pan[4] = {{"thrust coefficient (BEMT)", "advance ratio J", "C#dT#u = T/(#gr n#u2#d D#u4#d)", sct, NRPM},
                         {"power coefficient (BEMT)", "advance ratio J", "C#dP#u = P/(#gr n#u3#d D#u5#d)", scp, NRPM},
                         {"efficiency (BEMT)", "advance ratio J", "#gy = T V / P", set, NRPM},
                         {"static thrust", "shaft speed (rpm)", "thrust (N)", sth, 2}};
    snprintf(base, sizeof base, "%s/rotor-map", outdir);
    if (plot_figure(base, NULL, 2, 2, pan, 4) != 0) rc = CLI_EXIT_OUTPUT;
  }
  if (rc == 0 && (hov_ok[0] || hov_ok[1])) {
    static double rr[2][400], dt[2][400], al[2][400];
    plot_series s1[2], s2[2];
    for (int m = 0; m < 2; m++) {
      for (size_t e = 0; e < rp.n_elements; e++) {
        rr[m][e] = hel[m][e].r_m / b->r_tip_m;
        dt[m][e] = hov_ok[m] ? hel[m][e].dT_dr_N_m : NAN;
        al[m][e] = hov_ok[m] ? hel[m][e].alpha_deg : NAN;
      }
      s1[m] = (plot_series){m ? "vortex" : "BEMT", rp.n_elements, rr[m], dt[m], 0};
      s2[m] = (plot_series){m ? "vortex" : "BEMT", rp.n_elements, rr[m], al[m], 0};
    }
    plot_panel pan[2] = {{"spanwise loading in hover", "r/R", "dT/dr, all blades (N/m)", s1, 2},
                         {"angle of attack in hover", "r/R", "#ga (deg)", s2, 2}};
    snprintf(base, sizeof base, "%s/hover-spanwise", outdir);
    if (plot_figure(base, NULL, 2, 1, pan, 2) != 0) rc = CLI_EXIT_OUTPUT;
  }

  /* ---- report ---- */
  if (rc == 0 && mopen(&mb) == 0) {
    FILE *f = mb.f;
    fprintf(f, "<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\">\n"
               "<title>airscrew demo report</title>\n<style>\n"
               "body{font-family:sans-serif;max-width:1100px;margin:1.5em auto;color:#222}\n"
               "h1{font-size:1.5em;border-bottom:3px solid #0072b2}h2{font-size:1.15em;color:#0072b2}\n"
               "table{border-collapse:collapse;margin:.5em 0}td,th{border:1px solid #ccc;padding:.2em .6em;text-align:right}\n"
               ".caution{background:#fff4e0;border-left:5px solid #d55e00;padding:.6em 1em}\n"
               "figure{margin:1em 0}svg{max-width:100%%;height:auto}\n</style></head><body>\n");
    fprintf(f, "<h1>airscrew %s &mdash; demo report</h1>\n", ascr_version());
    fprintf(f, "<div class=\"caution\"><strong>Cautions.</strong> ");
    for (int q = 0; cautions[q] != NULL; q++) fprintf(f, "%s ", cautions[q]);
    fprintf(f, "</div>\n<h2>Scenario</h2>\n<p>%s. Craft of %.0f g on %d rotors: %.3f N of thrust "
               "per rotor in hover. Air: ISA sea level (&rho; %.4f kg/m&sup3;, &mu; %.4g Pa&nbsp;s).</p>\n",
            b->name, CRAFT_MASS_KG * 1000.0, CRAFT_ROTORS, thrust_hover, rp.density_kg_m3, rp.viscosity_pa_s);
    fprintf(f, "<table><tr><th>r (mm)</th><th>chord (mm)</th><th>twist (deg)</th><th>section</th></tr>\n");
    for (size_t i = 0; i < b->n_stations; i++) {
      fprintf(f, "<tr><td>%.1f</td><td>%.1f</td><td>%.1f</td><td>%s</td></tr>\n",
              1000.0 * b->stations[i].r_m, 1000.0 * b->stations[i].chord_m, b->stations[i].twist_deg,
              b->section_name[b->stations[i].section]);
    }
    fprintf(f, "</table>\n<p>%d blades, diameter %.1f mm, hub radius %.1f mm. Sections: ",
            b->n_blades, 2000.0 * b->r_tip_m, 1000.0 * b->r_hub_m);
    for (size_t s = 0; s < b->n_sections; s++) fprintf(f, "%s = <code>%s</code>%s", b->section_name[s], b->section_source[s], s + 1 < b->n_sections ? "; " : ".");
    fprintf(f, "</p>\n<h2>Hover</h2>\n<table><tr><th>inflow model</th><th>rpm</th><th>thrust (N)</th>"
               "<th>torque (N&nbsp;m)</th><th>power (W)</th><th>figure of merit</th><th>tip Mach</th>"
               "<th>CT/&sigma;</th><th>confidence</th></tr>\n");
    for (int m = 0; m < 2; m++) {
      if (hov_ok[m]) {
        fprintf(f, "<tr><td>%s</td><td>%.0f</td><td>%.4f</td><td>%.5f</td><td>%.3f</td><td>%.3f</td><td>%.3f</td>"
                   "<td>%.4f</td><td>%s (%.0f&nbsp;%% of the thrust on flagged elements)</td></tr>\n",
                m ? "vortex" : "BEMT", hov[m].rpm, hov[m].thrust_N, hov[m].torque_Nm, hov[m].power_W,
                hov[m].figure_of_merit, hov[m].tip_mach, hov[m].CT_over_sigma,
                hov[m].low_confidence ? "low" : "normal", 100.0 * hov[m].flagged_thrust_share);
      } else {
        fprintf(f, "<tr><td>%s</td><td colspan=\"8\">not converged</td></tr>\n", m ? "vortex" : "BEMT");
      }
    }
    fprintf(f, "</table>\n%s%s%s", dd.html != NULL ? dd.html : "", dz.html != NULL ? dz.html : "",
            ds.html != NULL ? ds.html : "");
    fprintf(f, "<h2>Convergence</h2>\n<p>Rotor map: BEMT %zu of %d points converged, vortex %zu of %d "
               "(unconverged points are left blank, never plotted as results).</p>\n<table><tr><th>section</th>"
               "<th>Re</th><th>converged polar points</th></tr>\n", nconv[0], NRPM * NSPD, nconv[1], NRPM * NSPD);
    for (size_t s = 0; s < tabs.n; s++) {
      for (size_t k = 0; k < tabs.info[s].n_curve; k++) {
        const ascr_curve_data *c = &tabs.info[s].curve[k];
        size_t ok = 0;
        for (size_t i = 0; i < c->n; i++) ok += (size_t)c->converged[i];
        fprintf(f, "<tr><td>%s</td><td>%.3g</td><td>%zu of %zu</td></tr>\n", b->section_name[s], c->re, ok, c->n);
      }
    }
    fprintf(f, "</table>\n<p>Below Re 1e4 no polar is computed (the lowest curve is used, flagged); "
               "outside the converged angles the post-stall extension of Viterna &amp; Corrigan is used.</p>\n");
    static const char *const figs[][2] = {{"rotor-map.svg", "Rotor map over rpm and flight speed."},
                                          {"hover-spanwise.svg", "Spanwise loading and angle of attack in hover, both inflow models."},
                                          {"design.svg", "Chord and twist of the hand-drawn blade and of the minimum-induced-loss design."},
                                          {"drive.svg", "The prop on its powertrain (nominal pack): thrust, rpm, pack current and power against throttle, static and at 8 m/s."},
                                          {"structure.svg", "Campbell diagram: flap, lag and torsion frequencies of the rotating blade and the engine orders."},
                                          {"polars-blade.svg", "Computed polars of the blade section."},
                                          {"polars-root.svg", "Computed polars of the root section."}};
    for (size_t q = 0; q < sizeof figs / sizeof figs[0]; q++) {
      char path[4200];
      snprintf(path, sizeof path, "%s/%s", outdir, figs[q][0]);
      size_t n = 0;
      char *svg = slurp(path, &n);
      if (svg == NULL) continue;
      char *start = strstr(svg, "<svg");
      char prefix[16];
      snprintf(prefix, sizeof prefix, "f%zu-", q);
      fputs("<figure>", f);
      if (start != NULL) write_svg_scoped(f, start, prefix);
      fprintf(f, "<figcaption>%s</figcaption></figure>\n", figs[q][1]);
      free(svg);
    }
    fprintf(f, "<h2>Files</h2>\n<p>blade.json, polars.csv, rotor-map.csv, hover.json, powertrain.json, "
               "drive-map.csv, design-blade.json, material.json, prop.stl (the printable propeller), and every plot as "
               "SVG and PNG, in this folder. Methods and their limits: airscrew's docs/theory/.</p>\n"
               "</body></html>\n");
    rc = mwrite(&mb, outdir, "report.html");
  }
  if (rc == 0) {
    printf("airscrew demo: %s\n", b->name);
    for (int m = 0; m < 2; m++) {
      if (hov_ok[m]) {
        printf("  hover (%s): %.0f rpm for %.3f N, %.2f W, figure of merit %.3f\n", m ? "vortex" : "BEMT",
               hov[m].rpm, hov[m].thrust_N, hov[m].power_W, hov[m].figure_of_merit);
      } else {
        printf("  hover (%s): not converged (%s)\n", m ? "vortex" : "BEMT", hov_msg[m]);
      }
    }
    printf("  rotor map: BEMT %zu/%d, vortex %zu/%d points converged\n", nconv[0], NRPM * NSPD, nconv[1], NRPM * NSPD);
    if (dd.summary != NULL) printf("%s\n", dd.summary);
    if (dz.summary != NULL) printf("%s\n", dz.summary);
    if (ds.summary != NULL) printf("  %s\n", ds.summary);
    printf("outputs in %s/:\n", outdir);
    DIR *d = opendir(outdir);
    struct dirent *e;
    while (d != NULL && (e = readdir(d)) != NULL) {
      if (e->d_name[0] == '.') continue;
      char path[4200];
      snprintf(path, sizeof path, "%s/%s", outdir, e->d_name);
      if (stat(path, &sb) == 0) printf("  %-28s %8lld bytes\n", e->d_name, (long long)sb.st_size);
    }
    if (d != NULL) closedir(d);
    printf("open %s/report.html in a browser for the one-page report.\n", outdir);
    for (int q = 0; cautions[q] != NULL; q++) printf("caution: %s\n", cautions[q]);
  }
  demo_design_out_free(&dz);
  demo_drive_out_free(&dd);
  demo_structure_out_free(&ds);
  cli_tables_free(&tabs);
  ascr_blade_free(b);
  return rc;
}
