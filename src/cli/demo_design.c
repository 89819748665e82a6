/* src/cli/demo_design.c
 * The design section of "airscrew demo": the minimum-induced-loss blade for the demo craft's
 * hover (its design point of our own: 0.343 N a rotor at 13,600 rpm), with the demo blade's
 * sections and tables, beside the hand-drawn blade: design-blade.json, design.svg/.png (chord
 * and twist of both) and an HTML fragment (hover of both at the same thrust).
 */
#define _POSIX_C_SOURCE 200809L
#include "demo_design.h"
#include "cli_plot.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

#define DESIGN_RPM 13600.0

int demo_design_section(const ascr_blade *b, const ascr_polar_table *const *tables,
                        const ascr_rotor_params *rp, double thrust, const char *outdir,
                        demo_design_out *o)
{
  memset(o, 0, sizeof *o);
  /* the spec: the demo blade's radii and blade count, its root section to where the blade
   * section's first station stands, the design point of our own */
  ascr_mil_spec s = ascr_mil_spec_defaults();
  s.n_blades = b->n_blades;
  s.r_tip_m = b->r_tip_m;
  s.r_hub_m = b->stations[0].r_m;
  s.rpm = DESIGN_RPM;
  s.speed_m_s = 0.0;
  s.thrust_N = thrust;
  s.n_stations = 21;
  s.min_chord_m = 0.003;
  double from[2] = {s.r_hub_m, s.r_tip_m};
  size_t k = 0;
  while (k < b->n_stations && b->stations[k].section == b->stations[0].section) k++;
  s.n_sections = b->n_sections;
  if (b->n_sections > 1 && k < b->n_stations) from[1] = b->stations[k].r_m;
  s.section_from_r_m = from;
  static ascr_mil_result res;
  ascr_errbuf err;
  ascr_status st = ascr_mil_design(&s, tables, rp, &res, &err);
  if (st != ASCR_OK) {
    /* the demo goes on; the report says why there is no design */
    o->html = malloc(600);
    if (o->html != NULL) {
      snprintf(o->html, 600, "<h2>Designed blade</h2>\n<p>No design: %.500s</p>\n", err.msg);
    }
    return 0;
  }
  ascr_blade_station st_d[ASCR_MIL_MAX_STATIONS];
  ascr_blade d;
  ascr_mil_blade(&s, &res, st_d, &d);
  d.name = "minimum-induced-loss design for the demo craft's hover (airscrew demo)";
  d.section_name = b->section_name;
  d.section_source = b->section_source;
  char *text = NULL;
  size_t len = 0;
  if (ascr_blade_to_json(&d, &text, &len, &err) != ASCR_OK) {
    cli_error("demo: %s", err.msg);
    return CLI_EXIT_INTERNAL;
  }
  char path[4200];
  snprintf(path, sizeof path, "%s/design-blade.json", outdir);
  int rc = cli_write_atomic(path, text, len, 1);
  free(text);
  if (rc) return rc;
  /* hover of both at the same thrust */
  ascr_rotor_result hh, hd;
  int okh = ascr_rotor_rpm_for_thrust(b, tables, rp, ASCR_INFLOW_BEMT, NULL, thrust, 0.0, 6000.0, 45000.0,
                                      &hh, NULL, &err) == ASCR_OK && hh.converged;
  int okd = ascr_rotor_rpm_for_thrust(&d, tables, rp, ASCR_INFLOW_BEMT, NULL, thrust, 0.0, 6000.0, 45000.0,
                                      &hd, NULL, &err) == ASCR_OK && hd.converged;
  /* figure: chord and twist of both blades */
  double xr[2][ASCR_MIL_MAX_STATIONS], ch[2][ASCR_MIL_MAX_STATIONS], tw[2][ASCR_MIL_MAX_STATIONS];
  size_t n[2] = {b->n_stations, d.n_stations};
  for (int q = 0; q < 2; q++) {
    const ascr_blade *bb = q == 0 ? b : &d;
    for (size_t i = 0; i < n[q] && i < ASCR_MIL_MAX_STATIONS; i++) {
      xr[q][i] = bb->stations[i].r_m / bb->r_tip_m;
      ch[q][i] = 1000.0 * bb->stations[i].chord_m;
      tw[q][i] = bb->stations[i].twist_deg;
    }
  }
  plot_series sc[2] = {{"hand-drawn example", n[0], xr[0], ch[0], 0}, {"minimum-induced-loss design", n[1], xr[1], ch[1], 0}};
  plot_series st2[2] = {{NULL, n[0], xr[0], tw[0], 0}, {NULL, n[1], xr[1], tw[1], 0}};
  plot_panel pan[2] = {{"chord", "r/R", "chord (mm)", sc, 2}, {"twist", "r/R", "twist (deg)", st2, 2}};
  snprintf(path, sizeof path, "%s/design", outdir);
  if (plot_figure(path, NULL, 2, 1, pan, 2) != 0) return CLI_EXIT_OUTPUT;
  /* the report's fragment and the summary */
  char *buf = NULL;
  FILE *f = open_memstream(&buf, &len);
  if (f == NULL) return CLI_EXIT_INTERNAL;
  fprintf(f, "<h2>Designed blade</h2>\n<p>The blade of least induced loss for the craft's hover "
             "(%.3f&nbsp;N a rotor at %.0f&nbsp;rpm; Betz condition with Prandtl's tip factor after "
             "Adkins &amp; Liebeck, each station's lift coefficient at its section's best L/D at its own "
             "Reynolds number; docs/theory/design.md), with the demo blade's sections, written as "
             "design-blade.json. Both in hover at the same thrust (BEMT):</p>\n"
             "<table><tr><th>blade</th><th>rpm</th><th>power (W)</th><th>figure of merit</th></tr>\n",
          thrust, DESIGN_RPM);
  const ascr_rotor_result *hr[2] = {&hh, &hd};
  const int ok[2] = {okh, okd};
  const char *nm[2] = {"hand-drawn example", "minimum-induced-loss design"};
  for (int q = 0; q < 2; q++) {
    if (ok[q]) {
      fprintf(f, "<tr><td>%s</td><td>%.0f</td><td>%.3f</td><td>%.3f</td></tr>\n", nm[q], hr[q]->rpm,
              hr[q]->power_W, hr[q]->figure_of_merit);
    } else {
      fprintf(f, "<tr><td>%s</td><td colspan=\"3\">no hover solution</td></tr>\n", nm[q]);
    }
  }
  fputs("</table>\n", f);
  fclose(f);
  o->html = buf;
  o->summary = malloc(256);
  if (o->summary != NULL) {
    if (okh && okd) {
      snprintf(o->summary, 256, "  design: hover %.3f W at %.0f rpm (hand-drawn blade %.3f W at %.0f rpm)",
               hd.power_W, hd.rpm, hh.power_W, hh.rpm);
    } else {
      snprintf(o->summary, 256, "  design: no hover comparison");
    }
  }
  return 0;
}

void demo_design_out_free(demo_design_out *o)
{
  free(o->html);
  free(o->summary);
  o->html = o->summary = NULL;
}
