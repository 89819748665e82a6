/* src/design/spec_json.c
 * Design specification files (our schema, docs/file-formats.md "Design specification"), the
 * designed blade with the specification's sections, and blade files written as JSON.
 * The sections are read by the blade-file reader itself (a provisional blade made from the
 * specification), so that they resolve and fail exactly as a blade file's do.
 */
#define _DEFAULT_SOURCE /* realpath */
#include "core/core_impl.h"
#include "core/json_fields.h"
#include "airscrew/ascr_design.h"
#include "airscrew/ascr_geom.h"

#include <jansson.h>
#include <limits.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define SPEC_MAX_BYTES (1u << 20)

static char *dup_str(const char *s)
{
  size_t n = strlen(s) + 1;
  char *d = malloc(n);
  if (d != NULL) memcpy(d, s, n);
  return d;
}

void ascr_design_spec_free(ascr_design_spec *s)
{
  if (s == NULL) return;
  free(s->name);
  ascr_blade_free(s->layout);
  free(s);
}

/* "spans": [{"section": NAME, "from_r_m": R}, ...] ascending; one section: may be left out */
static ascr_status read_spans(const core_json_ctx *r, json_t *root, json_t *secs,
                              ascr_design_spec *s, const char **names)
{
  json_t *spans = json_object_get(root, "spans");
  size_t nsec = json_object_size(secs);
  if (spans == NULL) {
    if (nsec != 1) {
      return core_fail(r->err, ASCR_EPARSE, "%s: spans: required with more than one section "
                       "([{\"section\": name, \"from_r_m\": radius}, ...] from the hub out)", r->file);
    }
    const char *k;
    json_t *v;
    json_object_foreach(secs, k, v) names[0] = k;
    s->from_r[0] = s->mil.r_hub_m;
    s->mil.n_sections = 1;
    return ASCR_OK;
  }
  if (!json_is_array(spans) || json_array_size(spans) < 1 ||
      json_array_size(spans) > ASCR_DESIGN_MAX_SECTIONS) {
    return core_fail(r->err, ASCR_EPARSE, "%s: spans: must be a list of 1 .. %d spans", r->file,
                     ASCR_DESIGN_MAX_SECTIONS);
  }
  static const char *const keys[] = {"section", "from_r_m", NULL};
  for (size_t i = 0; i < json_array_size(spans); i++) {
    json_t *o = json_array_get(spans, i);
    char path[32];
    snprintf(path, sizeof path, "spans[%zu]", i);
    if (!json_is_object(o)) {
      return core_fail(r->err, ASCR_EPARSE, "%s: %s: must be an object", r->file, path);
    }
    ascr_status st = core_json_keys(r, o, path, keys);
    if (st == ASCR_OK) st = core_json_number(r, o, "from_r_m", path, 1, 0.0, &s->from_r[i]);
    if (st != ASCR_OK) return st;
    json_t *nm = json_object_get(o, "section");
    if (!json_is_string(nm) || json_object_get(secs, json_string_value(nm)) == NULL) {
      return core_fail(r->err, ASCR_EPARSE, "%s: %s.section: must name one of sections", r->file, path);
    }
    names[i] = json_string_value(nm);
    if (i == 0 ? s->from_r[0] > s->mil.r_hub_m + 1e-12
               : !(s->from_r[i] > s->from_r[i - 1] && s->from_r[i] < s->mil.r_tip_m)) {
      return core_fail(r->err, ASCR_EINVAL, "%s: %s.from_r_m: %g: the first span starts at the hub, "
                       "the others ascend inside the blade", r->file, path, s->from_r[i]);
    }
  }
  s->mil.n_sections = json_array_size(spans);
  return ASCR_OK;
}

