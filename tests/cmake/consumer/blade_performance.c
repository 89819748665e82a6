/* tests/cmake/consumer/blade_performance.c
 * A program outside the project going from a blade file to performance with libairscrew alone:
 * read the blade, prepare its section tables (ascr_blade_tables_prepare: computed by the
 * viscous solver and cached, or, as here in the tests, read from a polar-table file given for a
 * section), and solve operating points with either inflow model.
 * usage: blade_performance BLADE.json RPM [SECTION=POLAR_TABLE.json]
 */
#include <airscrew/airscrew.h>
#include <gsl/gsl_errno.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

int main(int argc, char **argv)
{
  if (argc < 3) {
    fprintf(stderr, "usage: blade_performance BLADE.json RPM [SECTION=POLAR_TABLE.json]\n");
    return 2;
  }
  gsl_set_error_handler_off(); /* see airscrew.h: embedders switch off GSL's abort handler */
  ascr_errbuf err;
  ascr_blade *b = NULL;
  if (ascr_blade_read(argv[1], &b, &err) != ASCR_OK) {
    fprintf(stderr, "blade_performance: %s\n", err.msg);
    return 1;
  }
  double rpm = atof(argv[2]);
  ascr_blade_tables_options o = ascr_blade_tables_options_defaults();
  char name[64] = "";
  const char *sec[1] = {name}, *path[1] = {NULL};
  if (argc > 3) {
    const char *eq = strchr(argv[3], '=');
    if (eq == NULL || (size_t)(eq - argv[3]) >= sizeof name) return 2;
    memcpy(name, argv[3], (size_t)(eq - argv[3]));
    path[0] = eq + 1;
    o.n_files = 1;
    o.file_section = sec;
    o.file_path = path;
  }
  ascr_rotor_params p = ascr_rotor_params_defaults();
  ascr_blade_tables t;
  if (ascr_blade_tables_prepare(b, &p, rpm, rpm, 0.0, 10.0, &o, &t, &err) != ASCR_OK) {
    fprintf(stderr, "blade_performance: %s\n", err.msg);
    ascr_blade_tables_free(&t);
    ascr_blade_free(b);
    return 1;
  }
  for (size_t i = 0; i < t.n_notes; i++) fprintf(stderr, "note: %s\n", t.notes[i]);
  int bad = 0;
  for (int m = 0; m < 2; m++) {
    for (double v = 0.0; v <= 10.0; v += 5.0) {
      ascr_rotor_result r;
      ascr_inflow model = m == 0 ? ASCR_INFLOW_BEMT : ASCR_INFLOW_VORTEX;
      if (ascr_rotor_point(b, (const ascr_polar_table *const *)t.tables, &p, model, NULL, rpm, v, &r,
                           NULL, &err) != ASCR_OK) {
        fprintf(stderr, "blade_performance: %s\n", err.msg);
        bad = 1;
        continue;
      }
      printf("%-6s %6.0f rpm %5.1f m/s: thrust %.4f N, power %.3f W, CT %.5f, CT/sigma %.4f%s%s\n",
             m == 0 ? "bemt" : "vortex", rpm, v, r.thrust_N, r.power_W, r.CT, r.CT_over_sigma,
             r.converged ? "" : " (not converged)", r.low_confidence ? " (low confidence)" : "");
      bad |= !r.converged || !(r.thrust_N > 0.0);
    }
  }
  ascr_blade_tables_free(&t);
  ascr_blade_free(b);
  return bad;
}
