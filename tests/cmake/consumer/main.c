/* tests/cmake/consumer/main.c
 * A program outside the project that uses the installed libairscrew: it is built in the tests
 * through the CMake package and through pkg-config. Also the shortest example of the API:
 * generate a section, repanel it, solve the inviscid flow at one angle.
 */
#include <airscrew/airscrew.h>
#include <gsl/gsl_errno.h>
#include <stdio.h>

int main(void)
{
  gsl_set_error_handler_off(); /* see airscrew.h: embedders switch off GSL's abort handler */
  ascr_errbuf err;
  ascr_geom_section *raw = NULL, *sec = NULL;
  if (ascr_geom_section_from_spec("naca2412", &raw, &err) != ASCR_OK ||
      ascr_geom_section_repanel(raw, NULL, &sec, &err) != ASCR_OK) {
    fprintf(stderr, "consumer: %s\n", err.msg);
    return 1;
  }
  ascr_panel_solver *w = ascr_panel_solver_alloc(ascr_geom_section_size(sec));
  ascr_panel_result r;
  if (w == NULL || ascr_panel_solver_set(w, sec, &err) != ASCR_OK ||
      ascr_panel_solver_solve(w, 4.0 * 3.14159265358979323846 / 180.0, 0.0, &r, NULL, NULL,
                              &err) != ASCR_OK) {
    fprintf(stderr, "consumer: %s\n", err.msg);
    return 1;
  }
  printf("airscrew %s: NACA 2412 at 4 deg, inviscid cl %.4f, cm %.4f\n", ascr_version(), r.cl,
         r.cm);
  ascr_panel_solver_free(w);
  ascr_geom_section_free(sec);
  ascr_geom_section_free(raw);
  /* thin-airfoil estimate 2 pi (4 + 2.08) deg = 0.67; thickness raises it by about 10 % */
  return (r.cl > 0.6 && r.cl < 0.8) ? 0 : 1;
}