/* the provisional blade: the spec's sections, stations at every span start and the tip */
static ascr_status layout(const core_json_ctx *r, json_t *secs, const char *base_dir,
                          ascr_design_spec *s, const char **names)
{
  json_t *b = json_object();
  json_object_set_new(b, "format", json_string("airscrew-blade-1"));
  json_object_set_new(b, "blades", json_integer(s->mil.n_blades));
  json_object_set_new(b, "length_unit", json_string("m"));
  json_object_set_new(b, "tip_radius", json_real(s->mil.r_tip_m));
  json_object_set_new(b, "hub_radius", json_real(s->mil.r_hub_m));
  /* only the sections the spans use, in span order: the blade's section i is span i */
  json_t *bs = json_object();
  for (size_t i = 0; i < s->mil.n_sections; i++) {
    char key[32];
    snprintf(key, sizeof key, "s%zu", i);
    json_object_set(bs, key, json_object_get(secs, names[i]));
  }
  json_object_set_new(b, "sections", bs);
  json_t *st = json_array();
  double rr = s->mil.r_tip_m, c0 = 0.3 * rr;
  double cmin = s->mil.min_chord_m > 0.0 ? s->mil.min_chord_m : 0.02 * rr;
  for (size_t i = 0; i < s->mil.n_sections; i++) {
    json_t *o = json_object();
    char key[32];
    snprintf(key, sizeof key, "s%zu", i);
    json_object_set_new(o, "r", json_real(s->from_r[i]));
    json_object_set_new(o, "chord", json_real(c0));
    json_object_set_new(o, "twist_deg", json_real(20.0));
    json_object_set_new(o, "section", json_string(key));
    json_array_append_new(st, o);
  }
  json_t *o = json_object();
  char key[32];
  snprintf(key, sizeof key, "s%zu", s->mil.n_sections - 1);
  json_object_set_new(o, "r", json_real(rr));
  json_object_set_new(o, "chord", json_real(cmin));
  json_object_set_new(o, "twist_deg", json_real(10.0));
  json_object_set_new(o, "section", json_string(key));
  json_array_append_new(st, o);
  json_object_set_new(b, "stations", st);
  char *text = json_dumps(b, JSON_COMPACT);
  json_decref(b);
  if (text == NULL) return core_fail(r->err, ASCR_ENOMEM, "%s: out of memory", r->file);
  ascr_status stt = ascr_blade_parse(text, strlen(text), r->file, base_dir, &s->layout, r->err);
  free(text);
  if (stt == ASCR_OK) {
    /* the sections under the names the spec gives them */
    for (size_t i = 0; i < s->mil.n_sections; i++) {
      free(s->layout->section_name[i]);
      s->layout->section_name[i] = dup_str(names[i]);
      if (s->layout->section_name[i] == NULL) {
        return core_fail(r->err, ASCR_ENOMEM, "%s: out of memory", r->file);
      }
    }
  }
  return stt;
}

/* [a, b] with a < b, both finite: a pair field */
static ascr_status read_pair(const core_json_ctx *r, json_t *o, const char *key, const char *path,
                             double *a, double *b)
{
  json_t *v = json_object_get(o, key);
  if (v == NULL) return ASCR_OK;
  if (!json_is_array(v) || json_array_size(v) != 2 || !json_is_number(json_array_get(v, 0)) ||
      !json_is_number(json_array_get(v, 1)) ||
      !(json_number_value(json_array_get(v, 1)) > json_number_value(json_array_get(v, 0)))) {
    return core_fail(r->err, ASCR_EPARSE, "%s: %s.%s: must be [low, high] with low < high",
                     r->file, path, key);
  }
  *a = json_number_value(json_array_get(v, 0));
  *b = json_number_value(json_array_get(v, 1));
  return ASCR_OK;
}

