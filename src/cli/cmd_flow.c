/* src/cli/cmd_flow.c
 * "airscrew flow": one section at one condition. This version offers the inviscid analysis
 * (linear-vorticity panels, optional Karman-Tsien correction); the viscous analysis is not
 * built yet and is refused with a clear message rather than imitated.
 */
#define _GNU_SOURCE
#include "cli.h"
#include "commands.h"

#include <getopt.h>
#include <jansson.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#define FLOW_PI 3.14159265358979323846

static void flow_help(FILE *fp)
{
  fputs("usage: airscrew flow SECTION --alpha DEG --inviscid [options]\n"
        "\n"
        "Analyse one section at one angle of attack.\n"
        "SECTION is a coordinate file or a generator spec (see airscrew section --help).\n"
        "\n"
        "options:\n"
        "  -a, --alpha DEG    angle of attack, degrees (-90 .. 90)\n"
        "      --inviscid     potential flow only (required in this version: the viscous\n"
        "                     analysis is not available yet)\n"
        "  -m, --mach M       free-stream Mach number for the Karman-Tsien correction\n"
        "                     (0 .. 0.95, default 0)\n"
        "  -p, --panels N     panels on the contour (20 .. 2000, default 160)\n"
        "      --json         JSON output\n"
        "      --csv          CSV output (surface table; summary in '#' lines)\n"
        "  -o, --output FILE  write to FILE (whole or not at all) instead of standard output\n"
        "      --force        replace FILE if it exists\n"
        "  -h, --help         this help\n",
        fp);
}

#define FLOW_NOTE "inviscid potential flow: no drag, no stall, no Reynolds-number effect"

typedef struct flow_out {
  const ascr_geom_section *s;
  const ascr_panel_result *r;
  const double *cp, *q;
  double alpha_deg;
  size_t n_panels;
  const char *warning; /* NULL or one warning */
} flow_out;

static void write_json(FILE *fp, const flow_out *f)
{
  size_t n = ascr_geom_section_size(f->s);
  const double *x = ascr_geom_section_x(f->s), *y = ascr_geom_section_y(f->s);
  json_t *o = json_object();
  json_object_set_new(o, "section", json_string(ascr_geom_section_name(f->s)));
  json_object_set_new(o, "analysis", json_string("inviscid"));
  json_object_set_new(o, "alpha_deg", json_real(f->alpha_deg));
  json_object_set_new(o, "mach", json_real(f->r->mach));
  json_object_set_new(o, "n_panels", json_integer((json_int_t)f->n_panels));
  json_object_set_new(o, "cl", json_real(f->r->cl));
  json_object_set_new(o, "cl_circulation", json_real(f->r->cl_circ));
  json_object_set_new(o, "cm", json_real(f->r->cm));
  json_object_set_new(o, "cp_min", json_real(f->r->cp_min));
  if (f->r->mach > 0.0) {
    json_object_set_new(o, "cp_critical", json_real(f->r->cp_critical));
  }
  json_t *sf = json_object(), *xa = json_array(), *ya = json_array(), *ca = json_array(),
         *qa = json_array();
  for (size_t i = 0; i < n; i++) {
    json_array_append_new(xa, json_real(x[i]));
    json_array_append_new(ya, json_real(y[i]));
    json_array_append_new(ca, json_real(f->cp[i]));
    json_array_append_new(qa, json_real(f->q[i]));
  }
  json_object_set_new(sf, "x", xa);
  json_object_set_new(sf, "y", ya);
  json_object_set_new(sf, "cp", ca);
  json_object_set_new(sf, "q", qa);
  json_object_set_new(o, "surface", sf);
  json_t *w = json_array();
  if (f->warning) json_array_append_new(w, json_string(f->warning));
  json_object_set_new(o, "warnings", w);
  json_object_set_new(o, "note", json_string(FLOW_NOTE));
  json_dumpf(o, fp, JSON_REAL_PRECISION(12) | JSON_COMPACT);
  fputc('\n', fp);
  json_decref(o);
}

