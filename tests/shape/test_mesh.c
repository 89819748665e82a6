/* tests/shape/test_mesh.c
 * The printable shape (src/shape/): the checks on a two-section blade — every edge
 * shared by exactly two triangles in opposite directions (watertight, consistently oriented), no
 * degenerate triangle, the enclosed volume (divergence theorem) within 0.5 % of the integrated
 * section area, mass = volume x density as the structure report has it — for one blade and the
 * whole propeller, either sense of rotation, an open and a sharp trailing edge; and the STL bytes.
 */
#include "ascr_test.h"
#include "airscrew/ascr_shape.h"
#include "airscrew/ascr_structure.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

typedef struct fixture {
  ascr_blade b;
  ascr_blade_station st[4];
  ascr_geom_section *sec[2];
} fixture;

/* a 3-inch blade: NACA 4412 (open trailing edge) inboard blending into a sharp-edged 3 % plate */
static void setup_blade(fixture *f, int rotation)
{
  memset(f, 0, sizeof *f);
  ascr_errbuf err;
  assert_int_equal(ascr_geom_section_from_spec("naca4412", &f->sec[0], &err), ASCR_OK);
  assert_int_equal(ascr_geom_section_from_spec("plate:t=3,f=4,xf=40,te=0", &f->sec[1], &err), ASCR_OK);
  f->b.n_blades = 3;
  f->b.r_tip_m = 0.0381;
  f->b.r_hub_m = 0.006;
  f->b.rotation = rotation;
  f->b.n_stations = 4;
  f->b.stations = f->st;
  f->b.n_sections = 2;
  f->b.envelope_rpm[0] = f->b.envelope_rpm[1] = NAN;
  f->st[0] = (ascr_blade_station){0.007, 0.008, 30.0, 0};
  f->st[1] = (ascr_blade_station){0.015, 0.010, 20.0, 0};
  f->st[2] = (ascr_blade_station){0.028, 0.008, 13.0, 1};
  f->st[3] = (ascr_blade_station){0.0381, 0.004, 10.0, 1};
}

static void teardown_blade(fixture *f)
{
  ascr_geom_section_free(f->sec[0]);
  ascr_geom_section_free(f->sec[1]);
}

static void test_one_blade_closed_and_true_to_volume(void **state)
{
  (void)state;
  for (int rot = -1; rot <= 1; rot += 2) {
    fixture f;
    setup_blade(&f, rot);
    ascr_shape_params p = ascr_shape_params_defaults();
    p.blade_only = 1;
    ascr_mesh m;
    ascr_errbuf err;
    assert_int_equal(ascr_blade_mesh(&f.b, (const ascr_geom_section *const *)f.sec, &p, &m, &err), ASCR_OK);
    assert_int_equal(ascr_mesh_defects(&m), 0);
    assert_int_equal(m.n_shells, 1);
    double vol = ascr_mesh_volume(&m);
    /* the structure's volume: the sections' own contours integrated over the span */
    static ascr_structure_station ss[ASCR_STRUCTURE_MAX_STATIONS];
    ascr_structure_summary sum;
    ascr_material mat;
    memset(&mat, 0, sizeof mat);
    mat.density_kg_m3.value = 1150.0;
    mat.elastic_modulus_pa.value = 1.7e9;
    mat.shear_modulus_pa.value = 0.63e9;
    mat.tensile_strength_pa.value = 48e6;
    mat.fatigue_limit_pa.value = NAN;
    assert_int_equal(ascr_blade_structure(&f.b, (const ascr_geom_section *const *)f.sec, &mat, 0.0,
                                          NULL, 0, 401, ss, &sum, &err), ASCR_OK);
    print_message("rotation %+d: %zu triangles, volume %.4f mm3, integrated area %.4f mm3 (%+.3f %%)\n",
                  rot, m.n_triangles, 1e9 * vol, 1e9 * sum.volume_m3, 100.0 * (vol / sum.volume_m3 - 1.0));
    ascr_assert_close(vol, sum.volume_m3, 5e-3, 0.0, "mesh volume against the integrated area");
    ascr_assert_close(1150.0 * vol, sum.mass_kg, 5e-3, 0.0, "mass = volume x density");
    /* the leading edge moves ahead in the sense of rotation: at the mid span the LE vertex
     * (ring position K-1) has y of the rotation's sign */
    size_t R = 2 * p.n_chord - 1, K = p.n_chord;
    const double *le = m.v + 3 * (30 * R + K - 1);
    assert_true(le[1] * rot > 0.0);
    ascr_mesh_free(&m);
    teardown_blade(&f);
  }
}

