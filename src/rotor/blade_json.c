/* src/rotor/blade_json.c
 * Blade files: JSON read with jansson; schema ours (docs/file-formats.md, "Blade files").
 * Every rejection names the file and the field path (and the line for syntax errors).
 */
#include "rotor/rotor_impl.h"
#include "core/core_impl.h"
#include "core/json_fields.h"
#include "airscrew/ascr_geom.h"

#include <jansson.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define BLADE_MAX_BYTES (4u << 20)

typedef core_json_ctx rd;

static char *dup_str(const char *s)
{
  size_t n = strlen(s) + 1;
  char *d = malloc(n);
  if (d != NULL) {
    memcpy(d, s, n);
  }
  return d;
}

static char *join_path(const char *dir, const char *rel)
{
  if (dir == NULL || dir[0] == '\0' || rel[0] == '/') {
    return dup_str(rel);
  }
  size_t n = strlen(dir) + strlen(rel) + 2;
  char *p = malloc(n);
  if (p != NULL) {
    snprintf(p, n, "%s/%s", dir, rel);
  }
  return p;
}

static ascr_status read_sections(const rd *r, json_t *secs, const char *base_dir, ascr_blade *b)
{
  if (!json_is_object(secs) || json_object_size(secs) == 0) {
    return core_fail(r->err, ASCR_EPARSE,
                     "%s: sections: must be an object naming at least one section "
                     "(name: generator spec or coordinate file)", r->file);
  }
  size_t n = json_object_size(secs);
  b->section_name = core_calloc(n, sizeof *b->section_name);
  b->section_source = core_calloc(n, sizeof *b->section_source);
  if (b->section_name == NULL || b->section_source == NULL) {
    return core_fail(r->err, ASCR_ENOMEM, "%s: out of memory", r->file);
  }
  const char *key;
  json_t *val;
  json_object_foreach(secs, key, val) {
    size_t i = b->n_sections;
    if (!json_is_string(val) || json_string_length(val) == 0) {
      return core_fail(r->err, ASCR_EPARSE,
                       "%s: sections.%s: must be a generator spec (naca4412, plate:...) or a "
                       "coordinate file path", r->file, key);
    }
    const char *src = json_string_value(val);
    b->section_name[i] = dup_str(key);
    b->n_sections++;
    if (ascr_geom_is_spec(src)) {
      b->section_source[i] = dup_str(src);
    } else {
      b->section_source[i] = join_path(base_dir, src);
      if (b->section_source[i] != NULL) {
        FILE *f = fopen(b->section_source[i], "rb");
        if (f == NULL) {
          return core_fail(r->err, ASCR_EIO, "%s: sections.%s: section file '%s' cannot be opened",
                           r->file, key, b->section_source[i]);
        }
        fclose(f);
      }
    }
    if (b->section_name[i] == NULL || b->section_source[i] == NULL) {
      return core_fail(r->err, ASCR_ENOMEM, "%s: out of memory", r->file);
    }
  }
  return ASCR_OK;
}

static ascr_status read_stations(const rd *r, json_t *arr, double scale, ascr_blade *b)
{
  if (!json_is_array(arr) || json_array_size(arr) < 2) {
    return core_fail(r->err, ASCR_EPARSE, "%s: stations: must be a list of at least 2 stations",
                     r->file);
  }
  size_t n = json_array_size(arr);
  if (n > 10000) {
    return core_fail(r->err, ASCR_EPARSE, "%s: stations: %zu stations, at most 10000", r->file, n);
  }
  b->stations = core_calloc(n, sizeof *b->stations);
  if (b->stations == NULL) {
    return core_fail(r->err, ASCR_ENOMEM, "%s: out of memory", r->file);
  }
  static const char *const keys[] = {"r", "chord", "twist_deg", "section", NULL};
  for (size_t i = 0; i < n; i++) {
    json_t *s = json_array_get(arr, i);
    char path[48];
    snprintf(path, sizeof path, "stations[%zu]", i);
    if (!json_is_object(s)) {
      return core_fail(r->err, ASCR_EPARSE, "%s: %s: must be an object {r, chord, twist_deg, section}",
                       r->file, path);
    }
    ascr_status st = core_json_keys(r, s, path, keys);
    double rr, cc, tw;
    if (st == ASCR_OK) {
      st = core_json_number(r, s, "r", path, 1, 0.0, &rr);
    }
    if (st == ASCR_OK) {
      st = core_json_number(r, s, "chord", path, 1, 0.0, &cc);
    }
    if (st == ASCR_OK) {
      st = core_json_number(r, s, "twist_deg", path, 1, 0.0, &tw);
    }
    if (st != ASCR_OK) {
      return st;
    }
    ascr_blade_station *o = &b->stations[i];
    o->r_m = rr * scale;
    o->chord_m = cc * scale;
    o->twist_deg = tw;
    json_t *sec = json_object_get(s, "section");
    if (sec == NULL && b->n_sections == 1) {
      o->section = 0;
    } else if (!json_is_string(sec)) {
      return core_fail(r->err, ASCR_EPARSE,
                       "%s: %s.section: missing or not a name (required when the blade has more "
                       "than one section)", r->file, path);
    } else {
      size_t k = 0;
      while (k < b->n_sections && strcmp(b->section_name[k], json_string_value(sec)) != 0) {
        k++;
      }
      if (k == b->n_sections) {
        return core_fail(r->err, ASCR_EPARSE, "%s: %s.section: unknown section '%s' (not in sections)",
                         r->file, path, json_string_value(sec));
      }
      o->section = k;
    }
    b->n_stations++;
  }
  return ASCR_OK;
}

