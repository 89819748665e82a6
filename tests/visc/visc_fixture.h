/* tests/visc/visc_fixture.h
 * A section from a generator spec, repanelled, with its panel solver and a viscous solver set
 * at one Reynolds number (defaults otherwise): the common set-up of the viscous tests.
 */
#ifndef VISC_FIXTURE_H
#define VISC_FIXTURE_H

#include "ascr_test.h"

#include <airscrew/airscrew.h>

typedef struct fixture {
  ascr_geom_section *raw, *s;
  ascr_panel_solver *w;
  ascr_visc_solver *v;
} fixture;

static inline void setup(fixture *f, const char *spec, double re)
{
  ascr_errbuf e;
  assert_int_equal(ascr_geom_section_from_spec(spec, &f->raw, &e), ASCR_OK);
  assert_int_equal(ascr_geom_section_repanel(f->raw, NULL, &f->s, &e), ASCR_OK);
  size_t n = ascr_geom_section_size(f->s);
  f->w = ascr_panel_solver_alloc(n);
  assert_int_equal(ascr_panel_solver_set(f->w, f->s, &e), ASCR_OK);
  f->v = ascr_visc_solver_alloc(n, ascr_visc_default_wake_nodes(n));
  assert_non_null(f->v);
  ascr_visc_params p = ascr_visc_params_defaults();
  p.re = re;
  assert_int_equal(ascr_visc_solver_set(f->v, f->w, &p, &e), ASCR_OK);
}

static inline void teardown(fixture *f)
{
  ascr_visc_solver_free(f->v);
  ascr_panel_solver_free(f->w);
  ascr_geom_section_free(f->s);
  ascr_geom_section_free(f->raw);
}

#endif
