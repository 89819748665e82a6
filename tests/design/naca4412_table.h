/* tests/design/naca4412_table.h
 * The NACA 4412 polar table of tests/data (four computed curves, Re 5e4-4e5: "viscous polars"),
 * as the design tests use it.
 */
#ifndef ASCR_TEST_NACA4412_TABLE_H
#define ASCR_TEST_NACA4412_TABLE_H

#include "ascr_test.h"
#include "airscrew/ascr_table.h"

#include <stdlib.h>

static inline ascr_polar_table *naca4412_table(void)
{
  ascr_curve_data *curves = NULL;
  size_t n = 0;
  ascr_polar_table *t = NULL;
  assert_int_equal(ascr_table_file_read(ASCR_TESTDATA_DIR "/naca4412-table.json", NULL, &curves, &n, NULL), ASCR_OK);
  assert_int_equal(ascr_polar_table_from_curves(curves, n, NULL, &t, NULL), ASCR_OK);
  for (size_t i = 0; i < n; i++) ascr_curve_data_clear(&curves[i]);
  free(curves);
  return t;
}

#endif
