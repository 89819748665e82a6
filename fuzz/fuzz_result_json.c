/* fuzz/fuzz_result_json.c
 * libFuzzer target: the plot command's reader of JSON results (plot_data_read, src/cli/
 * plot_read.c): polars with their points, the Reynolds-number study, rotor points with their
 * stations. Parsed as the command parses it (jansson, duplicate keys refused); nothing is drawn.
 */
#include "plot_read.h"

#include <jansson.h>
#include <stddef.h>
#include <stdint.h>

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
  json_error_t je;
  json_t *root = json_loadb((const char *)data, size, JSON_REJECT_DUPLICATES, &je);
  if (root == NULL) return 0;
  plot_data d;
  (void)plot_data_read("fuzz.json", root, &d);
  plot_data_free(&d);
  json_decref(root);
  return 0;
}
