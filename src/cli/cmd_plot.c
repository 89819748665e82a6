/* src/cli/cmd_plot.c
 * "airscrew plot": redraw the figures of a saved JSON result of polar or rotor.
 */
#define _POSIX_C_SOURCE 200809L
#include "cli.h"
#include "cli_csv.h"
#include "cli_figures.h"
#include "plot_read.h"
#include "plot_compare.h"
#include "commands.h"

#include <strings.h>

#include <jansson.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

static void plot_help(FILE *fp)
{
  fputs("usage: airscrew plot RESULT.json|RESULT.csv --plot DIR [--model NAME] [--force]\n"
        "       airscrew plot RESULT1 RESULT2 [...] --plot DIR [--hover-thrust N] [--force]\n"
        "\n"
        "Draw the figures of a result saved with --json or --csv by 'airscrew polar'\n"
        "(polars: DIR/polar; from JSON with several Re also the Reynolds-number study,\n"
        "DIR/polar-re) or 'airscrew rotor' (CT, CP, efficiency, thrust and power: DIR/rotor;\n"
        "spanwise loading: DIR/rotor-spanwise, from JSON with --stations), as SVG and PNG.\n"
        "Files ending in .csv are read as CSV, others as JSON. Unconverged points (null in\n"
        "JSON, converged=false or empty in CSV) are left out. A rotor CSV with a model column\n"
        "(the demo's rotor-map.csv) is drawn for one model: --model NAME, default the first.\n"
        "--plot DIR is the figures folder as for flow, polar and rotor (--out DIR, its\n"
        "earlier name, is still read).\n"
        "\n"
        "With two to eight results (all polars or all rotor maps) the candidates are compared:\n"
        "one figure set with every candidate (DIR/compare-polar or DIR/compare-rotor) and a\n"
        "table of their key numbers side by side on standard output: for rotors the best\n"
        "static figure of merit and the best efficiency at each airspeed among the saved\n"
        "points, and with --hover-thrust N the rpm and shaft power at that static thrust\n"
        "(between the two saved rpm that bracket it); for polars each curve's smallest cd,\n"
        "best L/D, cl_max, zero-lift angle and lift slope.\n",
        fp);
}

/* largest result file read (a rotor map with spanwise stations is a few MiB) */
#define PLOT_JSON_MAX ((size_t)64 << 20)

/* One CSV cell as a JSON number: null where empty, where the row is not converged, or "nan";
 * an error naming the line and column where it is not a number. */
static int csv_num(const char *file, const cli_csv *t, size_t r, int col, int conv_col, json_t **out)
{
  *out = NULL;
  if (col < 0) return 0;
  const char *v = t->cell[r * t->ncol + (size_t)col];
  const char *cv = conv_col >= 0 ? t->cell[r * t->ncol + (size_t)conv_col] : NULL;
  if (cv != NULL && strcmp(cv, "true") != 0 && strcmp(cv, "false") != 0) {
    cli_error("%s:%zu: converged: '%s' is not true or false", file, t->line[r], cv);
    return CLI_EXIT_INPUT;
  }
  double x;
  if (v == NULL || strcmp(v, "nan") == 0) {
    *out = json_null();
    return 0;
  }
  if (cli_parse_number(v, &x) != 0) {
    /* one rule for non-finite cells: "nan" (like an empty cell) is no value, an infinity is
     * an error */
    int inf = strstr(v, "inf") != NULL || strstr(v, "Inf") != NULL || strstr(v, "INF") != NULL;
    cli_error("%s:%zu: %s: '%s' is not %s", file, t->line[r], t->head[col], v,
              inf ? "a finite number (\"nan\" or an empty cell marks a missing value)" : "a number");
    return CLI_EXIT_INPUT;
  }
  *out = (cv != NULL && strcmp(cv, "false") == 0) ? json_null() : json_real(x);
  return *out == NULL ? CLI_EXIT_INTERNAL : 0;
}

static int same(double a, double b) { return a == b || (isnan(a) && isnan(b)); }

