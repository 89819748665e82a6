/* tests/structure/test_material.c
 * Material files (src/structure/material_json.c): the examples read, values with their sources,
 * derived shear modulus, and clear refusals naming the field.
 */
#include "ascr_test.h"
#include "airscrew/ascr_structure.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* example material file i of the four in docs/examples/materials/ */
static void read_example(int i, ascr_material *m)
{
  static const char *const files[4] = {"sla-resin-general.json", "sla-resin-tough.json",
                                       "polycarbonate.json", "nylon-glass-filled.json"};
  char path[512];
  snprintf(path, sizeof path, "%s/docs/examples/materials/%s", ASCR_SOURCE_DIR, files[i]);
  ascr_errbuf err;
  assert_int_equal(ascr_material_read(path, m, &err), ASCR_OK);
}

static void test_examples_read(void **state)
{
  (void)state;
  for (int i = 0; i < 4; i++) {
    ascr_material m;
    read_example(i, &m);
    assert_true(m.density_kg_m3.value > 900.0 && m.elastic_modulus_pa.value > 1e9);
    assert_true(strlen(m.elastic_modulus_pa.source) > 0);
    /* isotropic shear modulus where the file gives none: G = E / (2 (1 + nu)) */
    ascr_assert_close(m.shear_modulus_pa.value,
                      m.elastic_modulus_pa.value / (2.0 * (1.0 + m.poisson_ratio.value)), 1e-15, 0.0,
                      "G from E and nu");
  }
}

/* Every example value whose source names a class of reference/printed_blade_materials_typical.csv
 * (typical values by material class from datasheets and compilations; the file's header gives the
 * provenance of each row) is that row's value: the modulus in GPa, the tensile strength in MPa and
 * the density in kg/m^3 (of a range, the lower end). Exact: a transcription. */
static double reference_value(const char *cls, int column)
{
  char path[512], line[512];
  snprintf(path, sizeof path, "%s/printed_blade_materials_typical.csv", ASCR_REFERENCE_DIR);
  FILE *fp = fopen(path, "r");
  assert_non_null(fp);
  double v = NAN;
  while (fgets(line, sizeof line, fp)) {
    if (line[0] == '#') continue;
    char *field[8] = {0};
    int n = 0;
    for (char *p = line, *tok; n < 8 && (tok = strsep(&p, ",")) != NULL;) field[n++] = tok;
    if (n > column && strcmp(field[0], cls) == 0) v = strtod(field[column], NULL);
  }
  fclose(fp);
  return v;
}

static int check_cited(const ascr_material_value *mv, int column, double scale)
{
  const char *q = strstr(mv->source, "class '");
  if (q == NULL || strstr(mv->source, "printed_blade_materials_typical.csv") == NULL) return 0;
  char cls[128];
  const char *e = strchr(q + 7, '\'');
  assert_non_null(e);
  snprintf(cls, sizeof cls, "%.*s", (int)(e - q - 7), q + 7);
  double v = reference_value(cls, column);
  if (isnan(v)) fail_msg("class '%s' has no value in column %d of the reference", cls, column);
  ascr_assert_close(mv->value, v * scale, 1e-12, 0.0, cls);
  return 1;
}

static void test_examples_cite_the_reference(void **state)
{
  (void)state;
  int cited = 0;
  for (int i = 0; i < 4; i++) {
    ascr_material m;
    read_example(i, &m);
    cited += check_cited(&m.elastic_modulus_pa, 2, 1e9);
    cited += check_cited(&m.tensile_strength_pa, 3, 1e6);
    cited += check_cited(&m.density_kg_m3, 5, 1.0);
  }
  assert_int_equal(cited, 9); /* the values the examples take from the reference */
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
      cmocka_unit_test(test_examples_cite_the_reference),
      cmocka_unit_test(test_refusals),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
