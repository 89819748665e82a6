/* src/cli/cli_csv.h
 * Reading the CSV results airscrew writes (for redrawing their figures): '#' comment lines, one
 * header row, then rows of the same width. Parsing by libcsv; comment lines are set aside first.
 */
#ifndef ASCR_CLI_CSV_H
#define ASCR_CLI_CSV_H

#include <stddef.h>

typedef struct cli_csv {
  size_t ncol, nrow;
  char **head;         /* ncol column names */
  char **cell;         /* nrow * ncol, row-major; NULL where the field is empty */
  size_t *line;        /* file line of each row */
  char **comment;      /* text after '#' of each comment line, leading blanks dropped */
  size_t ncomment;
} cli_csv;

/* Read PATH. Returns 0, or an exit code with a message naming the file and line. */
int cli_csv_read(const char *path, cli_csv *t);
/* The same from LEN bytes of TEXT; PATH names it in messages. */
int cli_csv_parse(const char *text, size_t len, const char *path, cli_csv *t);
void cli_csv_free(cli_csv *t);
/* Column index of NAME, or -1. */
int cli_csv_col(const cli_csv *t, const char *name);
/* The text after "KEY: " of the first comment line that starts with it, or NULL. */
const char *cli_csv_meta(const cli_csv *t, const char *key);

#endif
