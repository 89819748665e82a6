/* src/power/powertrain_json.c
 * Powertrain files: JSON read with jansson; schema ours (docs/file-formats.md, "Powertrain
 * files"). Every rejection names the file and the field path (and the line for syntax errors).
 */
#include "power/power_impl.h"
#include "core/core_impl.h"
#include "core/json_fields.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define POWERTRAIN_MAX_BYTES (1u << 20)

/* one numeric field of an object: name, where it goes, required, default */
typedef struct field {
  const char *key;
  double *dst;
  int required;
  double def;
} field;

static ascr_status read_object(const core_json_ctx *r, json_t *root, const char *key,
                               int required, const field *f, size_t nf)
{
  json_t *obj = json_object_get(root, key);
  if (obj == NULL && !required) {
    for (size_t i = 0; i < nf; i++) {
      *f[i].dst = f[i].def;
    }
    return ASCR_OK;
  }
  if (!json_is_object(obj)) {
    return core_fail(r->err, ASCR_EPARSE, "%s: %s: %s", r->file, key,
                     obj == NULL ? "missing (an object is required)" : "must be an object");
  }
  const char *allowed[16];
  for (size_t i = 0; i < nf && i < 15; i++) {
    allowed[i] = f[i].key;
  }
  allowed[nf < 15 ? nf : 15] = NULL;
  ascr_status st = core_json_keys(r, obj, key, allowed);
  for (size_t i = 0; st == ASCR_OK && i < nf; i++) {
    st = core_json_number(r, obj, f[i].key, key, f[i].required, f[i].def, f[i].dst);
  }
  return st;
}

/* a whole number in lo..hi at obj.key (default def when absent and not required) */
static ascr_status read_count(const core_json_ctx *r, json_t *obj, const char *key,
                              const char *path, int required, int def, int lo, int hi, int *out)
{
  json_t *v = json_object_get(obj, key);
  if (v == NULL) {
    if (required) {
      return core_fail(r->err, ASCR_EPARSE, "%s: %s.%s: missing (a whole number is required)",
                       r->file, path, key);
    }
    *out = def;
    return ASCR_OK;
  }
  if (!json_is_integer(v)) {
    return core_fail(r->err, ASCR_EPARSE, "%s: %s.%s: must be a whole number", r->file, path, key);
  }
  json_int_t n = json_integer_value(v);
  if (n < lo || n > hi) {
    return core_fail(r->err, ASCR_EINVAL, "%s: %s.%s: %lld, must be %d .. %d", r->file, path, key,
                     (long long)n, lo, hi);
  }
  *out = (int)n;
  return ASCR_OK;
}