/* "optimize": the multi-point design (docs/file-formats.md) */
static ascr_status read_optimize(const core_json_ctx *r, json_t *root, ascr_design_spec *s)
{
  json_t *o = json_object_get(root, "optimize");
  if (o == NULL || json_is_null(o)) return ASCR_OK;
  static const char *const keys[] = {"points", "control_points", "chord_range_m",
                                     "min_thickness_m", "max_tip_mach", "rpm_range",
                                     "allow_extended_polars", "max_iterations", NULL};
  static const char *const pkeys[] = {"speed_m_s", "thrust_N", "weight", NULL};
  if (!json_is_object(o)) {
    return core_fail(r->err, ASCR_EPARSE, "%s: optimize: must be an object", r->file);
  }
  ascr_status st = core_json_keys(r, o, "optimize", keys);
  if (st != ASCR_OK) return st;
  ascr_opt_spec *q = &s->opt;
  *q = ascr_opt_spec_defaults();
  const ascr_mil_spec *m = &s->mil;
  json_t *pts = json_object_get(o, "points");
  if (!json_is_array(pts) || json_array_size(pts) < 1 || json_array_size(pts) > ASCR_OPT_MAX_POINTS) {
    return core_fail(r->err, ASCR_EPARSE, "%s: optimize.points: must be a list of 1 .. %d points "
                     "{speed_m_s, thrust_N, weight}", r->file, ASCR_OPT_MAX_POINTS);
  }
  q->n_points = json_array_size(pts);
  for (size_t i = 0; i < q->n_points; i++) {
    json_t *e = json_array_get(pts, i);
    char path[48];
    snprintf(path, sizeof path, "optimize.points[%zu]", i);
    if (!json_is_object(e)) return core_fail(r->err, ASCR_EPARSE, "%s: %s: must be an object", r->file, path);
    ascr_opt_point *pt = &q->points[i];
    st = core_json_keys(r, e, path, pkeys);
    if (st == ASCR_OK) st = core_json_number(r, e, "speed_m_s", path, 0, 0.0, &pt->speed_m_s);
    if (st == ASCR_OK) st = core_json_number(r, e, "thrust_N", path, 1, 0.0, &pt->thrust_N);
    if (st == ASCR_OK) st = core_json_number(r, e, "weight", path, 0, 1.0, &pt->weight);
    if (st != ASCR_OK) return st;
    if (!(pt->speed_m_s >= 0.0 && pt->speed_m_s <= 300.0) || !(pt->thrust_N > 0.0 && pt->thrust_N < 1e5) ||
        !(pt->weight > 0.0 && pt->weight < 1e6)) {
      return core_fail(r->err, ASCR_EINVAL, "%s: %s: speed_m_s 0 .. 300, thrust_N > 0 and weight > 0 "
                       "required", r->file, path);
    }
  }
  double ncp = 5.0, iters = (double)q->max_iterations, mach = NAN;
  double cmin = m->min_chord_m > 0.0 ? m->min_chord_m : 0.02 * m->r_tip_m;
  q->chord_min_m = cmin;
  q->chord_max_m = 0.4 * m->r_tip_m;
  q->rpm_lo = 0.2 * m->rpm;
  q->rpm_hi = 5.0 * m->rpm;
  st = core_json_number(r, o, "control_points", "optimize", 0, 5.0, &ncp);
  if (st == ASCR_OK) st = core_json_number(r, o, "max_iterations", "optimize", 0, iters, &iters);
  if (st == ASCR_OK) st = core_json_number(r, o, "min_thickness_m", "optimize", 0, 0.0, &q->min_thickness_m);
  if (st == ASCR_OK && json_object_get(o, "max_tip_mach") != NULL &&
      !json_is_null(json_object_get(o, "max_tip_mach"))) {
    st = core_json_number(r, o, "max_tip_mach", "optimize", 1, 0.0, &mach);
  }
  if (st == ASCR_OK) st = read_pair(r, o, "chord_range_m", "optimize", &q->chord_min_m, &q->chord_max_m);
  if (st == ASCR_OK) st = read_pair(r, o, "rpm_range", "optimize", &q->rpm_lo, &q->rpm_hi);
  if (st != ASCR_OK) return st;
  if (!(ncp >= 2.0 && ncp <= ASCR_OPT_MAX_CONTROL && ncp == floor(ncp))) {
    return core_fail(r->err, ASCR_EINVAL, "%s: optimize.control_points: %g must be a whole number "
                     "2 .. %d", r->file, ncp, ASCR_OPT_MAX_CONTROL);
  }
  if (!(iters >= 1.0 && iters <= 1e6 && iters == floor(iters))) {
    return core_fail(r->err, ASCR_EINVAL, "%s: optimize.max_iterations: %g must be a whole number "
                     "1 .. 1e6", r->file, iters);
  }
  if (!(q->chord_min_m > 0.0 && q->chord_max_m <= m->r_tip_m)) {
    return core_fail(r->err, ASCR_EINVAL, "%s: optimize.chord_range_m: [%g, %g] must lie in "
                     "(0, tip_radius_m]", r->file, q->chord_min_m, q->chord_max_m);
  }
  if (!(q->rpm_lo > 0.0 && q->rpm_hi <= 1e6)) {
    return core_fail(r->err, ASCR_EINVAL, "%s: optimize.rpm_range: [%g, %g] must lie in (0, 1e6]",
                     r->file, q->rpm_lo, q->rpm_hi);
  }
  if (!(q->min_thickness_m >= 0.0 && q->min_thickness_m < q->chord_max_m)) {
    return core_fail(r->err, ASCR_EINVAL, "%s: optimize.min_thickness_m: %g must be 0 .. the largest "
                     "chord", r->file, q->min_thickness_m);
  }
  if (!isnan(mach) && !(mach > 0.0 && mach < 3.0)) {
    return core_fail(r->err, ASCR_EINVAL, "%s: optimize.max_tip_mach: %g must be 0 .. 3 (or null: "
                     "no limit)", r->file, mach);
  }
  json_t *ext = json_object_get(o, "allow_extended_polars");
  if (ext != NULL && !json_is_boolean(ext)) {
    return core_fail(r->err, ASCR_EPARSE, "%s: optimize.allow_extended_polars: must be true or false",
                     r->file);
  }
  q->allow_extended = ext != NULL && json_is_true(ext);
  q->n_control = (size_t)ncp;
  q->max_iterations = (int)iters;
  q->max_tip_mach = mach;
  s->optimize = 1;
  return ASCR_OK;
}

