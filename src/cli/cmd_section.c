/* src/cli/cmd_section.c
 * "airscrew section": generate or read a section, repanel it, report its shape, write its
 * coordinates.
 */
#define _GNU_SOURCE
#include "cli.h"
#include "commands.h"

#include <getopt.h>
#include <jansson.h>
#include <stdlib.h>
#include <string.h>

static void section_help(FILE *fp)
{
  fputs("usage: airscrew section SECTION [options]\n"
        "\n"
        "Read or generate a section, optionally repanel it, and report its shape.\n"
        "SECTION is a coordinate file, or a generator spec:\n"
        "  naca2412, naca0012c (closed trailing edge), naca23012,\n"
        "  plate:t=3,f=4,xf=50[,nose=1][,taper=20][,te=0]  (percent of chord; nose in thicknesses)\n"
        "\n"
        "options:\n"
        "  -p, --panels N     respace the nodes on N panels (20 .. 2000)\n"
        "      --points       output the coordinates instead of the shape summary\n"
        "                     (as a coordinate file that airscrew reads back)\n"
        "      --json         JSON output (summary, plus x and y arrays with --points)\n"
        "      --csv          CSV output\n"
        "  -o, --output FILE  write to FILE (whole or not at all) instead of standard output\n"
        "      --force        replace FILE if it exists\n"
        "  -h, --help         this help\n",
        fp);
}

static const char *layout_name(ascr_geom_layout l)
{
  return l == ASCR_GEOM_LAYOUT_TWO_SURFACES ? "two surfaces from the leading edge"
                                            : "one contour";
}

static int write_json(FILE *fp, const ascr_geom_section *s, const ascr_geom_metrics *m,
                      const ascr_geom_load_info *li, int from_file, int points)
{
  json_t *o = json_object();
  json_object_set_new(o, "section", json_string(ascr_geom_section_name(s)));
  json_object_set_new(o, "source", json_string(from_file ? "file" : "generator"));
  if (from_file) {
    json_object_set_new(o, "layout", json_string(li->layout == ASCR_GEOM_LAYOUT_TWO_SURFACES
                                                     ? "two_surfaces" : "contour"));
    json_object_set_new(o, "reversed", json_boolean(li->reversed));
    json_object_set_new(o, "chord_original", json_real(li->chord_orig));
    json_object_set_new(o, "rotation_deg", json_real(li->rotation_deg));
  }
  size_t n = ascr_geom_section_size(s);
  json_object_set_new(o, "n_nodes", json_integer((json_int_t)n));
  json_object_set_new(o, "le_index", json_integer((json_int_t)ascr_geom_section_le_index(s)));
  json_t *mm = json_object();
  json_object_set_new(mm, "thickness", json_real(m->thickness));
  json_object_set_new(mm, "thickness_x", json_real(m->thickness_x));
  json_object_set_new(mm, "camber", json_real(m->camber));
  json_object_set_new(mm, "camber_x", json_real(m->camber_x));
  json_object_set_new(mm, "le_radius", json_real(m->le_radius));
  json_object_set_new(mm, "te_gap", json_real(m->te_gap));
  json_object_set_new(mm, "te_angle_deg", json_real(m->te_angle_deg));
  json_object_set_new(mm, "area", json_real(m->area));
  json_object_set_new(mm, "perimeter", json_real(m->arc_length));
  json_object_set_new(o, "metrics", mm);
  if (points) {
    json_t *xa = json_array(), *ya = json_array();
    for (size_t i = 0; i < n; i++) {
      json_array_append_new(xa, json_real(ascr_geom_section_x(s)[i]));
      json_array_append_new(ya, json_real(ascr_geom_section_y(s)[i]));
    }
    json_object_set_new(o, "x", xa);
    json_object_set_new(o, "y", ya);
  }
  int rc = json_dumpf(o, fp, JSON_REAL_PRECISION(12) | JSON_COMPACT);
  fputc('\n', fp);
  json_decref(o);
  return rc;
}

