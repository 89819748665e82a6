/* src/cli/demo_structure.c
 * The structure section of "airscrew demo": the demo blade as a solid part in a tough SLA resin
 * (a material class of our example files), its stresses at hover and at full throttle, its
 * rotating modes against the blade-passing frequency (Campbell diagram), and the printable
 * propeller as STL.
 */
#define _POSIX_C_SOURCE 200809L
#include "demo_structure.h"
#include "cli_figures.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define NST 41
#define NRPM_MODES 31 /* 0 .. 30,000 rpm by 1,000 */

static const char demo_material[] =
  "{\n"
  "  \"format\": \"airscrew-material-1\",\n"
  "  \"name\": \"tough SLA resin, post-cured (class; airscrew demo)\",\n"
  "  \"density_kg_m3\": {\"value\": 1150, \"source\": \"datasheet class, typical (from memory)\"},\n"
  "  \"elastic_modulus_Pa\": {\"value\": 1260000000.0, \"source\": \"datasheet, class 'tough (ABS-like) "
  "photopolymer resin post-cured' (reference/printed_blade_materials_typical.csv)\"},\n"
  "  \"tensile_strength_Pa\": {\"value\": 31800000.0, \"source\": \"datasheet, class 'tough (ABS-like) "
  "photopolymer resin post-cured' (reference/printed_blade_materials_typical.csv)\"},\n"
  "  \"fatigue_limit_Pa\": {\"value\": null, \"source\": \"not known for the class\"}\n"
  "}\n";

void demo_structure_out_free(demo_structure_out *o)
{
  free(o->html);
  free(o->summary);
  o->html = o->summary = NULL;
}

static double flap1_at(const ascr_structure_station *st, double rpm)
{
  ascr_blade_modes m;
  return ascr_blade_modes_at(st, NST, rpm, NULL, &m, NULL) == ASCR_OK ? m.flap_hz[0] : NAN;
}