/* "envelope": {"rpm_min", "rpm_max", "airspeed_max_m_s"} — the operating range the blade's
 * section tables are built for (optional; NaN when absent). */
static ascr_status read_envelope(const rd *r, json_t *env, ascr_blade *b)
{
  b->envelope_rpm[0] = b->envelope_rpm[1] = b->envelope_airspeed_max_m_s = NAN;
  if (env == NULL) {
    return ASCR_OK;
  }
  static const char *const keys[] = {"rpm_min", "rpm_max", "airspeed_max_m_s", NULL};
  if (!json_is_object(env)) {
    return core_fail(r->err, ASCR_EPARSE, "%s: envelope: must be an object", r->file);
  }
  ascr_status st = core_json_keys(r, env, "envelope", keys);
  if (st == ASCR_OK) st = core_json_number(r, env, "rpm_min", "envelope", 1, 0.0, &b->envelope_rpm[0]);
  if (st == ASCR_OK) st = core_json_number(r, env, "rpm_max", "envelope", 1, 0.0, &b->envelope_rpm[1]);
  if (st == ASCR_OK) {
    st = core_json_number(r, env, "airspeed_max_m_s", "envelope", 0, 0.0, &b->envelope_airspeed_max_m_s);
  }
  if (st != ASCR_OK) {
    return st;
  }
  if (!(b->envelope_rpm[0] > 0.0 && b->envelope_rpm[1] >= b->envelope_rpm[0] &&
        b->envelope_rpm[1] <= 1e6)) {
    return core_fail(r->err, ASCR_EINVAL,
                     "%s: envelope: rpm_min %g, rpm_max %g: need 0 < rpm_min <= rpm_max <= 1e6",
                     r->file, b->envelope_rpm[0], b->envelope_rpm[1]);
  }
  if (!(b->envelope_airspeed_max_m_s >= 0.0 && b->envelope_airspeed_max_m_s <= 300.0)) {
    return core_fail(r->err, ASCR_EINVAL, "%s: envelope.airspeed_max_m_s: %g must be 0 .. 300",
                     r->file, b->envelope_airspeed_max_m_s);
  }
  return ASCR_OK;
}

