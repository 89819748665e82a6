/* fuzz/fuzz_result_csv.c
 * libFuzzer target: the reader of CSV results (cli_csv_parse, used by the plot command) and the
 * lookups made on what it returns.
 */
#include "cli.h"
#include "cli_csv.h"

#include <stddef.h>
#include <stdint.h>
#include <string.h>

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
  cli_csv t;
  if (cli_csv_parse((const char *)data, size, "fuzz.csv", &t) == 0) {
    volatile size_t sink = 0;
    for (size_t r = 0; r < t.nrow; r++) {
      for (size_t c = 0; c < t.ncol; c++) {
        const char *v = t.cell[r * t.ncol + c];
        if (v != NULL) sink += strlen(v) + t.line[r];
      }
    }
    (void)cli_csv_col(&t, "alpha_deg");
    (void)cli_csv_meta(&t, "section");
    (void)sink;
    cli_csv_free(&t);
  }
  return 0;
}