/* t/c of every span's section, from its shape (for the thickness limit) */
static ascr_status section_thickness(const core_json_ctx *r, ascr_design_spec *s)
{
  for (size_t i = 0; i < s->mil.n_sections; i++) {
    ascr_geom_section *g = NULL;
    ascr_geom_metrics gm;
    ascr_status st = ascr_geom_section_open(s->layout->section_source[i], &g, r->err);
    if (st == ASCR_OK) st = ascr_geom_section_metrics(g, &gm, r->err);
    ascr_geom_section_free(g);
    if (st != ASCR_OK) return st;
    s->thickness[i] = gm.thickness;
  }
  s->opt.section_thickness = s->thickness;
  return ASCR_OK;
}

static ascr_status parse_root(const core_json_ctx *r, json_t *root, const char *base_dir,
                              ascr_design_spec *s)
{
  static const char *const keys[] = {"format", "name", "blades", "tip_radius_m", "hub_radius_m",
                                     "sections", "spans", "design_point", "stations",
                                     "cl_design", "min_chord_m", "alpha_range_deg", "optimize",
                                     NULL};
  if (!json_is_object(root)) {
    return core_fail(r->err, ASCR_EPARSE, "%s: the top level must be an object", r->file);
  }
  ascr_status st = core_json_keys(r, root, "", keys);
  if (st != ASCR_OK) return st;
  json_t *fmt = json_object_get(root, "format");
  if (!json_is_string(fmt) || strcmp(json_string_value(fmt), "airscrew-design-1") != 0) {
    return core_fail(r->err, ASCR_EPARSE, "%s: format: must be \"airscrew-design-1\"", r->file);
  }
  json_t *name = json_object_get(root, "name");
  if (name != NULL) {
    if (!json_is_string(name)) return core_fail(r->err, ASCR_EPARSE, "%s: name: must be a string", r->file);
    s->name = dup_str(json_string_value(name));
  }
  ascr_mil_spec *m = &s->mil;
  *m = ascr_mil_spec_defaults();
  json_t *nb = json_object_get(root, "blades");
  if (!json_is_integer(nb) || json_integer_value(nb) < 1 || json_integer_value(nb) > 12) {
    return core_fail(r->err, ASCR_EPARSE, "%s: blades: must be a whole number 1 .. 12", r->file);
  }
  m->n_blades = (int)json_integer_value(nb);
  double nst = 21.0, cl = NAN;
  st = core_json_number(r, root, "tip_radius_m", "", 1, 0.0, &m->r_tip_m);
  if (st == ASCR_OK) st = core_json_number(r, root, "hub_radius_m", "", 1, 0.0, &m->r_hub_m);
  if (st == ASCR_OK) st = core_json_number(r, root, "stations", "", 0, 21.0, &nst);
  if (st == ASCR_OK) st = core_json_number(r, root, "min_chord_m", "", 0, NAN, &m->min_chord_m);
  if (st == ASCR_OK && json_object_get(root, "cl_design") != NULL &&
      !json_is_null(json_object_get(root, "cl_design"))) {
    st = core_json_number(r, root, "cl_design", "", 1, 0.0, &cl);
  }
  if (st != ASCR_OK) return st;
  if (!(m->r_tip_m > 0.0 && m->r_tip_m <= 2.0)) {
    return core_fail(r->err, ASCR_EINVAL, "%s: tip_radius_m: %g must be 0 .. 2", r->file, m->r_tip_m);
  }
  if (!(m->r_hub_m >= 0.0 && m->r_hub_m < 0.9 * m->r_tip_m)) {
    return core_fail(r->err, ASCR_EINVAL, "%s: hub_radius_m: %g must be 0 .. 0.9 tip_radius_m", r->file, m->r_hub_m);
  }
  if (!(nst >= 3.0 && nst <= ASCR_MIL_MAX_STATIONS && nst == floor(nst))) {
    return core_fail(r->err, ASCR_EINVAL, "%s: stations: %g must be a whole number 3 .. %d", r->file, nst,
                     ASCR_MIL_MAX_STATIONS);
  }
  m->n_stations = (size_t)nst;
  if (!isnan(cl) && !(cl > 0.05 && cl < 2.0)) {
    return core_fail(r->err, ASCR_EINVAL, "%s: cl_design: %g must be 0.05 .. 2 (or null: best L/D)", r->file, cl);
  }
  m->cl_design = cl;
  if (!isnan(m->min_chord_m) && !(m->min_chord_m > 0.0 && m->min_chord_m < 0.5 * m->r_tip_m)) {
    return core_fail(r->err, ASCR_EINVAL, "%s: min_chord_m: %g must be 0 .. tip_radius_m / 2", r->file, m->min_chord_m);
  }
  json_t *ar = json_object_get(root, "alpha_range_deg");
  if (ar != NULL) {
    if (!json_is_array(ar) || json_array_size(ar) != 2 || !json_is_number(json_array_get(ar, 0)) ||
        !json_is_number(json_array_get(ar, 1)) ||
        !(json_number_value(json_array_get(ar, 1)) > json_number_value(json_array_get(ar, 0)))) {
      return core_fail(r->err, ASCR_EPARSE, "%s: alpha_range_deg: must be [low, high] in degrees", r->file);
    }
    m->alpha_lo_deg = json_number_value(json_array_get(ar, 0));
    m->alpha_hi_deg = json_number_value(json_array_get(ar, 1));
  }
  json_t *dp = json_object_get(root, "design_point");
  static const char *const dkeys[] = {"rpm", "speed_m_s", "thrust_N", "power_W", NULL};
  if (!json_is_object(dp)) {
    return core_fail(r->err, ASCR_EPARSE, "%s: design_point: missing or not an object "
                     "{rpm, speed_m_s, thrust_N or power_W}", r->file);
  }
  st = core_json_keys(r, dp, "design_point", dkeys);
  if (st == ASCR_OK) st = core_json_number(r, dp, "rpm", "design_point", 1, 0.0, &m->rpm);
  if (st == ASCR_OK) st = core_json_number(r, dp, "speed_m_s", "design_point", 0, 0.0, &m->speed_m_s);
  if (st == ASCR_OK) st = core_json_number(r, dp, "thrust_N", "design_point", 0, 0.0, &m->thrust_N);
  if (st == ASCR_OK) st = core_json_number(r, dp, "power_W", "design_point", 0, 0.0, &m->power_W);
  if (st != ASCR_OK) return st;
  if (!(m->rpm > 0.0 && m->rpm <= 1e6) || !(m->speed_m_s >= 0.0 && m->speed_m_s <= 300.0)) {
    return core_fail(r->err, ASCR_EINVAL, "%s: design_point: rpm %g must be 0 .. 1e6 and speed_m_s %g "
                     "0 .. 300", r->file, m->rpm, m->speed_m_s);
  }
  if ((m->thrust_N > 0.0) == (m->power_W > 0.0)) {
    return core_fail(r->err, ASCR_EINVAL, "%s: design_point: give one of thrust_N and power_W (> 0)", r->file);
  }
  json_t *secs = json_object_get(root, "sections");
  if (!json_is_object(secs) || json_object_size(secs) < 1) {
    return core_fail(r->err, ASCR_EPARSE, "%s: sections: must be an object naming at least one "
                     "section (name: generator spec or coordinate file)", r->file);
  }
  const char *names[ASCR_DESIGN_MAX_SECTIONS];
  st = read_spans(r, root, secs, s, names);
  if (st != ASCR_OK) return st;
  m->section_from_r_m = s->from_r;
  st = read_optimize(r, root, s);
  if (st == ASCR_OK) st = layout(r, secs, base_dir, s, names);
  if (st == ASCR_OK && s->optimize) st = section_thickness(r, s);
  return st;
}

