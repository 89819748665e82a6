/* src/cli/cli_csv.c
 * CSV results read back with libcsv (Debian libcsv-dev): strict quoting, every row as wide as the
 * header. Comment lines ('#') are kept aside with their text; row line numbers are kept for
 * messages.
 */
#define _POSIX_C_SOURCE 200809L
#include "cli_csv.h"
#include "cli.h"

#include <csv.h>
#include <errno.h>
#include <stdlib.h>
#include <string.h>

enum { CSV_MAX_BYTES = 64 << 20, CSV_MAX_COLS = 256 };

typedef struct builder {
  cli_csv *t;
  char **row;           /* fields of the row being read */
  size_t nfield, cap_cells, nrows_seen;
  int too_wide, width_error, nomem;
  size_t bad_row;       /* index of the first row with the wrong width */
  size_t nfield_bad;    /* and its number of fields */
} builder;

static void on_field(void *s, size_t len, void *data)
{
  builder *b = data;
  if (b->nomem || b->width_error) return;
  if (b->nfield >= CSV_MAX_COLS) {
    b->too_wide = 1;
    return;
  }
  char *v = NULL;
  if (s != NULL && len > 0) {
    v = malloc(len + 1);
    if (v == NULL) {
      b->nomem = 1;
      return;
    }
    memcpy(v, s, len);
    v[len] = '\0';
  }
  b->row[b->nfield++] = v;
}

static void drop_row(builder *b)
{
  for (size_t i = 0; i < b->nfield; i++) free(b->row[i]);
  b->nfield = 0;
}

static void on_row(int c, void *data)
{
  (void)c;
  builder *b = data;
  cli_csv *t = b->t;
  size_t r = b->nrows_seen++;
  if (b->nomem || b->width_error) {
    drop_row(b);
    return;
  }
  if (b->too_wide) {
    b->width_error = 1;
    b->bad_row = r;
    drop_row(b);
    return;
  }
  if (r == 0) { /* header */
    t->head = malloc(b->nfield * sizeof *t->head);
    if (t->head == NULL) {
      b->nomem = 1;
      drop_row(b);
      return;
    }
    for (size_t i = 0; i < b->nfield; i++) t->head[i] = b->row[i] != NULL ? b->row[i] : strdup("");
    t->ncol = b->nfield;
    b->nfield = 0;
    return;
  }
  if (b->nfield != t->ncol) {
    b->width_error = 1;
    b->bad_row = r;
    b->nfield_bad = b->nfield;
    drop_row(b);
    return;
  }
  if ((t->nrow + 1) * t->ncol > b->cap_cells) {
    size_t cap = b->cap_cells ? 2 * b->cap_cells : 64 * t->ncol;
    char **nc = realloc(t->cell, cap * sizeof *nc);
    if (nc == NULL) {
      b->nomem = 1;
      drop_row(b);
      return;
    }
    t->cell = nc;
    b->cap_cells = cap;
  }
  memcpy(t->cell + t->nrow * t->ncol, b->row, t->ncol * sizeof *b->row);
  t->nrow++;
  b->nfield = 0;
}

void cli_csv_free(cli_csv *t)
{
  if (t == NULL) return;
  for (size_t i = 0; i < t->ncol; i++) {
    if (t->head != NULL) free(t->head[i]);
  }
  for (size_t i = 0; i < t->nrow * t->ncol; i++) free(t->cell[i]);
  for (size_t i = 0; i < t->ncomment; i++) free(t->comment[i]);
  free(t->head);
  free(t->cell);
  free(t->line);
  free(t->comment);
  memset(t, 0, sizeof *t);
}

int cli_csv_col(const cli_csv *t, const char *name)
{
  for (size_t i = 0; i < t->ncol; i++) {
    if (strcmp(t->head[i], name) == 0) return (int)i;
  }
  return -1;
}

const char *cli_csv_meta(const cli_csv *t, const char *key)
{
  size_t n = strlen(key);
  for (size_t i = 0; i < t->ncomment; i++) {
    const char *c = t->comment[i];
    if (strncmp(c, key, n) == 0 && c[n] == ':') return c + n + 1 + (c[n + 1] == ' ');
  }
  return NULL;
}

int cli_csv_read(const char *path, cli_csv *t)
{
  memset(t, 0, sizeof *t);
  char *text = NULL;
  size_t len = 0;
  int rc = cli_read_file(path, CSV_MAX_BYTES, "result", &text, &len);
  if (rc) return rc;
  rc = cli_csv_parse(text, len, path, t);
  free(text);
  return rc;
}