static void write_csv(FILE *fp, const flow_out *f)
{
  size_t n = ascr_geom_section_size(f->s);
  const double *x = ascr_geom_section_x(f->s), *y = ascr_geom_section_y(f->s);
  fprintf(fp, "# section: %s\n# analysis: inviscid\n# alpha_deg: %.6f\n# mach: %.4f\n",
          ascr_geom_section_name(f->s), f->alpha_deg, f->r->mach);
  fprintf(fp, "# cl: %.8f\n# cl_circulation: %.8f\n# cm: %.8f\n", f->r->cl, f->r->cl_circ,
          f->r->cm);
  if (f->warning) fprintf(fp, "# warning: %s\n", f->warning);
  fputs("x,y,cp,q\n", fp);
  for (size_t i = 0; i < n; i++) {
    fprintf(fp, "%.8f,%.8f,%.8f,%.8f\n", x[i], y[i], f->cp[i], f->q[i]);
  }
}

static void write_table(FILE *fp, const flow_out *f)
{
  size_t n = ascr_geom_section_size(f->s), ile = ascr_geom_section_le_index(f->s);
  const double *x = ascr_geom_section_x(f->s), *y = ascr_geom_section_y(f->s);
  size_t imin = 0;
  for (size_t i = 1; i < n; i++) {
    if (f->cp[i] < f->cp[imin]) imin = i;
  }
  fprintf(fp, "section   %s  (%zu panels)\n", ascr_geom_section_name(f->s), f->n_panels);
  fprintf(fp, "alpha     %.3f deg   Mach %.3f\n", f->alpha_deg, f->r->mach);
  fprintf(fp, "cl        %.5f  (pressure integral)   %.5f  (circulation)\n", f->r->cl,
          f->r->cl_circ);
  fprintf(fp, "cm        %.5f  (about x/c = 0.25, nose up positive)\n", f->r->cm);
  fprintf(fp, "Cp min    %.4f at x/c = %.4f, %s surface", f->cp[imin], x[imin],
          imin <= ile ? "upper" : "lower");
  if (f->r->mach > 0.0) fprintf(fp, "   (critical Cp %.4f)", f->r->cp_critical);
  fputc('\n', fp);
  if (f->warning) fprintf(fp, "warning   %s\n", f->warning);
  fprintf(fp, "note      %s\n\n", FLOW_NOTE);
  fprintf(fp, "%6s %10s %10s %10s %10s\n", "node", "x/c", "y/c", "Cp", "q/V");
  for (size_t i = 0; i < n; i++) {
    fprintf(fp, "%6zu %10.5f %10.5f %10.4f %10.4f\n", i, x[i], y[i], f->cp[i], f->q[i]);
  }
}