static ascr_status parse_root(const core_json_ctx *r, json_t *root, ascr_powertrain *pt)
{
  static const char *const keys[] = {"format", "name", "motor", "esc", "battery",
                                     "wiring_resistance_ohm", "craft", NULL};
  if (!json_is_object(root)) {
    return core_fail(r->err, ASCR_EPARSE, "%s: the top level must be an object", r->file);
  }
  ascr_status st = core_json_keys(r, root, "", keys);
  if (st != ASCR_OK) {
    return st;
  }
  json_t *fmt = json_object_get(root, "format");
  if (!json_is_string(fmt) || strcmp(json_string_value(fmt), "airscrew-powertrain-1") != 0) {
    return core_fail(r->err, ASCR_EPARSE, "%s: format: must be \"airscrew-powertrain-1\"", r->file);
  }
  json_t *name = json_object_get(root, "name");
  if (name != NULL) {
    if (!json_is_string(name)) {
      return core_fail(r->err, ASCR_EPARSE, "%s: name: must be a string", r->file);
    }
    size_t n = strlen(json_string_value(name)) + 1;
    pt->name = malloc(n);
    if (pt->name == NULL) {
      return core_fail(r->err, ASCR_ENOMEM, "%s: out of memory", r->file);
    }
    memcpy(pt->name, json_string_value(name), n);
  }
  ascr_motor *m = &pt->motor;
  const field mf[] = {{"kv_rpm_per_V", &m->kv_rpm_per_V, 1, 0.0},
                      {"resistance_ohm", &m->resistance_ohm, 1, 0.0},
                      {"no_load_current_A", &m->no_load_current_A, 1, 0.0},
                      {"no_load_voltage_V", &m->no_load_voltage_V, 0, NAN},
                      {"no_load_speed_share", &m->no_load_speed_share, 0, 0.0},
                      {"max_current_A", &m->max_current_A, 0, NAN},
                      {"mass_kg", &m->mass_kg, 0, NAN}};
  st = read_object(r, root, "motor", 1, mf, sizeof mf / sizeof mf[0]);
  if (st != ASCR_OK) {
    return st;
  }
  ascr_esc *e = &pt->esc;
  const field ef[] = {{"resistance_ohm", &e->resistance_ohm, 0, 0.0},
                      {"max_current_A", &e->max_current_A, 0, NAN},
                      {"mass_kg", &e->mass_kg, 0, NAN}};
  st = read_object(r, root, "esc", 0, ef, sizeof ef / sizeof ef[0]);
  if (st != ASCR_OK) {
    return st;
  }
  ascr_battery *b = &pt->battery;
  double ns = 0.0, np = 0.0; /* placeholders: the counts are read as whole numbers below */
  const field bf[] = {{"cells_series", &ns, 1, 0.0},
                      {"cells_parallel", &np, 0, 1.0},
                      {"cell_voltage_full_V", &b->cell_voltage_full_V, 1, 0.0},
                      {"cell_voltage_nominal_V", &b->cell_voltage_nominal_V, 1, 0.0},
                      {"cell_voltage_loaded_V", &b->cell_voltage_loaded_V, 1, 0.0},
                      {"cell_resistance_ohm", &b->cell_resistance_ohm, 1, 0.0},
                      {"capacity_Ah", &b->capacity_Ah, 1, 0.0},
                      {"max_current_A", &b->max_current_A, 0, NAN},
                      {"usable_share", &b->usable_share, 0, 0.8},
                      {"mass_kg", &b->mass_kg, 0, NAN}};
  st = read_object(r, root, "battery", 1, bf, sizeof bf / sizeof bf[0]);
  if (st == ASCR_OK) {
    json_t *bo = json_object_get(root, "battery");
    st = read_count(r, bo, "cells_series", "battery", 1, 0, 1, 30, &b->cells_series);
    if (st == ASCR_OK) {
      st = read_count(r, bo, "cells_parallel", "battery", 0, 1, 1, 20, &b->cells_parallel);
    }
  }
  if (st != ASCR_OK) {
    return st;
  }
  st = core_json_number(r, root, "wiring_resistance_ohm", "", 0, 0.0, &pt->wiring_resistance_ohm);
  if (st != ASCR_OK) {
    return st;
  }
  json_t *craft = json_object_get(root, "craft");
  if (craft != NULL) {
    double nr = 0.0;
    const field cf[] = {{"mass_kg", &pt->craft.mass_kg, 1, 0.0},
                        {"rotors", &nr, 1, 0.0},
                        {"drag_area_m2", &pt->craft.drag_area_m2, 0, 0.0}};
    st = read_object(r, root, "craft", 1, cf, sizeof cf / sizeof cf[0]);
    if (st == ASCR_OK) {
      st = read_count(r, craft, "rotors", "craft", 1, 0, 1, 16, &pt->craft.rotors);
    }
    if (st != ASCR_OK) {
      return st;
    }
    pt->has_craft = 1;
  }
  ascr_errbuf e2;
  st = ascr_powertrain_validate(pt, &e2);
  if (st != ASCR_OK) {
    const char *msg = strncmp(e2.msg, "powertrain: ", 12) == 0 ? e2.msg + 12 : e2.msg;
    return core_fail(r->err, st, "%s: %s", r->file, msg);
  }
  return ASCR_OK;
}

/* value in [lo, hi] (NaN allowed where optional) */
static ascr_status check(ascr_errbuf *err, const char *path, double v, double lo, double hi,
                         int optional, const char *why)
{
  if (optional && isnan(v)) {
    return ASCR_OK;
  }
  if (!(v >= lo && v <= hi)) {
    return core_fail(err, ASCR_EINVAL, "powertrain: %s: %g must be %g .. %g%s", path, v, lo, hi,
                     why);
  }
  return ASCR_OK;
}