static ascr_status parse_root(const rd *r, json_t *root, const char *base_dir, ascr_blade *b)
{
  static const char *const keys[] = {"format", "name", "blades", "tip_radius", "tip_radius_m",
                                     "hub_radius", "length_unit", "pitch_offset_deg", "rotation", "sections",
                                     "stations", "envelope", NULL};
  if (!json_is_object(root)) {
    return core_fail(r->err, ASCR_EPARSE, "%s: the top level must be an object", r->file);
  }
  ascr_status st = core_json_keys(r, root, "", keys);
  if (st != ASCR_OK) {
    return st;
  }
  json_t *fmt = json_object_get(root, "format");
  if (!json_is_string(fmt) || strcmp(json_string_value(fmt), "airscrew-blade-1") != 0) {
    return core_fail(r->err, ASCR_EPARSE, "%s: format: must be \"airscrew-blade-1\"", r->file);
  }
  json_t *name = json_object_get(root, "name");
  if (name != NULL) {
    if (!json_is_string(name)) {
      return core_fail(r->err, ASCR_EPARSE, "%s: name: must be a string", r->file);
    }
    b->name = dup_str(json_string_value(name));
  }
  json_t *nb = json_object_get(root, "blades");
  if (!json_is_integer(nb)) {
    return core_fail(r->err, ASCR_EPARSE, "%s: blades: missing or not a whole number", r->file);
  }
  json_int_t nbv = json_integer_value(nb);
  if (nbv < 1 || nbv > 12) {
    return core_fail(r->err, ASCR_EINVAL, "%s: blades: %lld, must be 1 .. 12", r->file, (long long)nbv);
  }
  b->n_blades = (int)nbv;
  double scale = 1.0;
  int fraction = 0;
  json_t *lu = json_object_get(root, "length_unit");
  if (lu != NULL) {
    const char *u = json_is_string(lu) ? json_string_value(lu) : "";
    if (strcmp(u, "m") == 0) {
      scale = 1.0;
    } else if (strcmp(u, "mm") == 0) {
      scale = 1e-3;
    } else if (strcmp(u, "in") == 0) {
      scale = 0.0254;
    } else if (strcmp(u, "tip_radius") == 0) {
      fraction = 1;
    } else {
      return core_fail(r->err, ASCR_EPARSE,
                       "%s: length_unit: must be \"m\", \"mm\", \"in\" or \"tip_radius\"", r->file);
    }
  } else {
    return core_fail(r->err, ASCR_EPARSE,
                     "%s: length_unit: missing (\"m\", \"mm\", \"in\" or \"tip_radius\")", r->file);
  }
  /* the tip radius: tip_radius in length_unit, or tip_radius_m in metres (issue 17: with
   * length_unit "tip_radius" the radius cannot be in its own unit, and "tip_radius" then read as
   * metres surprised; tip_radius_m names the unit; tip_radius is still read there as metres, as
   * before) */
  int has_m = json_object_get(root, "tip_radius_m") != NULL;
  int has_u = json_object_get(root, "tip_radius") != NULL;
  if (has_m && has_u) {
    return core_fail(r->err, ASCR_EPARSE, "%s: give one of tip_radius (in length_unit) and "
                     "tip_radius_m (in metres), not both", r->file);
  }
  double tip, hub;
  st = core_json_number(r, root, has_m ? "tip_radius_m" : "tip_radius", "", 1, 0.0, &tip);
  if (st == ASCR_OK) st = core_json_number(r, root, "hub_radius", "", 0, 0.0, &hub);
  if (st != ASCR_OK) return st;
  if (fraction) {
    /* stations as fractions of the tip radius, the radius in metres */
    b->r_tip_m = tip;
    b->r_hub_m = hub * tip;
    scale = tip;
  } else {
    b->r_tip_m = has_m ? tip : tip * scale;
    b->r_hub_m = hub * scale;
  }
  if (!(b->r_tip_m > 0.0)) {
    return core_fail(r->err, ASCR_EINVAL, "%s: %s: %g must be > 0", r->file,
                     has_m ? "tip_radius_m" : "tip_radius", tip);
  }
  st = core_json_number(r, root, "pitch_offset_deg", "", 0, 0.0, &b->pitch_offset_deg);
  if (st != ASCR_OK) {
    return st;
  }
  b->rotation = 1;
  json_t *rot = json_object_get(root, "rotation");
  if (rot != NULL) {
    const char *s = json_is_string(rot) ? json_string_value(rot) : "";
    if (strcmp(s, "ccw") == 0) {
      b->rotation = 1;
    } else if (strcmp(s, "cw") == 0) {
      b->rotation = -1;
    } else {
      return core_fail(r->err, ASCR_EPARSE,
                       "%s: rotation: must be \"ccw\" or \"cw\" (seen from the front)", r->file);
    }
  }
  st = read_envelope(r, json_object_get(root, "envelope"), b);
  if (st != ASCR_OK) {
    return st;
  }
  st = read_sections(r, json_object_get(root, "sections"), base_dir, b);
  if (st != ASCR_OK) {
    return st;
  }
  st = read_stations(r, json_object_get(root, "stations"), scale, b);
  if (st != ASCR_OK) {
    return st;
  }
  ascr_errbuf e2;
  st = ascr_blade_validate(b, &e2);
  if (st != ASCR_OK) {
    /* "blade: stations[3].chord ..." -> "file: stations[3].chord ..." */
    const char *m = strncmp(e2.msg, "blade: ", 7) == 0 ? e2.msg + 7 : e2.msg;
    return core_fail(r->err, st, "%s: %s", r->file, m);
  }
  return ASCR_OK;
}

typedef struct fill_ctx {
  const char *base_dir;
  ascr_blade *b;
} fill_ctx;

static ascr_status fill(const rd *r, json_t *root, void *vc)
{
  fill_ctx *c = vc;
  return parse_root(r, root, c->base_dir, c->b);
}

ascr_status ascr_blade_parse(const char *text, size_t len, const char *name, const char *base_dir,
                             ascr_blade **out, ascr_errbuf *err)
{
  if (out == NULL || (text == NULL && len > 0)) {
    return core_fail(err, ASCR_EINVAL, "blade: bad arguments");
  }
  *out = NULL;
  rd r = {name != NULL ? name : "(blade)", err};
  ascr_blade *b = calloc(1, sizeof *b);
  if (b == NULL) {
    return core_fail(err, ASCR_ENOMEM, "%s: out of memory", r.file);
  }
  fill_ctx fc = {base_dir, b};
  ascr_status st = core_json_document(&r, text, len, fill, &fc);
  if (st != ASCR_OK) {
    ascr_blade_free(b);
    return st;
  }
  *out = b;
  return ASCR_OK;
}

ascr_status ascr_blade_read(const char *path, ascr_blade **out, ascr_errbuf *err)
{
  if (path == NULL || out == NULL) {
    return core_fail(err, ASCR_EINVAL, "blade: no file given");
  }
  *out = NULL;
  char *buf;
  size_t n;
  ascr_status rs = core_file_read(path, BLADE_MAX_BYTES, "blade file", &buf, &n, err);
  if (rs != ASCR_OK) {
    return rs;
  }
  /* directory of the file, for relative section paths */
  char *dir = core_path_dir(path);
  if (dir == NULL) {
    free(buf);
    return core_fail(err, ASCR_ENOMEM, "%s: out of memory", path);
  }
  ascr_status st = ascr_blade_parse(buf, n, path, dir, out, err);
  free(dir);
  free(buf);
  return st;
}
