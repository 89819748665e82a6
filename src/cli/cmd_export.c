/* src/cli/cmd_export.c
 * "airscrew export": the printable shape of a blade file as binary STL (library: ascr_shape.h),
 * and the stations' sections as coordinate files for CAD.
 */
#define _GNU_SOURCE
#include "cli.h"
#include "commands.h"

#include <errno.h>
#include <getopt.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>

static void export_help(FILE *fp)
{
  fputs("usage: airscrew export BLADE.json --stl FILE.stl [options]\n"
        "\n"
        "The blade's shape lofted through its stations' sections (chord, twist about the pitch\n"
        "axis, sense of rotation, sections blended as the rotor blends them) as a closed, binary\n"
        "STL in millimetres: the whole propeller (every blade, its root blended into a cylindrical\n"
        "hub; the shells overlap there, as slicers expect) or with --blade-only one blade from its\n"
        "root station to its tip. Every shell is checked closed and consistently oriented before\n"
        "it is written; the volume and the mass for a density are reported.\n"
        "\n"
        "      --stl FILE          the STL file to write (required)\n"
        "      --blade-only        one blade instead of the propeller\n"
        "      --hub-radius MM     hub cylinder radius (default the blade's hub radius)\n"
        "      --hub-height MM     hub height along the axis (default 1.2 x the root's depth)\n"
        "      --root-thickening F the root section thickens smoothly from the root station to\n"
        "                          F times at the hub surface (1 .. 5, default 2; 1: none)\n"
        "      --pitch-axis F      chord fraction the twist turns about (default 0.25)\n"
        "      --chord-points N    points on each surface of a section (default 41)\n"
        "      --span-rings N      sections lofted from root to tip (default 61)\n"
        "      --density RHO       kg/m3, for the reported mass (default none)\n"
        "      --sections DIR      also each blade station's section as DIR/station-NN.dat\n"
        "                          (x y z in mm, as placed in the STL)\n"
        "      --force             replace existing files\n"
        "  -h, --help              this help\n"
        "\n"
        "A printed propeller is a prototype: balance it, inspect it, and spin it up on a guarded\n"
        "stand before flight.\n",
        fp);
}

static int write_sections(const char *dir, const ascr_blade *b, const ascr_geom_section *const *secs,
                          const ascr_shape_params *p, int force)
{
  if (mkdir(dir, 0777) != 0 && errno != EEXIST) {
    cli_error("--sections: %s: cannot create the folder (%s)", dir, strerror(errno));
    return CLI_EXIT_OUTPUT;
  }
  size_t m = 2 * p->n_chord - 1;
  double *xyz = malloc(3 * m * sizeof *xyz);
  char *text = malloc(64 * m + 256);
  if (xyz == NULL || text == NULL) {
    free(xyz);
    free(text);
    cli_error("out of memory");
    return CLI_EXIT_INTERNAL;
  }
  int rc = 0;
  for (size_t i = 0; i < b->n_stations && rc == 0; i++) {
    size_t n = 0;
    ascr_errbuf err;
    if (ascr_blade_section_points(b, secs, p, b->stations[i].r_m, xyz, &n, &err) != ASCR_OK) {
      cli_error("%s", err.msg);
      rc = CLI_EXIT_INPUT;
      break;
    }
    size_t len = (size_t)snprintf(text, 256, "# airscrew: station %zu at r = %.3f mm, x y z in mm\n", i,
                                  1e3 * b->stations[i].r_m);
    for (size_t q = 0; q < n; q++) {
      len += (size_t)snprintf(text + len, 64, "%.6f %.6f %.6f\n", 1e3 * xyz[3 * q], 1e3 * xyz[3 * q + 1],
                              1e3 * xyz[3 * q + 2]);
    }
    char path[4200];
    snprintf(path, sizeof path, "%s/station-%02zu.dat", dir, i);
    rc = cli_write_atomic(path, text, len, force);
  }
  free(xyz);
  free(text);
  return rc;
}

