/* src/core/json_fields.h
 * Reading our JSON input files (blade, powertrain) with jansson: unknown keys refused, numbers
 * checked, every message naming the file and the field path. Private (not installed).
 */
#ifndef ASCR_CORE_JSON_FIELDS_H
#define ASCR_CORE_JSON_FIELDS_H

#include <jansson.h>
#include "airscrew/ascr_errno.h"

typedef struct core_json_ctx {
  const char *file;  /* names the file in messages */
  ascr_errbuf *err;
} core_json_ctx;

/* ASCR_EPARSE naming the first key of obj not in allowed (NULL-terminated). path: the object's
 * own field path ("" at the top level). */
ascr_status core_json_keys(const core_json_ctx *r, json_t *obj, const char *path,
                           const char *const *allowed);

/* A finite number at obj.key: required (ASCR_EPARSE when missing) or def when absent. */
ascr_status core_json_number(const core_json_ctx *r, json_t *obj, const char *key,
                             const char *path, int required, double def, double *out);

/* Parse text (no NUL bytes) as a JSON document, duplicates refused; syntax errors with line
 * and column. *root owned by the caller. */
ascr_status core_json_load(const core_json_ctx *r, const char *text, size_t len, json_t **root);

/* Parse text as a JSON document (core_json_load) and hand its root to fill(r, root, ctx), the
 * reader of one file type; the document is released afterwards whatever fill returns. */
ascr_status core_json_document(const core_json_ctx *r, const char *text, size_t len,
                               ascr_status (*fill)(const core_json_ctx *r, json_t *root, void *ctx),
                               void *ctx);

/* Read a whole regular file of at most max bytes into *buf (NUL-terminated, caller frees);
 * what names the kind of file in messages. */
ascr_status core_file_read(const char *path, size_t max, const char *what, char **buf,
                           size_t *len, ascr_errbuf *err);

/* The folder of a file path ("" for a bare name), for resolving the relative paths a file names;
 * allocated (free()), NULL when out of memory. */
char *core_path_dir(const char *path);

#endif