int cmd_flow(int argc, char **argv)
{
  static const struct option opts[] = {
    {"alpha", required_argument, NULL, 'a'},  {"inviscid", no_argument, NULL, 'I'},
    {"mach", required_argument, NULL, 'm'},   {"panels", required_argument, NULL, 'p'},
    {"json", no_argument, NULL, 'J'},         {"csv", no_argument, NULL, 'C'},
    {"output", required_argument, NULL, 'o'}, {"force", no_argument, NULL, 'F'},
    {"re", required_argument, NULL, 'R'},     {"help", no_argument, NULL, 'h'},
    {NULL, 0, NULL, 0}};
  double alpha_deg = NAN, mach = 0.0;
  size_t panels = ASCR_GEOM_DEFAULT_PANELS;
  int inviscid = 0, json = 0, csv = 0, force = 0, have_re = 0;
  const char *outpath = NULL;
  int c;
  opterr = 0;
  optind = 1;
  while ((c = getopt_long(argc, argv, ":a:m:p:o:h", opts, NULL)) != -1) {
    switch (c) {
    case 'a':
      if (cli_parse_double("--alpha", optarg, -90.0, 90.0, &alpha_deg)) return CLI_EXIT_USAGE;
      break;
    case 'm':
      if (cli_parse_double("--mach", optarg, 0.0, 0.95, &mach)) return CLI_EXIT_USAGE;
      break;
    case 'p':
      if (cli_parse_size("--panels", optarg, 20, 2000, &panels)) return CLI_EXIT_USAGE;
      break;
    case 'I': inviscid = 1; break;
    case 'R': have_re = 1; break;
    case 'J': json = 1; break;
    case 'C': csv = 1; break;
    case 'o': outpath = optarg; break;
    case 'F': force = 1; break;
    case 'h': flow_help(stdout); return CLI_EXIT_OK;
    case ':': cli_error("flow: option %s needs a value", argv[optind - 1]); return CLI_EXIT_USAGE;
    default: cli_error("flow: unknown option '%s' (see airscrew flow --help)", argv[optind - 1]); return CLI_EXIT_USAGE;
    }
  }
  if (optind != argc - 1) {
    cli_error("flow: give exactly one SECTION (file or spec); see airscrew flow --help");
    return CLI_EXIT_USAGE;
  }
  if (isnan(alpha_deg)) {
    cli_error("flow: --alpha DEG is required");
    return CLI_EXIT_USAGE;
  }
  if (!inviscid || have_re) {
    cli_error("flow: the viscous analysis (--re) is not available in this version; "
              "use --inviscid for the potential-flow solution");
    return CLI_EXIT_USAGE;
  }
  if (json && csv) {
    cli_error("flow: --json and --csv exclude each other");
    return CLI_EXIT_USAGE;
  }
  cli_output out;
  int rc = cli_output_open(&out, outpath, force);
  if (rc) return rc;
  ascr_geom_section *raw = NULL, *s = NULL;
  ascr_panel_solver *w = NULL;
  double *cp = NULL, *q = NULL;
  int from_file = 0;
  rc = cli_load_section(argv[optind], &raw, NULL, &from_file);
  if (rc) goto done;
  ascr_errbuf err;
  ascr_geom_repanel_params rp = ascr_geom_repanel_defaults();
  rp.n_panels = panels;
  ascr_status st = ascr_geom_section_repanel(raw, &rp, &s, &err);
  if (st == ASCR_OK) {
    size_t n = ascr_geom_section_size(s);
    w = ascr_panel_solver_alloc(n);
    cp = calloc(n, sizeof *cp);
    q = calloc(n, sizeof *q);
    if (w == NULL || cp == NULL || q == NULL) {
      cli_error("out of memory");
      rc = CLI_EXIT_INTERNAL;
      goto done;
    }
    st = ascr_panel_solver_set(w, s, &err);
  }
  ascr_panel_result res;
  if (st == ASCR_OK) {
    st = ascr_panel_solver_solve(w, alpha_deg * FLOW_PI / 180.0, mach, &res, cp, q, &err);
  }
  if (st != ASCR_OK) {
    cli_error("%s", err.msg);
    rc = cli_exit_for(st);
    goto done;
  }
  char warnbuf[200];
  flow_out f = {s, &res, cp, q, alpha_deg, panels, NULL};
  if (mach > 0.0 && res.cp_min < res.cp_critical) {
    snprintf(warnbuf, sizeof warnbuf,
             "the local flow is supersonic (Cp min %.3f below the critical %.3f): the "
             "Karman-Tsien correction is outside its range",
             res.cp_min, res.cp_critical);
    f.warning = warnbuf;
    cli_warn("%s", warnbuf);
  }
  if (json) write_json(out.fp, &f);
  else if (csv) write_csv(out.fp, &f);
  else write_table(out.fp, &f);
  rc = cli_output_commit(&out);
  out.fp = NULL;
done:
  if (out.fp != NULL) cli_output_discard(&out);
  free(cp);
  free(q);
  ascr_panel_solver_free(w);
  ascr_geom_section_free(s);
  ascr_geom_section_free(raw);
  return rc;
}
