/* src/cli/cmd_plot.c
 * "airscrew plot": redraw the figures of a saved JSON result of polar or rotor.
 */
#define _POSIX_C_SOURCE 200809L
#include "cli.h"
#include "cli_figures.h"
#include "commands.h"

#include <jansson.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

static void plot_help(FILE *fp)
{
  fputs("usage: airscrew plot RESULT.json --out DIR [--force]\n"
        "\n"
        "Draw the figures of a result saved with --json by 'airscrew polar' (polars: DIR/polar)\n"
        "or 'airscrew rotor' (CT, CP, efficiency and thrust: DIR/rotor; spanwise loading:\n"
        "DIR/rotor-spanwise), as SVG and PNG. Unconverged points (null) are left out.\n",
        fp);
}

static double jnum(json_t *o, const char *k)
{
  json_t *v = json_object_get(o, k);
  return json_is_number(v) ? json_number_value(v) : NAN;
}

static int plot_polars(const char *file, json_t *root, const char *dir)
{
  json_t *pl = json_object_get(root, "polars");
  size_t np = json_array_size(pl);
  if (np == 0 || np > 256) {
    cli_error("%s: polars: empty or too many", file);
    return CLI_EXIT_INPUT;
  }
  fig_polar *f = calloc(np, sizeof *f);
  if (f == NULL) return CLI_EXIT_INTERNAL;
  int rc = 0;
  for (size_t k = 0; k < np && rc == 0; k++) {
    json_t *po = json_array_get(pl, k), *pts = json_object_get(po, "points");
    size_t n = json_array_size(pts);
    if (!json_is_object(po) || n == 0 || n > 100000) {
      cli_error("%s: polars[%zu].points: missing or empty", file, k);
      rc = CLI_EXIT_INPUT;
      break;
    }
    double *b = calloc(4 * n, sizeof *b);
    if (b == NULL) {
      rc = CLI_EXIT_INTERNAL;
      break;
    }
    f[k].n = n;
    f[k].alpha = b;
    f[k].cl = b + n;
    f[k].cd = b + 2 * n;
    f[k].cm = b + 3 * n;
    for (size_t i = 0; i < n; i++) {
      json_t *q = json_array_get(pts, i);
      f[k].alpha[i] = jnum(q, "alpha_deg");
      f[k].cl[i] = jnum(q, "cl");
      f[k].cd[i] = jnum(q, "cd");
      f[k].cm[i] = jnum(q, "cm");
    }
    snprintf(f[k].label, sizeof f[k].label, "Re %.3gk, M %.2g, N#dcrit#u %.3g",
             jnum(po, "re") / 1000.0, jnum(po, "mach"), jnum(po, "ncrit"));
  }
  if (rc == 0) {
    json_t *sec = json_object_get(root, "section");
    rc = fig_polars(dir, json_is_string(sec) ? json_string_value(sec) : file, f, np);
  }
  for (size_t k = 0; k < np; k++) free(f[k].alpha);
  free(f);
  return rc;
}

static int plot_rotor(const char *file, json_t *root, const char *dir)
{
  json_t *pts = json_object_get(root, "points");
  size_t np = json_array_size(pts);
  if (np == 0 || np > 100000) {
    cli_error("%s: points: empty", file);
    return CLI_EXIT_INPUT;
  }
  fig_rotor_point *f = calloc(np, sizeof *f);
  if (f == NULL) return CLI_EXIT_INTERNAL;
  int rc = 0;
  for (size_t k = 0; k < np && rc == 0; k++) {
    json_t *p = json_array_get(pts, k);
    f[k].rpm = jnum(p, "rpm");
    f[k].speed = jnum(p, "speed_m_s");
    f[k].J = jnum(p, "J");
    f[k].CT = jnum(p, "CT");
    f[k].CP = jnum(p, "CP");
    f[k].eta = jnum(p, "efficiency");
    f[k].thrust = jnum(p, "thrust_N");
    f[k].power = jnum(p, "power_W");
    json_t *st = json_object_get(p, "stations");
    size_t ns = json_array_size(st);
    if (ns > 0 && ns <= 4000) {
      double *b = calloc(2 * ns, sizeof *b);
      if (b == NULL) {
        rc = CLI_EXIT_INTERNAL;
        break;
      }
      f[k].ns = ns;
      f[k].r_over_R = b;
      f[k].dT_dr = b + ns;
      for (size_t i = 0; i < ns; i++) {
        json_t *e = json_array_get(st, i);
        b[i] = jnum(e, "r_over_R");
        b[ns + i] = jnum(e, "dT_dr_N_per_m");
      }
    }
  }
  if (rc == 0) {
    json_t *bl = json_object_get(root, "blade");
    rc = fig_rotor(dir, json_is_string(bl) ? json_string_value(bl) : file, f, np);
  }
  for (size_t k = 0; k < np; k++) free(f[k].r_over_R);
  free(f);
  return rc;
}

int cmd_plot(int argc, char **argv)
{
  const char *file = NULL, *dir = NULL;
  int force = 0;
  for (int i = 1; i < argc; i++) {
    if (strcmp(argv[i], "--help") == 0 || strcmp(argv[i], "-h") == 0) {
      plot_help(stdout);
      return CLI_EXIT_OK;
    } else if (strcmp(argv[i], "--out") == 0 && i + 1 < argc) {
      dir = argv[++i];
    } else if (strcmp(argv[i], "--force") == 0) {
      force = 1;
    } else if (argv[i][0] != '-' && file == NULL) {
      file = argv[i];
    } else {
      cli_error("plot: unexpected '%s' (see airscrew plot --help)", argv[i]);
      return CLI_EXIT_USAGE;
    }
  }
  if (file == NULL || dir == NULL) {
    cli_error("plot: give RESULT.json and --out DIR (see airscrew plot --help)");
    return CLI_EXIT_USAGE;
  }
  if (cli_check_options_only) return CLI_EXIT_OK;
  json_error_t je;
  json_t *root = json_load_file(file, JSON_REJECT_DUPLICATES, &je);
  if (root == NULL) {
    cli_error("%s:%d:%d: %s", file, je.line, je.column, je.text);
    return CLI_EXIT_INPUT;
  }
  int rc;
  if (json_is_array(json_object_get(root, "polars"))) {
    rc = fig_prepare_dir(dir, "polar", force);
    if (rc == 0) rc = plot_polars(file, root, dir);
  } else if (json_is_array(json_object_get(root, "points")) && json_object_get(root, "blade") != NULL) {
    rc = fig_prepare_dir(dir, "rotor", force);
    if (rc == 0) rc = plot_rotor(file, root, dir);
  } else {
    cli_error("%s: neither a polar result (\"polars\") nor a rotor result (\"points\", \"blade\")", file);
    rc = CLI_EXIT_INPUT;
  }
  json_decref(root);
  if (rc == 0) printf("figures written to %s/\n", dir);
  return rc;
}