typedef struct fill_ctx {
  const char *base_dir;
  ascr_design_spec *s;
} fill_ctx;

static ascr_status fill(const core_json_ctx *r, json_t *root, void *vc)
{
  fill_ctx *c = vc;
  return parse_root(r, root, c->base_dir, c->s);
}

ascr_status ascr_design_spec_parse(const char *text, size_t len, const char *name,
                                   const char *base_dir, ascr_design_spec **out, ascr_errbuf *err)
{
  if (out == NULL || (text == NULL && len > 0)) return core_fail(err, ASCR_EINVAL, "design: bad arguments");
  *out = NULL;
  core_json_ctx r = {name != NULL ? name : "(design)", err};
  ascr_design_spec *s = calloc(1, sizeof *s);
  if (s == NULL) {
    return core_fail(err, ASCR_ENOMEM, "%s: out of memory", r.file);
  }
  fill_ctx fc = {base_dir, s};
  ascr_status st = core_json_document(&r, text, len, fill, &fc);
  if (st != ASCR_OK) {
    ascr_design_spec_free(s);
    return st;
  }
  s->mil.section_from_r_m = s->from_r;
  *out = s;
  return ASCR_OK;
}

ascr_status ascr_design_spec_read(const char *path, ascr_design_spec **out, ascr_errbuf *err)
{
  if (path == NULL || out == NULL) return core_fail(err, ASCR_EINVAL, "design: no file given");
  *out = NULL;
  char *buf;
  size_t n;
  ascr_status st = core_file_read(path, SPEC_MAX_BYTES, "design specification", &buf, &n, err);
  if (st != ASCR_OK) return st;
  char *dir = core_path_dir(path);
  if (dir == NULL) {
    free(buf);
    return core_fail(err, ASCR_ENOMEM, "%s: out of memory", path);
  }
  st = ascr_design_spec_parse(buf, n, path, dir, out, err);
  free(dir);
  free(buf);
  return st;
}