int cli_csv_parse(const char *text, size_t len, const char *path, cli_csv *t)
{
  memset(t, 0, sizeof *t);
  /* a UTF-8 byte-order mark, as some spreadsheet programs write, is not part of the header */
  if (len >= 3 && (unsigned char)text[0] == 0xEF && (unsigned char)text[1] == 0xBB &&
      (unsigned char)text[2] == 0xBF) {
    text += 3;
    len -= 3;
  }
  if (memchr(text, '\0', len) != NULL) {
    cli_error("%s: contains NUL bytes; not a CSV text file", path);
    return CLI_EXIT_INPUT;
  }
  /* set comment and blank lines aside; the rest goes to the parser with its line numbers */
  char *data = malloc(len + 1);
  size_t *lines = malloc((len / 2 + 2) * sizeof *lines);
  char **comments = malloc((len / 2 + 2) * sizeof *comments);
  if (data == NULL || lines == NULL || comments == NULL) {
    free(data);
    free(lines);
    free(comments);
    cli_error("out of memory");
    return CLI_EXIT_INTERNAL;
  }
  size_t nd = 0, nl = 0, nc = 0, lineno = 0;
  int nomem = 0;
  for (size_t i = 0; i < len;) {
    size_t j = i;
    while (j < len && text[j] != '\n') j++;
    lineno++;
    size_t e = j;
    if (e > i && text[e - 1] == '\r') e--;
    if (e > i && text[i] == '#') {
      size_t a = i + 1;
      while (a < e && text[a] == ' ') a++;
      char *c = malloc(e - a + 1);
      if (c == NULL) {
        nomem = 1;
        break;
      }
      memcpy(c, text + a, e - a);
      c[e - a] = '\0';
      comments[nc++] = c;
    } else if (e > i) {
      memcpy(data + nd, text + i, e - i);
      nd += e - i;
      data[nd++] = '\n';
      lines[nl++] = lineno;
    }
    i = j + 1;
  }
  t->comment = comments;
  t->ncomment = nc;
  if (nomem) {
    free(data);
    free(lines);
    cli_csv_free(t);
    cli_error("out of memory");
    return CLI_EXIT_INTERNAL;
  }

  struct csv_parser p;
  builder b = {.t = t};
  char *row[CSV_MAX_COLS];
  b.row = row;
  int rc = 0;
  if (csv_init(&p, CSV_STRICT | CSV_STRICT_FINI | CSV_APPEND_NULL | CSV_EMPTY_IS_NULL) != 0) {
    rc = CLI_EXIT_INTERNAL;
    cli_error("out of memory");
  } else {
    size_t used = csv_parse(&p, data, nd, on_field, on_row, &b);
    int perr = used != nd ? csv_error(&p) : 0;
    if (perr == 0 && csv_fini(&p, on_field, on_row, &b) != 0) perr = csv_error(&p);
    drop_row(&b);
    csv_free(&p);
    if (b.nomem || perr == CSV_ENOMEM) {
      cli_error("out of memory");
      rc = CLI_EXIT_INTERNAL;
    } else if (perr != 0) {
      /* the parser stops inside the row after the last complete one */
      size_t r = b.nrows_seen < nl ? b.nrows_seen : nl - 1;
      cli_error("%s:%zu: %s (quotes must enclose whole fields)", path, nl ? lines[r] : 1,
                csv_strerror(perr));
      rc = CLI_EXIT_INPUT;
    } else if (b.width_error) {
      if (b.too_wide) {
        cli_error("%s:%zu: more than %d fields; not a result file", path, lines[b.bad_row],
                  CSV_MAX_COLS);
      } else {
        cli_error("%s:%zu: %zu fields where the header has %zu", path, lines[b.bad_row],
                  b.nfield_bad, t->ncol);
      }
      rc = CLI_EXIT_INPUT;
    } else if (t->ncol == 0) {
      cli_error("%s: no header row", path);
      rc = CLI_EXIT_INPUT;
    }
  }
  free(data);
  if (rc) {
    free(lines);
    cli_csv_free(t);
    return rc;
  }
  /* row r of the table is data row r + 1 (row 0 is the header) */
  memmove(lines, lines + 1, t->nrow * sizeof *lines);
  t->line = lines;
  return 0;
}