int cmd_section(int argc, char **argv)
{
  static const struct option opts[] = {
    {"panels", required_argument, NULL, 'p'}, {"points", no_argument, NULL, 'P'},
    {"json", no_argument, NULL, 'J'},         {"csv", no_argument, NULL, 'C'},
    {"output", required_argument, NULL, 'o'}, {"force", no_argument, NULL, 'F'},
    {"help", no_argument, NULL, 'h'},         {NULL, 0, NULL, 0}};
  size_t panels = 0;
  int points = 0, json = 0, csv = 0, force = 0;
  const char *outpath = NULL;
  int c;
  opterr = 0;
  cli_getopt_reset();
  while ((c = getopt_long(argc, argv, ":p:o:h", opts, NULL)) != -1) {
    switch (c) {
    case 'p':
      if (cli_parse_size("--panels", optarg, 20, 2000, &panels)) return CLI_EXIT_USAGE;
      break;
    case 'P': points = 1; break;
    case 'J': json = 1; break;
    case 'C': csv = 1; break;
    case 'o': outpath = optarg; break;
    case 'F': force = 1; break;
    case 'h': section_help(stdout); return CLI_EXIT_OK;
    case ':': cli_error("section: option %s needs a value", argv[optind - 1]); return CLI_EXIT_USAGE;
    default: cli_error("section: unknown option '%s' (see airscrew section --help)", argv[optind - 1]); return CLI_EXIT_USAGE;
    }
  }
  if (json && csv) {
    cli_error("section: --json and --csv exclude each other");
    return CLI_EXIT_USAGE;
  }
  if (optind != argc - 1) {
    cli_error("section: give exactly one SECTION (file or spec); see airscrew section --help");
    return CLI_EXIT_USAGE;
  }
  if (cli_check_options_only) return CLI_EXIT_OK;
  cli_output out;
  int rc = cli_output_open(&out, outpath, force);
  if (rc) return rc;
  ascr_geom_section *s = NULL, *r = NULL;
  ascr_geom_load_info li;
  memset(&li, 0, sizeof li);
  int from_file = 0;
  rc = cli_load_section(argv[optind], &s, &li, &from_file);
  if (rc) goto fail;
  ascr_errbuf err;
  ascr_status st;
  if (panels > 0) {
    ascr_geom_repanel_params p = ascr_geom_repanel_defaults();
    p.n_panels = panels;
    st = ascr_geom_section_repanel(s, &p, &r, &err);
    if (st != ASCR_OK) {
      cli_error("%s", err.msg);
      rc = cli_exit_for(st);
      goto fail;
    }
    ascr_geom_section_free(s);
    s = r;
    r = NULL;
  }
  ascr_geom_metrics m;
  st = ascr_geom_section_metrics(s, &m, &err);
  if (st != ASCR_OK) {
    cli_error("%s", err.msg);
    rc = cli_exit_for(st);
    goto fail;
  }
  FILE *fp = out.fp;
  size_t n = ascr_geom_section_size(s);
  const double *x = ascr_geom_section_x(s), *y = ascr_geom_section_y(s);
  if (json) {
    write_json(fp, s, &m, &li, from_file, points);
  } else if (csv) {
    if (points) {
      fputs("x,y\n", fp);
      for (size_t i = 0; i < n; i++) fprintf(fp, "%.10f,%.10f\n", x[i], y[i]);
    } else {
      fputs("section,n_nodes,thickness,thickness_x,camber,camber_x,le_radius,te_gap,"
            "te_angle_deg,area\n", fp);
      fprintf(fp, "\"%s\",%zu,%.6f,%.5f,%.6f,%.5f,%.6f,%.6f,%.3f,%.6f\n",
              ascr_geom_section_name(s), n, m.thickness, m.thickness_x, m.camber, m.camber_x,
              m.le_radius, m.te_gap, m.te_angle_deg, m.area);
    }
  } else if (points) {
    fprintf(fp, "%s\n", ascr_geom_section_name(s));
    for (size_t i = 0; i < n; i++) fprintf(fp, "%12.8f %12.8f\n", x[i], y[i]);
  } else {
    fprintf(fp, "section      %s\n", ascr_geom_section_name(s));
    if (from_file) {
      fprintf(fp, "read from    %s: %zu points, %s%s%s\n", argv[optind], li.n_points_read,
              layout_name(li.layout), li.reversed ? ", reversed to run over the upper surface first" : "",
              li.merged_le_duplicate ? ", shared leading-edge point merged" : "");
      fprintf(fp, "normalised   chord %.6g (file units), rotated by %.4f deg, leading edge was at (%.6g, %.6g)\n",
              li.chord_orig, li.rotation_deg, li.le_x_orig, li.le_y_orig);
    } else {
      fprintf(fp, "generated    from the spec '%s'\n", argv[optind]);
    }
    fprintf(fp, "nodes        %zu (%zu panels), leading edge at node %zu\n", n, n - 1,
            ascr_geom_section_le_index(s));
    /* the shape as given or generated is not what the analyses see (issue 17: 401 nodes here,
     * 160 panels in flow and polar, without a word on which is which) */
    if (panels == 0) {
      fprintf(fp, "analyses     respace it on %d panels, more above Re 1e6 (flow, polar, rotor: --panels N)\n",
              ASCR_GEOM_DEFAULT_PANELS);
    } else {
      fprintf(fp, "analyses     these %zu panels with flow, polar or rotor --panels %zu\n", n - 1,
              panels);
    }
    fprintf(fp, "thickness    %.3f %% of chord at x/c = %.3f\n", 100.0 * m.thickness, m.thickness_x);
    fprintf(fp, "camber       %.3f %% of chord at x/c = %.3f\n", 100.0 * m.camber, m.camber_x);
    fprintf(fp, "LE radius    %.5f chord\n", m.le_radius);
    fprintf(fp, "TE gap       %.5f chord, included angle %.2f deg\n", m.te_gap, m.te_angle_deg);
    fprintf(fp, "area         %.5f chord^2, perimeter %.4f chord\n", m.area, m.arc_length);
  }
  ascr_geom_section_free(s);
  return cli_output_commit(&out);
fail:
  cli_output_discard(&out);
  ascr_geom_section_free(s);
  ascr_geom_section_free(r);
  return rc;
}