int cmd_export(int argc, char **argv)
{
  static const struct option opts[] = {
    {"stl", required_argument, NULL, 's'},          {"blade-only", no_argument, NULL, 'b'},
    {"hub-radius", required_argument, NULL, 'R'},   {"hub-height", required_argument, NULL, 'H'},
    {"pitch-axis", required_argument, NULL, 'x'},   {"chord-points", required_argument, NULL, 'k'},
    {"span-rings", required_argument, NULL, 'n'},   {"density", required_argument, NULL, 'd'},
    {"sections", required_argument, NULL, 'S'},     {"force", no_argument, NULL, 'F'},
    {"root-thickening", required_argument, NULL, 't'},
    {"help", no_argument, NULL, 'h'},               {NULL, 0, NULL, 0}};
  ascr_shape_params p = ascr_shape_params_defaults();
  const char *stl = NULL, *secdir = NULL;
  double density = NAN, hr = 0.0, hh = 0.0;
  int force = 0, rt_given = 0, c;
  opterr = 0;
  cli_getopt_reset();
  while ((c = getopt_long(argc, argv, ":h", opts, NULL)) != -1) {
    switch (c) {
    case 's': stl = optarg; break;
    case 'b': p.blade_only = 1; break;
    case 'R': if (cli_parse_double("--hub-radius", optarg, 0.01, 1000.0, &hr)) return CLI_EXIT_USAGE; break;
    case 'H': if (cli_parse_double("--hub-height", optarg, 0.01, 1000.0, &hh)) return CLI_EXIT_USAGE; break;
    case 'x': if (cli_parse_double("--pitch-axis", optarg, 0.0, 1.0, &p.pitch_axis)) return CLI_EXIT_USAGE; break;
    case 'k': if (cli_parse_size("--chord-points", optarg, 5, 2000, &p.n_chord)) return CLI_EXIT_USAGE; break;
    case 'n': if (cli_parse_size("--span-rings", optarg, 2, 5000, &p.n_span)) return CLI_EXIT_USAGE; break;
    case 'd': if (cli_parse_double("--density", optarg, 100.0, 25000.0, &density)) return CLI_EXIT_USAGE; break;
    case 'S': secdir = optarg; break;
    case 't':
      if (cli_parse_double("--root-thickening", optarg, 1.0, 5.0, &p.root_thickening)) return CLI_EXIT_USAGE;
      rt_given = 1;
      break;
    case 'F': force = 1; break;
    case 'h': export_help(stdout); return CLI_EXIT_OK;
    case ':': cli_error("export: option %s needs a value", argv[optind - 1]); return CLI_EXIT_USAGE;
    default: cli_error("export: unknown option '%s' (see airscrew export --help)", argv[optind - 1]); return CLI_EXIT_USAGE;
    }
  }
  if (optind != argc - 1) {
    cli_error("export: give exactly one BLADE file; see airscrew export --help");
    return CLI_EXIT_USAGE;
  }
  if (stl == NULL) {
    cli_error("export: --stl FILE.stl is required");
    return CLI_EXIT_USAGE;
  }
  if (p.blade_only && (hr > 0.0 || hh > 0.0 || rt_given)) {
    cli_error("export: --hub-radius, --hub-height and --root-thickening shape the hub and the root, "
              "which --blade-only leaves out");
    return CLI_EXIT_USAGE;
  }
  p.hub_radius_m = 1e-3 * hr;
  p.hub_height_m = 1e-3 * hh;
  if (cli_check_options_only) return CLI_EXIT_OK;
  int rc = cli_output_check(stl, force);
  if (rc) return rc;
  ascr_blade *b = NULL;
  ascr_geom_section **secs = NULL;
  ascr_mesh m;
  memset(&m, 0, sizeof m);
  unsigned char *buf = NULL;
  size_t len = 0;
  ascr_errbuf err;
  ascr_status st = ascr_blade_read(argv[optind], &b, &err);
  if (st == ASCR_OK) {
    secs = calloc(b->n_sections + 1, sizeof *secs);
    if (secs == NULL) st = ASCR_ENOMEM;
  }
  for (size_t i = 0; st == ASCR_OK && i < b->n_sections; i++) {
    st = ascr_geom_section_open(b->section_source[i], &secs[i], &err);
  }
  if (st == ASCR_OK) st = ascr_blade_mesh(b, (const ascr_geom_section *const *)secs, &p, &m, &err);
  if (st != ASCR_OK) {
    cli_error("%s", st == ASCR_ENOMEM ? "out of memory" : err.msg);
    rc = st == ASCR_ENOMEM ? CLI_EXIT_INTERNAL : CLI_EXIT_INPUT;
    goto done;
  }
  size_t defects = ascr_mesh_defects(&m);
  if (defects != 0) {
    cli_error("export: the lofted shape is not closed (%zu open or doubled edges or degenerate "
              "triangles); nothing written. Try more --chord-points or check the sections", defects);
    rc = CLI_EXIT_ANALYSIS;
    goto done;
  }
  char head[80];
  snprintf(head, sizeof head, "airscrew %s, mm", p.blade_only ? "blade" : "propeller");
  st = ascr_mesh_stl(&m, head, &buf, &len, &err);
  if (st != ASCR_OK) {
    cli_error("%s", err.msg);
    rc = CLI_EXIT_INTERNAL;
    goto done;
  }
  rc = cli_write_atomic(stl, (const char *)buf, len, force);
  if (rc == 0 && secdir != NULL) rc = write_sections(secdir, b, (const ascr_geom_section *const *)secs, &p, force);
  if (rc == 0) {
    double vol = ascr_mesh_volume(&m);
    printf("wrote %s: %s, %zu triangles in %zu closed shell%s, volume %.1f mm3", stl,
           p.blade_only ? "one blade" : "the propeller", m.n_triangles, m.n_shells,
           m.n_shells == 1 ? "" : "s", 1e9 * vol);
    if (isfinite(density)) printf(", mass %.4f g at %.0f kg/m3", 1e3 * vol * density, density);
    printf("\n%s", m.n_shells > 1 ? "(the blades overlap the hub; a slicer unites the shells)\n" : "");
    if (secdir != NULL) printf("sections of the %zu stations in %s/\n", b->n_stations, secdir);
    puts("caution: a printed propeller is a prototype: balance and inspect it, and spin it up on a "
         "guarded stand before flight.");
  }
done:
  free(buf);
  ascr_mesh_free(&m);
  for (size_t i = 0; secs != NULL && b != NULL && i < b->n_sections; i++) ascr_geom_section_free(secs[i]);
  free(secs);
  ascr_blade_free(b);
  return rc;
}