ascr_status ascr_design_blade(const ascr_design_spec *s, const ascr_mil_result *r, ascr_blade **out,
                              ascr_errbuf *err)
{
  *out = NULL;
  ascr_blade *b = calloc(1, sizeof *b);
  if (b == NULL) return core_fail(err, ASCR_ENOMEM, "design: out of memory");
  ascr_blade_station *st = calloc(r->n, sizeof *st);
  b->section_name = calloc(s->mil.n_sections, sizeof *b->section_name);
  b->section_source = calloc(s->mil.n_sections, sizeof *b->section_source);
  b->name = dup_str(s->name != NULL ? s->name : "airscrew minimum-induced-loss design");
  if (st == NULL || b->section_name == NULL || b->section_source == NULL || b->name == NULL) {
    free(st);
    ascr_blade_free(b);
    return core_fail(err, ASCR_ENOMEM, "design: out of memory");
  }
  ascr_blade tmp;
  ascr_mil_blade(&s->mil, r, st, &tmp);
  b->n_blades = tmp.n_blades;
  b->r_tip_m = tmp.r_tip_m;
  b->r_hub_m = tmp.r_hub_m;
  b->rotation = 1;
  b->stations = st;
  b->n_stations = r->n;
  b->envelope_rpm[0] = b->envelope_rpm[1] = NAN;
  for (size_t i = 0; i < s->mil.n_sections; i++) {
    b->section_name[i] = dup_str(s->layout->section_name[i]);
    b->section_source[i] = dup_str(s->layout->section_source[i]);
    b->n_sections++;
    if (b->section_name[i] == NULL || b->section_source[i] == NULL) {
      ascr_blade_free(b);
      return core_fail(err, ASCR_ENOMEM, "design: out of memory");
    }
  }
  *out = b;
  return ASCR_OK;
}