static void test_propeller_and_stl(void **state)
{
  (void)state;
  fixture f;
  setup_blade(&f, 1);
  ascr_shape_params p = ascr_shape_params_defaults();
  ascr_mesh m, one;
  ascr_errbuf err;
  assert_int_equal(ascr_blade_mesh(&f.b, (const ascr_geom_section *const *)f.sec, &p, &m, &err), ASCR_OK);
  assert_int_equal(ascr_mesh_defects(&m), 0);
  assert_int_equal(m.n_shells, 4); /* three blades and the hub */
  p.blade_only = 1;
  assert_int_equal(ascr_blade_mesh(&f.b, (const ascr_geom_section *const *)f.sec, &p, &one, &err), ASCR_OK);
  assert_true(ascr_mesh_volume(&m) > 3.0 * ascr_mesh_volume(&one));
  unsigned char *buf = NULL;
  size_t len = 0;
  assert_int_equal(ascr_mesh_stl(&m, "solid test", &buf, &len, &err), ASCR_OK);
  assert_int_equal(len, 84 + 50 * m.n_triangles);
  assert_true(memcmp(buf, "solid", 5) != 0); /* binary STL must not start with "solid" */
  uint32_t nt = (uint32_t)buf[80] | (uint32_t)buf[81] << 8 | (uint32_t)buf[82] << 16 | (uint32_t)buf[83] << 24;
  assert_int_equal(nt, m.n_triangles);
  float x;
  memcpy(&x, buf + 84 + 12, 4); /* first vertex x, little-endian on this machine */
  ascr_assert_close(x, 1000.0 * m.v[3 * m.t[0]], 1e-6, 0.0, "STL in millimetres");
  free(buf);
  ascr_mesh_free(&m);
  ascr_mesh_free(&one);
  teardown_blade(&f);
  /* a broken mesh is seen: one triangle removed leaves three open edges */
  setup_blade(&f, 1);
  assert_int_equal(ascr_blade_mesh(&f.b, (const ascr_geom_section *const *)f.sec, &p, &one, &err), ASCR_OK);
  one.n_triangles--;
  assert_int_equal(ascr_mesh_defects(&one), 3);
  ascr_mesh_free(&one);
  teardown_blade(&f);
}

/* The blended root: between the root station (7 mm) and the hub surface (6 mm) the root section
 * thickens about its mean line as 1 + (k - 1)(3 s^2 - 2 s^3), s the distance from the root
 * station over the gap: the upper-to-lower distance at each chord fraction (turned by the twist,
 * which keeps distances) is k times the root station's at the hub surface, (1 + k)/2 times it
 * half way, and the mesh stays closed; k = 1 leaves the root section as it is. Exact (1e-9). */
static void test_blended_root(void **state)
{
  (void)state;
  for (int pass = 0; pass < 2; pass++) {
    fixture f;
    setup_blade(&f, 1);
    ascr_shape_params p = ascr_shape_params_defaults();
    double k = pass == 0 ? 2.5 : 1.0;
    p.root_thickening = k;
    ascr_mesh m;
    ascr_errbuf err;
    assert_int_equal(ascr_blade_mesh(&f.b, (const ascr_geom_section *const *)f.sec, &p, &m, &err), ASCR_OK);
    assert_int_equal(ascr_mesh_defects(&m), 0);
    size_t K = p.n_chord, R = 2 * K - 1; /* open trailing edge at the root (NACA 4412) */
    /* rings of the first blade: 0 inside the hub, 1 .. 8 from the hub surface, 9 the root station */
    ascr_assert_close(m.v[3 * (1 * R)], 0.006, 1e-12, 0.0, "ring 1 at the hub surface");
    ascr_assert_close(m.v[3 * (5 * R)], 0.0065, 1e-12, 0.0, "ring 5 half way");
    ascr_assert_close(m.v[3 * (9 * R)], 0.007, 1e-12, 0.0, "ring 9 at the root station");
    for (size_t q = 1; q + 1 < K; q++) {
      /* ring position K-1-q: upper surface point q; K-1+q: lower */
      double d[3];
      const size_t rings[3] = {1, 5, 9};
      for (int i = 0; i < 3; i++) {
        const double *u = m.v + 3 * (rings[i] * R + K - 1 - q), *l = m.v + 3 * (rings[i] * R + K - 1 + q);
        d[i] = hypot(u[1] - l[1], u[2] - l[2]);
      }
      ascr_assert_close(d[0], k * d[2], 1e-9, 0.0, "thickness at the hub surface");
      ascr_assert_close(d[1], 0.5 * (1.0 + k) * d[2], 1e-9, 0.0, "thickness half way");
    }
    ascr_mesh_free(&m);
    teardown_blade(&f);
  }
}

int main(void)
{
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_one_blade_closed_and_true_to_volume),
      cmocka_unit_test(test_propeller_and_stl),
      cmocka_unit_test(test_blended_root),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