ascr_status ascr_powertrain_validate(const ascr_powertrain *pt, ascr_errbuf *err)
{
  if (pt == NULL) {
    return core_fail(err, ASCR_EINVAL, "powertrain: none given");
  }
  const ascr_motor *m = &pt->motor;
  const ascr_battery *b = &pt->battery;
  const ascr_esc *e = &pt->esc;
  /* ranges: wide enough for any motor, controller and pack of 1.5-10 inch propellers, narrow
   * enough to catch a unit slip (ohm for milliohm, mAh for Ah) */
  struct {
    const char *path;
    double v, lo, hi;
    int optional;
    const char *why;
  } c[] = {
      {"motor.kv_rpm_per_V", m->kv_rpm_per_V, 10.0, 1e5, 0, ""},
      {"motor.resistance_ohm", m->resistance_ohm, 1e-4, 100.0, 0, ""}, /* > 0: the circuit divides by it at standstill */
      {"motor.no_load_current_A", m->no_load_current_A, 0.0, 100.0, 0, ""},
      {"motor.no_load_voltage_V", m->no_load_voltage_V, 0.1, 1000.0, 1, ""},
      {"motor.no_load_speed_share", m->no_load_speed_share, 0.0, 1.0, 0, ""},
      {"motor.max_current_A", m->max_current_A, 1e-3, 1e4, 1, ""},
      {"motor.mass_kg", m->mass_kg, 0.0, 100.0, 1, ""},
      {"esc.resistance_ohm", e->resistance_ohm, 0.0, 100.0, 0, ""},
      {"esc.max_current_A", e->max_current_A, 1e-3, 1e4, 1, ""},
      {"esc.mass_kg", e->mass_kg, 0.0, 100.0, 1, ""},
      {"battery.cells_series", (double)b->cells_series, 1.0, 30.0, 0, ""},
      {"battery.cells_parallel", (double)b->cells_parallel, 1.0, 20.0, 0, ""},
      {"battery.cell_voltage_full_V", b->cell_voltage_full_V, 0.5, 5.0, 0, ""},
      {"battery.cell_voltage_nominal_V", b->cell_voltage_nominal_V, 0.5,
       b->cell_voltage_full_V, 0, " (at most the full voltage)"},
      {"battery.cell_voltage_loaded_V", b->cell_voltage_loaded_V, 0.5,
       b->cell_voltage_nominal_V, 0, " (at most the nominal voltage)"},
      {"battery.cell_resistance_ohm", b->cell_resistance_ohm, 0.0, 10.0, 0, ""},
      {"battery.capacity_Ah", b->capacity_Ah, 1e-3, 1000.0, 0, ""},
      {"battery.max_current_A", b->max_current_A, 1e-3, 1e4, 1, ""},
      {"battery.usable_share", b->usable_share, 0.05, 1.0, 0, ""},
      {"battery.mass_kg", b->mass_kg, 0.0, 100.0, 1, ""},
      {"wiring_resistance_ohm", pt->wiring_resistance_ohm, 0.0, 10.0, 0, ""},
      {"craft.mass_kg", pt->has_craft ? pt->craft.mass_kg : NAN, 1e-3, 1e4, 1, ""},
      {"craft.rotors", pt->has_craft ? (double)pt->craft.rotors : NAN, 1.0, 16.0, 1, ""},
      {"craft.drag_area_m2", pt->has_craft ? pt->craft.drag_area_m2 : NAN, 0.0, 100.0, 1, ""},
  };
  for (size_t i = 0; i < sizeof c / sizeof c[0]; i++) {
    ascr_status st = check(err, c[i].path, c[i].v, c[i].lo, c[i].hi, c[i].optional, c[i].why);
    if (st != ASCR_OK) {
      return st;
    }
  }
  if (m->no_load_speed_share > 0.0 && isnan(m->no_load_voltage_V)) {
    return core_fail(err, ASCR_EINVAL, "powertrain: motor.no_load_speed_share needs "
                     "motor.no_load_voltage_V (the voltage at which the no-load current was measured)");
  }
  return ASCR_OK;
}

static ascr_status fill(const core_json_ctx *r, json_t *root, void *pt)
{
  return parse_root(r, root, pt);
}

ascr_status ascr_powertrain_parse(const char *text, size_t len, const char *name,
                                  ascr_powertrain **out, ascr_errbuf *err)
{
  if (out == NULL || (text == NULL && len > 0)) {
    return core_fail(err, ASCR_EINVAL, "powertrain: bad arguments");
  }
  *out = NULL;
  core_json_ctx r = {name != NULL ? name : "(powertrain)", err};
  ascr_powertrain *pt = calloc(1, sizeof *pt);
  if (pt == NULL) {
    return core_fail(err, ASCR_ENOMEM, "%s: out of memory", r.file);
  }
  ascr_status st = core_json_document(&r, text, len, fill, pt);
  if (st != ASCR_OK) {
    ascr_powertrain_free(pt);
    return st;
  }
  *out = pt;
  return ASCR_OK;
}

ascr_status ascr_powertrain_read(const char *path, ascr_powertrain **out, ascr_errbuf *err)
{
  if (path == NULL || out == NULL) {
    return core_fail(err, ASCR_EINVAL, "powertrain: no file given");
  }
  *out = NULL;
  char *buf;
  size_t n;
  ascr_status st = core_file_read(path, POWERTRAIN_MAX_BYTES, "powertrain file", &buf, &n, err);
  if (st != ASCR_OK) {
    return st;
  }
  st = ascr_powertrain_parse(buf, n, path, out, err);
  free(buf);
  return st;
}

void ascr_powertrain_free(ascr_powertrain *pt)
{
  if (pt == NULL) {
    return;
  }
  free(pt->name);
  free(pt);
}
