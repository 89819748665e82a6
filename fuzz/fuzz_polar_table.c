/* fuzz/fuzz_polar_table.c
 * libFuzzer target: the polar-table reader (ascr_table_file_parse) and, when accepted, the table
 * build and a sweep of lookups over all angles (every number must be finite, the trip flags
 * two bits).
 */
#include <airscrew/airscrew.h>
#include <math.h>
#include <stddef.h>
#include <stdint.h>
#include <stdlib.h>

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
  ascr_curve_data *cv = NULL;
  size_t n = 0;
  ascr_errbuf err;
  if (ascr_table_file_parse((const char *)data, size, "fuzz.json", NULL, &cv, &n, &err) != ASCR_OK) {
    return 0;
  }
  ascr_polar_table *t = NULL;
  if (ascr_polar_table_from_curves(cv, n, NULL, &t, &err) == ASCR_OK) {
    for (int d = -180; d <= 180; d += 3) {
      ascr_table_sample q;
      ascr_polar_table_eval(t, d * 3.14159265358979323846 / 180.0, 5e4, 0.2, &q);
      if (!isfinite(q.cl) || !isfinite(q.cd) || !isfinite(q.cm)) abort();
      if (q.trip_unbound < 0 || q.trip_unbound > 3) abort();
    }
    ascr_polar_table_free(t);
  }
  for (size_t k = 0; k < n; k++) ascr_curve_data_clear(&cv[k]);
  free(cv);
  return 0;
}
