/* src/structure/material_json.c
 * Material files (our schema, docs/file-formats.md "Material file"): every property a number
 * with its source, read with jansson; unknown fields refused, messages naming file and field.
 */
#include "core/core_impl.h"
#include "core/json_fields.h"
#include "airscrew/ascr_structure.h"

#include <jansson.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define MATERIAL_MAX_BYTES (1u << 16)

/* "key": {"value": number or null, "source": text}; required: value must be a number */
static ascr_status read_value(const core_json_ctx *r, json_t *root, const char *key, int required,
                              double lo, double hi, ascr_material_value *out)
{
  static const char *const keys[] = {"value", "source", NULL};
  json_t *o = json_object_get(root, key);
  out->value = NAN;
  out->source[0] = '\0';
  if (o == NULL) {
    if (!required) return ASCR_OK;
    return core_fail(r->err, ASCR_EPARSE, "%s: %s: missing ({\"value\": number, \"source\": text})",
                     r->file, key);
  }
  if (!json_is_object(o)) {
    return core_fail(r->err, ASCR_EPARSE, "%s: %s: must be {\"value\": number, \"source\": text}",
                     r->file, key);
  }
  ascr_status st = core_json_keys(r, o, key, keys);
  if (st != ASCR_OK) return st;
  json_t *v = json_object_get(o, "value"), *src = json_object_get(o, "source");
  if (!json_is_string(src) || json_string_length(src) == 0) {
    return core_fail(r->err, ASCR_EPARSE, "%s: %s.source: required: where the value comes from "
                     "(a datasheet, a handbook, or \"datasheet class, typical\")", r->file, key);
  }
  snprintf(out->source, sizeof out->source, "%s", json_string_value(src));
  if (json_is_null(v) && !required) return ASCR_OK;
  if (!json_is_number(v)) {
    return core_fail(r->err, ASCR_EPARSE, "%s: %s.value: must be a number%s", r->file, key,
                     required ? "" : " or null");
  }
  out->value = json_number_value(v);
  if (!(out->value >= lo && out->value <= hi)) {
    return core_fail(r->err, ASCR_EINVAL, "%s: %s.value: %g must be %g .. %g", r->file, key,
                     out->value, lo, hi);
  }
  return ASCR_OK;
}

static ascr_status fill(const core_json_ctx *r, json_t *root, void *vc)
{
  ascr_material *m = vc;
  static const char *const keys[] = {"format", "name", "density_kg_m3", "elastic_modulus_Pa",
                                     "shear_modulus_Pa", "poisson_ratio", "tensile_strength_Pa",
                                     "fatigue_limit_Pa", NULL};
  if (!json_is_object(root)) {
    return core_fail(r->err, ASCR_EPARSE, "%s: the top level must be an object", r->file);
  }
  ascr_status st = core_json_keys(r, root, "", keys);
  if (st != ASCR_OK) return st;
  json_t *fmt = json_object_get(root, "format"), *nm = json_object_get(root, "name");
  if (!json_is_string(fmt) || strcmp(json_string_value(fmt), "airscrew-material-1") != 0) {
    return core_fail(r->err, ASCR_EPARSE, "%s: format: must be \"airscrew-material-1\"", r->file);
  }
  if (!json_is_string(nm)) return core_fail(r->err, ASCR_EPARSE, "%s: name: required text", r->file);
  snprintf(m->name, sizeof m->name, "%s", json_string_value(nm));
  st = read_value(r, root, "density_kg_m3", 1, 100.0, 25000.0, &m->density_kg_m3);
  if (st == ASCR_OK) st = read_value(r, root, "elastic_modulus_Pa", 1, 1e6, 1e12, &m->elastic_modulus_pa);
  if (st == ASCR_OK) st = read_value(r, root, "tensile_strength_Pa", 1, 1e5, 1e10, &m->tensile_strength_pa);
  if (st == ASCR_OK) st = read_value(r, root, "poisson_ratio", 0, 0.0, 0.5, &m->poisson_ratio);
  if (st == ASCR_OK) st = read_value(r, root, "shear_modulus_Pa", 0, 1e5, 1e12, &m->shear_modulus_pa);
  if (st == ASCR_OK) st = read_value(r, root, "fatigue_limit_Pa", 0, 1e4, 1e10, &m->fatigue_limit_pa);
  if (st != ASCR_OK) return st;
  if (isnan(m->poisson_ratio.value)) {
    m->poisson_ratio.value = 0.35;
    snprintf(m->poisson_ratio.source, sizeof m->poisson_ratio.source,
             "not given: 0.35, common practice for unfilled polymers");
  }
  if (isnan(m->shear_modulus_pa.value)) {
    m->shear_modulus_pa.value = m->elastic_modulus_pa.value / (2.0 * (1.0 + m->poisson_ratio.value));
    snprintf(m->shear_modulus_pa.source, sizeof m->shear_modulus_pa.source,
             "not given: E / (2 (1 + nu)), isotropic");
  }
  if (m->fatigue_limit_pa.value > m->tensile_strength_pa.value) {
    return core_fail(r->err, ASCR_EINVAL, "%s: fatigue_limit_Pa.value: %g above the tensile strength",
                     r->file, m->fatigue_limit_pa.value);
  }
  return ASCR_OK;
}

ascr_status ascr_material_parse(const char *text, size_t len, const char *name, ascr_material *out,
                                ascr_errbuf *err)
{
  if (out == NULL || (text == NULL && len > 0)) return core_fail(err, ASCR_EINVAL, "material: bad arguments");
  memset(out, 0, sizeof *out);
  core_json_ctx r = {name != NULL ? name : "(material)", err};
  return core_json_document(&r, text, len, fill, out);
}

ascr_status ascr_material_read(const char *path, ascr_material *out, ascr_errbuf *err)
{
  if (path == NULL || out == NULL) return core_fail(err, ASCR_EINVAL, "material: no file given");
  char *buf;
  size_t n;
  ascr_status st = core_file_read(path, MATERIAL_MAX_BYTES, "material file", &buf, &n, err);
  if (st != ASCR_OK) return st;
  st = ascr_material_parse(buf, n, path, out, err);
  free(buf);
  return st;
}
