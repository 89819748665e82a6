/* tests/structure/test_material.c
 * Material files (src/structure/material_json.c): the examples read, values with their sources,
 * derived shear modulus, and clear refusals naming the field.
 */
#include "ascr_test.h"
#include "airscrew/ascr_structure.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

static void test_examples_read(void **state)
{
  (void)state;
  const char *files[4] = {"sla-resin-general.json", "sla-resin-tough.json", "polycarbonate.json",
                          "nylon-glass-filled.json"};
  for (int i = 0; i < 4; i++) {
    char path[512];
    snprintf(path, sizeof path, "%s/docs/examples/materials/%s", ASCR_SOURCE_DIR, files[i]);
    ascr_material m;
    ascr_errbuf err;
    assert_int_equal(ascr_material_read(path, &m, &err), ASCR_OK);
    assert_true(m.density_kg_m3.value > 900.0 && m.elastic_modulus_pa.value > 1e9);
    assert_true(strlen(m.elastic_modulus_pa.source) > 0);
    /* isotropic shear modulus where the file gives none: G = E / (2 (1 + nu)) */
    ascr_assert_close(m.shear_modulus_pa.value,
                      m.elastic_modulus_pa.value / (2.0 * (1.0 + m.poisson_ratio.value)), 1e-15, 0.0,
                      "G from E and nu");
  }
}

static void test_refusals(void **state)
{
  (void)state;
  struct { const char *text, *msg; ascr_status st; } cases[] = {
    {"{\"format\": \"airscrew-material-1\", \"name\": \"x\", \"density_kg_m3\": {\"value\": 1200, "
     "\"source\": \"s\"}, \"elastic_modulus_Pa\": {\"value\": 2e9}, \"tensile_strength_Pa\": "
     "{\"value\": 6e7, \"source\": \"s\"}}", "elastic_modulus_Pa.source: required", ASCR_EPARSE},
    {"{\"format\": \"airscrew-material-1\", \"name\": \"x\", \"density_kg_m3\": {\"value\": 1200, "
     "\"source\": \"s\"}, \"elastic_modulus_Pa\": {\"value\": 2e9, \"source\": \"s\"}}",
     "tensile_strength_Pa: missing", ASCR_EPARSE},
    {"{\"format\": \"airscrew-material-1\", \"name\": \"x\", \"density_kg_m3\": {\"value\": 12, "
     "\"source\": \"s\"}, \"elastic_modulus_Pa\": {\"value\": 2e9, \"source\": \"s\"}, "
     "\"tensile_strength_Pa\": {\"value\": 6e7, \"source\": \"s\"}}", "density_kg_m3.value: 12 must be",
     ASCR_EINVAL},
    {"{\"format\": \"airscrew-material-1\", \"name\": \"x\", \"colour\": 1}", "colour: unknown field",
     ASCR_EPARSE},
    {"{\"format\": \"airscrew-material-1\", \"name\": \"x\", \"density_kg_m3\": {\"value\": 1200, "
     "\"source\": \"s\"}, \"elastic_modulus_Pa\": {\"value\": 2e9, \"source\": \"s\"}, "
     "\"tensile_strength_Pa\": {\"value\": 6e7, \"source\": \"s\"}, \"fatigue_limit_Pa\": "
     "{\"value\": 9e7, \"source\": \"s\"}}", "above the tensile strength", ASCR_EINVAL},
  };
  for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++) {
    ascr_material m;
    ascr_errbuf err;
    assert_int_equal(ascr_material_parse(cases[i].text, strlen(cases[i].text), "m.json", &m, &err),
                     cases[i].st);
    if (strstr(err.msg, cases[i].msg) == NULL) fail_msg("message '%s' lacks '%s'", err.msg, cases[i].msg);
    assert_non_null(strstr(err.msg, "m.json"));
  }
}

int main(void)
{
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_examples_read),
      cmocka_unit_test(test_refusals),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
