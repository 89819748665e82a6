/* src/core/json_fields.c
 * Shared reading of our JSON input files; see json_fields.h.
 */
#include "core/json_fields.h"
#include "core/core_impl.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

ascr_status core_json_keys(const core_json_ctx *r, json_t *obj, const char *path,
                           const char *const *allowed)
{
  const char *key;
  json_t *val;
  json_object_foreach(obj, key, val) {
    int ok = 0;
    for (size_t i = 0; allowed[i] != NULL; i++) {
      ok |= strcmp(key, allowed[i]) == 0;
    }
    if (!ok) {
      return core_fail(r->err, ASCR_EPARSE, "%s: %s%s%s: unknown field", r->file, path,
                       path[0] ? "." : "", key);
    }
  }
  return ASCR_OK;
}

ascr_status core_json_number(const core_json_ctx *r, json_t *obj, const char *key,
                             const char *path, int required, double def, double *out)
{
  json_t *v = json_object_get(obj, key);
  if (v == NULL) {
    if (required) {
      return core_fail(r->err, ASCR_EPARSE, "%s: %s%s%s: missing (a number is required)", r->file,
                       path, path[0] ? "." : "", key);
    }
    *out = def;
    return ASCR_OK;
  }
  if (!json_is_number(v)) {
    return core_fail(r->err, ASCR_EPARSE, "%s: %s%s%s: must be a number", r->file, path,
                     path[0] ? "." : "", key);
  }
  *out = json_number_value(v);
  if (!isfinite(*out)) {
    return core_fail(r->err, ASCR_EPARSE, "%s: %s%s%s: not a finite number", r->file, path,
                     path[0] ? "." : "", key);
  }
  return ASCR_OK;
}

ascr_status core_json_load(const core_json_ctx *r, const char *text, size_t len, json_t **root)
{
  *root = NULL;
  if (memchr(text, '\0', len) != NULL) {
    return core_fail(r->err, ASCR_EPARSE, "%s: binary data (NUL byte), not a JSON file", r->file);
  }
  json_error_t je;
  *root = json_loadb(text, len, JSON_REJECT_DUPLICATES, &je);
  if (*root == NULL) {
    return core_fail(r->err, ASCR_EPARSE, "%s:%d:%d: JSON syntax: %s", r->file, je.line, je.column,
                     je.text);
  }
  return ASCR_OK;
}

ascr_status core_json_document(const core_json_ctx *r, const char *text, size_t len,
                               ascr_status (*fill)(const core_json_ctx *r, json_t *root, void *ctx),
                               void *ctx)
{
  json_t *root;
  ascr_status st = core_json_load(r, text, len, &root);
  if (st != ASCR_OK) {
    return st;
  }
  st = fill(r, root, ctx);
  json_decref(root);
  return st;
}

ascr_status core_file_read(const char *path, size_t max, const char *what, char **buf,
                           size_t *len, ascr_errbuf *err)
{
  *buf = NULL;
  *len = 0;
  FILE *f = fopen(path, "rb");
  if (f == NULL) {
    return core_fail(err, ASCR_EIO, "%s: cannot open %s", path, what);
  }
  char *b = malloc(max + 1);
  if (b == NULL) {
    fclose(f);
    return core_fail(err, ASCR_ENOMEM, "%s: out of memory", path);
  }
  size_t n = fread(b, 1, max + 1, f);
  int bad = ferror(f);
  fclose(f);
  if (bad) {
    free(b);
    return core_fail(err, ASCR_EIO, "%s: read error", path);
  }
  if (n > max) {
    free(b);
    if (max >= (1u << 20)) {
      return core_fail(err, ASCR_EPARSE, "%s: larger than %zu MiB, not a %s", path, max >> 20, what);
    }
    return core_fail(err, ASCR_EPARSE, "%s: larger than %zu KiB, not a %s", path, max >> 10, what);
  }
  b[n] = '\0';
  *buf = b;
  *len = n;
  return ASCR_OK;
}

char *core_path_dir(const char *path)
{
  size_t n = strlen(path) + 1;
  char *dir = malloc(n);
  if (dir == NULL) {
    return NULL;
  }
  memcpy(dir, path, n);
  char *slash = strrchr(dir, '/');
  if (slash != NULL) {
    *slash = '\0';
  } else {
    dir[0] = '\0';
  }
  return dir;
}