/* Rebuild the JSON shape of a polar or rotor result from its CSV form, so that both draw
 * through the same code. Polar CSV: re, alpha_deg, cl, cd, cm required; mach, ncrit, section
 * optional (rows grouped into polars where re, mach, ncrit or section change). Rotor CSV: rpm,
 * speed_m_s, J, CT, CP, efficiency, thrust_N, power_W required; with a model column only the
 * rows of MODEL (default: the first row's) are drawn. */
static int csv_to_result(const char *file, const char *model, json_t **out)
{
  cli_csv t;
  int rc = cli_csv_read(file, &t);
  if (rc) return rc;
  static const char *const pcols[] = {"re", "mach", "ncrit", "alpha_deg", "cl", "cd", "cm"};
  static const char *const rcols[] = {"rpm", "speed_m_s", "J", "CT", "CP", "efficiency", "thrust_N", "power_W"};
  int polar = cli_csv_col(&t, "alpha_deg") >= 0, rotor = cli_csv_col(&t, "CT") >= 0;
  const char *const *need = polar ? pcols : rcols;
  size_t nneed = polar ? sizeof pcols / sizeof *pcols : sizeof rcols / sizeof *rcols;
  if (polar == rotor) {
    cli_error("%s: header is neither a polar result (alpha_deg, cl, cd ...) nor a rotor result "
              "(rpm, J, CT, CP ...)", file);
    cli_csv_free(&t);
    return CLI_EXIT_INPUT;
  }
  int col[8];
  for (size_t k = 0; k < nneed; k++) {
    col[k] = cli_csv_col(&t, need[k]);
    if (col[k] < 0 && !(polar && (k == 1 || k == 2))) {
      cli_error("%s: column '%s' missing from the header", file, need[k]);
      cli_csv_free(&t);
      return CLI_EXIT_INPUT;
    }
  }
  if (t.nrow == 0) {
    cli_error("%s: no result rows", file);
    cli_csv_free(&t);
    return CLI_EXIT_INPUT;
  }
  int conv = cli_csv_col(&t, "converged"), csec = cli_csv_col(&t, "section");
  int cmodel = polar ? -1 : cli_csv_col(&t, "model");
  if (model != NULL && cmodel < 0) {
    cli_error("%s: --model given but the file has no model column", file);
    cli_csv_free(&t);
    return CLI_EXIT_USAGE;
  }
  if (cmodel >= 0 && model == NULL) model = t.cell[(size_t)cmodel] != NULL ? t.cell[(size_t)cmodel] : "";
  json_t *root = json_object(), *list = json_array(), *cur = NULL;
  if (root == NULL || list == NULL) rc = CLI_EXIT_INTERNAL;
  const char *name = cli_csv_meta(&t, polar ? "section" : "blade");
  if (rc == 0 && name != NULL) json_object_set_new(root, polar ? "section" : "blade", json_string(name));
  if (rc == 0) json_object_set(root, polar ? "polars" : "points", list);
  double key[3] = {NAN, NAN, NAN};
  const char *keysec = NULL;
  size_t kept = 0;
  for (size_t r = 0; r < t.nrow && rc == 0; r++) {
    if (cmodel >= 0) {
      const char *m = t.cell[r * t.ncol + (size_t)cmodel];
      if (strcmp(m != NULL ? m : "", model) != 0) continue;
    }
    kept++;
    json_t *v[8];
    for (size_t k = 0; k < nneed; k++) v[k] = NULL;
    for (size_t k = 0; k < nneed && rc == 0; k++) {
      /* the polar's identity (re, mach, ncrit) is needed even where the point failed */
      rc = csv_num(file, &t, r, col[k], polar && k < 3 ? -1 : conv, &v[k]);
    }
    if (rc == 0 && polar) {
      double kv[3];
      for (int k = 0; k < 3; k++) kv[k] = json_is_number(v[k]) ? json_number_value(v[k]) : NAN;
      const char *sec = csec >= 0 ? t.cell[r * t.ncol + (size_t)csec] : NULL;
      if (!json_is_number(v[0])) {
        cli_error("%s:%zu: re: a polar row needs its Reynolds number", file, t.line[r]);
        rc = CLI_EXIT_INPUT;
      } else if (cur == NULL || !same(kv[0], key[0]) || !same(kv[1], key[1]) || !same(kv[2], key[2]) ||
                 (sec != keysec && (sec == NULL || keysec == NULL || strcmp(sec, keysec) != 0))) {
        cur = json_object();
        json_object_set(cur, "re", v[0]);
        if (v[1] != NULL) json_object_set(cur, "mach", v[1]);
        if (v[2] != NULL) json_object_set(cur, "ncrit", v[2]);
        if (sec != NULL) json_object_set_new(cur, "section", json_string(sec));
        json_object_set_new(cur, "points", json_array());
        json_array_append_new(list, cur);
        memcpy(key, kv, sizeof key);
        keysec = sec;
      }
      if (rc == 0) {
        json_t *pt = json_object();
        for (size_t k = 3; k < nneed; k++) json_object_set(pt, need[k], v[k]);
        json_array_append_new(json_object_get(cur, "points"), pt);
      }
    } else if (rc == 0) {
      json_t *pt = json_object();
      for (size_t k = 0; k < nneed; k++) json_object_set(pt, need[k], v[k]);
      /* the N_crit band columns, where the file has them filled (rotor --ncrit-range) */
      static const char *const bc[2][2] = {{"thrust_band_lo_N", "thrust_band_hi_N"},
                                           {"power_band_lo_W", "power_band_hi_W"}};
      static const char *const bn[2] = {"thrust_band_N", "power_band_W"};
      for (int q = 0; q < 2; q++) {
        int c0 = cli_csv_col(&t, bc[q][0]), c1 = cli_csv_col(&t, bc[q][1]);
        if (c0 < 0 || c1 < 0) continue;
        const char *a = t.cell[r * t.ncol + (size_t)c0], *b = t.cell[r * t.ncol + (size_t)c1];
        char *e0 = NULL, *e1 = NULL;
        double x0 = a != NULL ? strtod(a, &e0) : NAN, x1 = b != NULL ? strtod(b, &e1) : NAN;
        if (a == NULL || b == NULL || e0 == a || e1 == b || *e0 != '\0' || *e1 != '\0') continue;
        json_t *arr = json_array();
        json_array_append_new(arr, json_real(x0));
        json_array_append_new(arr, json_real(x1));
        json_object_set_new(pt, bn[q], arr);
      }
      int cre = cli_csv_col(&t, "re_075");
      const char *rc75 = cre >= 0 ? t.cell[r * t.ncol + (size_t)cre] : NULL;
      char *e75 = NULL;
      double re75 = rc75 != NULL ? strtod(rc75, &e75) : NAN;
      if (rc75 != NULL && e75 != rc75 && *e75 == '\0') json_object_set_new(pt, "re_075", json_real(re75));
      json_array_append_new(list, pt);
    }
    for (size_t k = 0; k < nneed; k++) json_decref(v[k]);
  }
  if (rc == 0 && kept == 0) {
    cli_error("%s: no rows of model '%s'", file, model);
    rc = CLI_EXIT_INPUT;
  }
  if (rc == 0 && !polar) {
    char bl[300];
    snprintf(bl, sizeof bl, "%s%s%s%s", name != NULL ? name : file, cmodel >= 0 ? " (" : "",
             cmodel >= 0 ? model : "", cmodel >= 0 ? ")" : "");
    json_object_set_new(root, "blade", json_string(bl));
  }
  json_decref(list);
  cli_csv_free(&t);
  if (rc) {
    json_decref(root);
    return rc;
  }
  *out = root;
  return 0;
}