ascr_status ascr_blade_to_json(const ascr_blade *b, char **text, size_t *len, ascr_errbuf *err)
{
  json_t *o = json_object();
  json_object_set_new(o, "format", json_string("airscrew-blade-1"));
  if (b->name != NULL) json_object_set_new(o, "name", json_string(b->name));
  json_object_set_new(o, "blades", json_integer(b->n_blades));
  json_object_set_new(o, "length_unit", json_string("mm"));
  json_object_set_new(o, "tip_radius", json_real(1000.0 * b->r_tip_m));
  json_object_set_new(o, "hub_radius", json_real(1000.0 * b->r_hub_m));
  json_object_set_new(o, "rotation", json_string(b->rotation < 0 ? "cw" : "ccw"));
  if (b->pitch_offset_deg != 0.0) json_object_set_new(o, "pitch_offset_deg", json_real(b->pitch_offset_deg));
  json_t *secs = json_object();
  for (size_t i = 0; i < b->n_sections; i++) {
    const char *src = b->section_source[i];
    char abs[PATH_MAX];
    if (!ascr_geom_is_spec(src) && realpath(src, abs) != NULL) src = abs;
    json_object_set_new(secs, b->section_name[i], json_string(src));
  }
  json_object_set_new(o, "sections", secs);
  json_t *st = json_array();
  for (size_t i = 0; i < b->n_stations; i++) {
    json_t *s = json_object();
    /* lengths to 1 um, angles to 1e-4 deg */
    json_object_set_new(s, "r", json_real(round(1e6 * b->stations[i].r_m) / 1e3));
    json_object_set_new(s, "chord", json_real(round(1e6 * b->stations[i].chord_m) / 1e3));
    json_object_set_new(s, "twist_deg", json_real(round(1e4 * b->stations[i].twist_deg) / 1e4));
    json_object_set_new(s, "section", json_string(b->section_name[b->stations[i].section]));
    json_array_append_new(st, s);
  }
  json_object_set_new(o, "stations", st);
  *text = json_dumps(o, JSON_INDENT(2) | JSON_REAL_PRECISION(10));
  json_decref(o);
  if (*text == NULL) return core_fail(err, ASCR_ENOMEM, "blade: out of memory");
  *len = strlen(*text);
  return ASCR_OK;
}