int demo_structure_section(const ascr_blade *b, const ascr_polar_table *const *tables,
                           const ascr_rotor_params *rp, double hover_rpm,
                           const ascr_rotor_element *hel, double full_rpm, const char *outdir,
                           demo_structure_out *o)
{
  memset(o, 0, sizeof *o);
  char path[4200];
  snprintf(path, sizeof path, "%s/material.json", outdir);
  int rc = cli_write_atomic(path, demo_material, sizeof demo_material - 1, 1);
  if (rc) return rc;
  ascr_material mat;
  ascr_errbuf err;
  if (ascr_material_parse(demo_material, sizeof demo_material - 1, "demo material", &mat, &err) != ASCR_OK) {
    cli_error("%s", err.msg);
    return CLI_EXIT_INTERNAL;
  }
  ascr_geom_section **secs = calloc(b->n_sections + 1, sizeof *secs);
  static ascr_structure_station sh[NST], sf[NST];
  ascr_rotor_element *fel = calloc(rp->n_elements + 1, sizeof *fel);
  ascr_blade_modes md[NRPM_MODES];
  ascr_campbell_crossing cr[64];
  ascr_mesh mesh;
  memset(&mesh, 0, sizeof mesh);
  unsigned char *stl = NULL;
  size_t stl_len = 0;
  ascr_structure_summary sumh, sumf;
  ascr_rotor_result full;
  ascr_status st = secs == NULL || fel == NULL ? ASCR_ENOMEM : ASCR_OK;
  for (size_t i = 0; st == ASCR_OK && i < b->n_sections; i++) {
    st = ascr_geom_section_open(b->section_source[i], &secs[i], &err);
  }
  const ascr_geom_section *const *cs = (const ascr_geom_section *const *)secs;
  if (st == ASCR_OK) st = ascr_blade_structure(b, cs, &mat, hover_rpm, hel, rp->n_elements, NST, sh, &sumh, &err);
  int fok = 0;
  if (st == ASCR_OK && isfinite(full_rpm)) {
    fok = ascr_rotor_bemt(b, tables, rp, full_rpm, 0.0, &full, fel, &err) == ASCR_OK && full.converged;
    if (fok) st = ascr_blade_structure(b, cs, &mat, full_rpm, fel, rp->n_elements, NST, sf, &sumf, &err);
  }
  for (int k = 0; st == ASCR_OK && k < NRPM_MODES; k++) {
    st = ascr_blade_modes_at(sh, NST, 1000.0 * k, NULL, &md[k], &err);
  }
  size_t ncr = 0;
  if (st == ASCR_OK) {
    ncr = ascr_campbell_crossings(md, NRPM_MODES, 2 * b->n_blades, cr, 64);
    if (ncr > 64) ncr = 64;
    st = ascr_blade_mesh(b, cs, NULL, &mesh, &err);
  }
  if (st == ASCR_OK && ascr_mesh_defects(&mesh) != 0) {
    snprintf(err.msg, sizeof err.msg, "the lofted propeller is not closed");
    st = ASCR_EGEOM;
  }
  if (st == ASCR_OK) st = ascr_mesh_stl(&mesh, "airscrew demo propeller, mm", &stl, &stl_len, &err);
  if (st == ASCR_OK) {
    snprintf(path, sizeof path, "%s/prop.stl", outdir);
    rc = cli_write_atomic(path, (const char *)stl, stl_len, 1);
  }
  if (st == ASCR_OK && rc == 0) {
    const char *name = b->name != NULL ? b->name : "demo blade";
    rc = fig_campbell(outdir, name, md, NRPM_MODES, 2 * b->n_blades);
  }
  if (rc == 0) {
    size_t cap = 4096 + 160 * ncr;
    o->html = malloc(cap);
    o->summary = malloc(400);
    if (o->html == NULL || o->summary == NULL) {
      rc = CLI_EXIT_INTERNAL;
    } else if (st != ASCR_OK) {
      snprintf(o->html, cap, "<h2>Structure</h2>\n<p>Not computed: %.500s</p>\n", err.msg);
      snprintf(o->summary, 400, "structure: not computed (%.300s)", err.msg);
    } else {
      double fh = flap1_at(sh, hover_rpm), ff = fok ? flap1_at(sh, full_rpm) : NAN;
      double bph = b->n_blades * hover_rpm / 60.0, bpf = b->n_blades * full_rpm / 60.0;
      size_t w = (size_t)snprintf(o->html, cap,
          "<h2>Structure</h2>\n<p>The blade as a solid part in a tough SLA resin (class values, "
          "material.json; <code>airscrew structure</code>): %.3f&nbsp;g a blade, centre of mass at "
          "r&nbsp;=&nbsp;%.1f&nbsp;mm. At hover (%.0f&nbsp;rpm) the largest stress is "
          "%.1f&nbsp;MPa at r&nbsp;=&nbsp;%.1f&nbsp;mm (safety factor %.2f against %.0f&nbsp;MPa), "
          "tip deflection %.2f&nbsp;mm, and the twisting moments turn the tip "
          "%+.1f&deg; (%+.1f&deg; of it the air's pitching moment, the rest centrifugal)",
          1e3 * sumh.mass_kg, 1e3 * sumh.cg_r_m, hover_rpm, 1e-6 * sumh.max_stress_pa,
          1e3 * sumh.max_stress_r_m, sumh.safety_factor, 1e-6 * mat.tensile_strength_pa.value,
          1e3 * sumh.tip_deflection_m, sumh.tip_pitch_change_deg, sumh.tip_pitch_change_air_deg);
      if (fok) {
        w += (size_t)snprintf(o->html + w, cap - w, "; at full throttle (%.0f&nbsp;rpm) %.1f&nbsp;MPa "
                              "(safety factor %.2f), tip deflection %.2f&nbsp;mm, tip pitch %+.1f&deg;",
                              full_rpm, 1e-6 * sumf.max_stress_pa, sumf.safety_factor,
                              1e3 * sumf.tip_deflection_m, sumf.tip_pitch_change_deg);
      }
      w += (size_t)snprintf(o->html + w, cap - w,
          ". The stress sits at the root station, where the example blade is a thin plate; a real "
          "hub is thicker%s. First flap frequency %.0f&nbsp;Hz at hover against a blade-passing "
          "frequency of %.0f&nbsp;Hz",
          fabs(sumh.tip_pitch_change_deg) > 5.0
              ? ". Twists of more than a few degrees are beyond this static, linear estimate (the "
                "twist changes the loads that cause it): as drawn, the blade is too soft in torsion "
                "for this resin"
              : "",
          fh, bph);
      if (fok) w += (size_t)snprintf(o->html + w, cap - w, ", %.0f&nbsp;Hz at full throttle against %.0f&nbsp;Hz", ff, bpf);
      w += (size_t)snprintf(o->html + w, cap - w, " (the Campbell diagram below: structure.svg).</p>\n");
      if (ncr > 0) {
        w += (size_t)snprintf(o->html + w, cap - w, "<p>Crossings below 30,000&nbsp;rpm (resonance "
                              "risk where the prop runs long):</p>\n<ul>\n");
        static const char *const fam[3] = {"flap", "lag", "torsion"};
        for (size_t k = 0; k < ncr && w + 200 < cap; k++) {
          w += (size_t)snprintf(o->html + w, cap - w, "<li>%s mode %zu meets %dP at %.0f&nbsp;rpm</li>\n",
                                fam[cr[k].family], cr[k].mode + 1, cr[k].order, cr[k].rpm);
        }
        w += (size_t)snprintf(o->html + w, cap - w, "</ul>\n");
      }
      snprintf(o->html + w, cap - w, "<p>The printable propeller: prop.stl (<code>airscrew export</code>; "
               "%zu triangles, closed shells checked, %.0f&nbsp;mm&sup3;). A printed propeller is a "
               "prototype: balance and inspect it and spin it up behind a guard before flight.</p>\n",
               mesh.n_triangles, 1e9 * ascr_mesh_volume(&mesh));
      snprintf(o->summary, 400, "structure: %.3f g a blade; hover %.1f MPa (factor %.2f), flap 1 %.0f Hz "
               "vs blade passing %.0f Hz; %zu crossings below 30,000 rpm; prop.stl written",
               1e3 * sumh.mass_kg, 1e-6 * sumh.max_stress_pa, sumh.safety_factor, fh, bph, ncr);
    }
  }
  free(stl);
  ascr_mesh_free(&mesh);
  for (size_t i = 0; secs != NULL && i < b->n_sections; i++) ascr_geom_section_free(secs[i]);
  free(secs);
  free(fel);
  return rc;
}