/* read one result file (JSON, or CSV turned into the same form) into pd; root kept for pd's
 * strings */
static int plot_load(const char *file, const char *model, json_t **root, plot_data *pd)
{
  size_t flen = strlen(file);
  int rc;
  *root = NULL;
  memset(pd, 0, sizeof *pd);
  int is_csv = flen > 4 && strcasecmp(file + flen - 4, ".csv") == 0;
  if (model != NULL && !is_csv) {
    cli_error("plot: --model selects rows of a rotor CSV file with a model column");
    return CLI_EXIT_USAGE;
  }
  if (is_csv) {
    rc = csv_to_result(file, model, root);
    if (rc) return rc;
  } else {
    char *text = NULL;
    size_t tlen = 0;
    rc = cli_read_file(file, PLOT_JSON_MAX, "result", &text, &tlen);
    if (rc) return rc;
    json_error_t je;
    *root = json_loadb(text, tlen, JSON_REJECT_DUPLICATES, &je);
    free(text);
    if (*root == NULL) {
      cli_error("%s:%d:%d: %s", file, je.line, je.column, je.text);
      return CLI_EXIT_INPUT;
    }
  }
  return plot_data_read(file, *root, pd);
}

int cmd_plot(int argc, char **argv)
{
  const char *files[PLOT_MAX_CANDIDATES], *dir = NULL, *model = NULL;
  size_t nf = 0;
  int force = 0;
  double hover = NAN;
  for (int i = 1; i < argc; i++) {
    if (strcmp(argv[i], "--help") == 0 || strcmp(argv[i], "-h") == 0) {
      plot_help(stdout);
      return CLI_EXIT_OK;
    } else if ((strcmp(argv[i], "--plot") == 0 || strcmp(argv[i], "--out") == 0) && i + 1 < argc) {
      /* --plot DIR, the figures option of every command; --out DIR, its earlier name here */
      dir = argv[++i];
    } else if (strcmp(argv[i], "--force") == 0) {
      force = 1;
    } else if (strcmp(argv[i], "--model") == 0 && i + 1 < argc) {
      model = argv[++i];
    } else if (strcmp(argv[i], "--hover-thrust") == 0 && i + 1 < argc) {
      if (cli_parse_number(argv[++i], &hover) != 0 || !(hover > 0.0 && hover < 1e6)) {
        cli_error("plot: --hover-thrust: '%s' is not a thrust in newtons (0 .. 1e6)", argv[i]);
        return CLI_EXIT_USAGE;
      }
    } else if (argv[i][0] != '-') {
      if (nf == PLOT_MAX_CANDIDATES) {
        cli_error("plot: at most %d results are compared at once", PLOT_MAX_CANDIDATES);
        return CLI_EXIT_USAGE;
      }
      files[nf++] = argv[i];
    } else {
      cli_error("plot: unexpected '%s' (see airscrew plot --help)", argv[i]);
      return CLI_EXIT_USAGE;
    }
  }
  if (nf == 0 || dir == NULL) {
    cli_error("plot: give RESULT.json and --plot DIR (see airscrew plot --help)");
    return CLI_EXIT_USAGE;
  }
  if (nf == 1 && !isnan(hover)) {
    cli_error("plot: --hover-thrust compares two or more rotor results");
    return CLI_EXIT_USAGE;
  }
  if (nf > 1 && model != NULL) {
    cli_error("plot: --model draws one rotor CSV file; compare candidates saved one model a file");
    return CLI_EXIT_USAGE;
  }
  if (cli_check_options_only) return CLI_EXIT_OK;
  json_t *roots[PLOT_MAX_CANDIDATES];
  plot_data pds[PLOT_MAX_CANDIDATES];
  size_t nl = 0;
  int rc = 0;
  for (; nl < nf && rc == 0; nl++) rc = plot_load(files[nl], model, &roots[nl], &pds[nl]);
  if (rc == 0 && nf > 1) {
    rc = plot_compare(dir, force, hover, files, pds, nf);
  } else if (rc == 0 && pds[0].kind == PLOT_POLARS) {
    plot_data *pd = &pds[0];
    rc = fig_prepare_dir(dir, (const char *const[]){"polar", pd->n_re > 0 ? "polar-re" : NULL, NULL}, force);
    if (rc == 0) rc = fig_polars(dir, pd->title, pd->pol, pd->n_pol);
    if (rc == 0 && pd->n_re > 0) rc = fig_re_study(dir, pd->title, pd->bubble_cl, pd->re, pd->n_re);
    if (rc == 0) printf("figures written to %s/\n", dir);
  } else if (rc == 0) {
    rc = fig_prepare_dir(dir, (const char *const[]){"rotor", "rotor-spanwise", NULL}, force);
    if (rc == 0) rc = fig_rotor(dir, pds[0].title, pds[0].rot, pds[0].n_rot);
    if (rc == 0) printf("figures written to %s/\n", dir);
  }
  for (size_t k = 0; k < nl; k++) {
    plot_data_free(&pds[k]);
    json_decref(roots[k]);
  }
  return rc;
}
