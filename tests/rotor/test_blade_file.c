/* tests/rotor/test_blade_file.c
 * Blade files (docs/file-formats.md): the example reads with the right units and sections;
 * each kind of bad file is refused with the file and field path in the message.
 */
#include "ascr_test.h"
#include "airscrew/ascr_rotor.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

static void test_example(void **state)
{
  (void)state;
  ascr_blade *b = NULL;
  ascr_errbuf err;
  ascr_status st = ascr_blade_read(ASCR_SOURCE_DIR "/docs/examples/inspection-3in.json", &b, &err);
  if (st != ASCR_OK) {
    fail_msg("%s", err.msg);
  }
  assert_int_equal(b->n_blades, 3);
  ascr_assert_close(b->r_tip_m, 0.0381, 1e-12, 0.0, "tip radius in m");
  ascr_assert_close(b->r_hub_m, 0.006, 1e-12, 0.0, "hub radius in m");
  assert_int_equal(b->n_stations, 8);
  ascr_assert_close(b->stations[2].chord_m, 0.009, 1e-12, 0.0, "chord in m");
  assert_int_equal(b->n_sections, 2);
  assert_string_equal(b->section_name[b->stations[0].section], "root");
  assert_string_equal(b->section_name[b->stations[7].section], "blade");
  assert_non_null(strstr(b->section_source[b->stations[7].section], "airfoils/microprop-plate-t25-f45.dat"));
  ascr_blade_free(b);
}

typedef struct bad_case {
  const char *text;
  ascr_status code;
  const char *fragment;
} bad_case;

#define HEAD "{\"format\":\"airscrew-blade-1\",\"blades\":2,\"length_unit\":\"tip_radius\",\"tip_radius\":0.1,"
#define SECS "\"sections\":{\"a\":\"naca4412\"},"

/* The tip radius in metres under its own name (issue 17): with length_unit "tip_radius" the
 * radius itself is in metres, given as tip_radius_m (or, as before, tip_radius); with a length
 * unit, tip_radius_m is in metres whatever the unit. Each file below is the same 0.1 m blade. */
static void test_tip_radius_in_metres(void **state)
{
  (void)state;
  static const char *const texts[] = {
      "{\"format\":\"airscrew-blade-1\",\"blades\":2,\"length_unit\":\"tip_radius\",\"tip_radius_m\":0.1,"
      "\"hub_radius\":0.2,\"sections\":{\"a\":\"naca4412\"},\"stations\":[{\"r\":0.2,\"chord\":0.15,\"twist_deg\":20},"
      "{\"r\":1,\"chord\":0.1,\"twist_deg\":10}]}",
      "{\"format\":\"airscrew-blade-1\",\"blades\":2,\"length_unit\":\"tip_radius\",\"tip_radius\":0.1,"
      "\"hub_radius\":0.2,\"sections\":{\"a\":\"naca4412\"},\"stations\":[{\"r\":0.2,\"chord\":0.15,\"twist_deg\":20},"
      "{\"r\":1,\"chord\":0.1,\"twist_deg\":10}]}",
      "{\"format\":\"airscrew-blade-1\",\"blades\":2,\"length_unit\":\"mm\",\"tip_radius_m\":0.1,"
      "\"hub_radius\":20,\"sections\":{\"a\":\"naca4412\"},\"stations\":[{\"r\":20,\"chord\":15,\"twist_deg\":20},"
      "{\"r\":100,\"chord\":10,\"twist_deg\":10}]}"};
  for (size_t i = 0; i < 3; i++) {
    ascr_blade *b = NULL;
    ascr_errbuf err;
    ascr_status st = ascr_blade_parse(texts[i], strlen(texts[i]), "tip.json", NULL, &b, &err);
    if (st != ASCR_OK) fail_msg("case %zu: %s", i, err.msg);
    ascr_assert_close(b->r_tip_m, 0.1, 1e-12, 0.0, "tip radius");
    ascr_assert_close(b->r_hub_m, 0.02, 1e-12, 0.0, "hub radius");
    ascr_assert_close(b->stations[0].chord_m, 0.015, 1e-12, 0.0, "root chord");
    assert_true(isnan(b->envelope_rpm[0])); /* no envelope given */
    ascr_blade_free(b);
  }
  /* an envelope for the section tables */
  static const char env[] =
      "{\"format\":\"airscrew-blade-1\",\"blades\":2,\"length_unit\":\"mm\",\"tip_radius\":100,"
      "\"hub_radius\":20,\"envelope\":{\"rpm_min\":5000,\"rpm_max\":20000,\"airspeed_max_m_s\":15},"
      "\"sections\":{\"a\":\"naca4412\"},\"stations\":[{\"r\":20,\"chord\":15,\"twist_deg\":20},"
      "{\"r\":100,\"chord\":10,\"twist_deg\":10}]}";
  ascr_blade *b = NULL;
  assert_int_equal(ascr_blade_parse(env, strlen(env), "env.json", NULL, &b, NULL), ASCR_OK);
  assert_true(b->envelope_rpm[0] == 5000.0 && b->envelope_rpm[1] == 20000.0);
  assert_true(b->envelope_airspeed_max_m_s == 15.0);
  ascr_blade_free(b);
}

static void test_bad_files(void **state)
{
  (void)state;
  static const bad_case cases[] = {
      {"{\"format\":\"airscrew-blade-1\",\n \"blades\": 2,,}", ASCR_EPARSE, "bad.json:2:"},
      {"[1,2]", ASCR_EPARSE, "top level"},
      {"{\"format\":\"other\"}", ASCR_EPARSE, "format"},
      {HEAD SECS "\"stations\":[{\"r\":0.2,\"chord\":0.1,\"twist_deg\":20},{\"r\":1,\"chord\":0.1}]}",
       ASCR_EPARSE, "stations[1].twist_deg: missing"},
      {HEAD SECS "\"stations\":[{\"r\":0.5,\"chord\":0.1,\"twist_deg\":20},{\"r\":0.3,\"chord\":0.1,\"twist_deg\":10}]}",
       ASCR_EGEOM, "stations[1].r"},
      {HEAD SECS "\"stations\":[{\"r\":0.2,\"chord\":-0.1,\"twist_deg\":20},{\"r\":1,\"chord\":0.1,\"twist_deg\":10}]}",
       ASCR_EGEOM, "stations[0].chord"},
      {HEAD SECS "\"stations\":[{\"r\":0.2,\"chord\":0.1,\"twist_deg\":20},{\"r\":1.2,\"chord\":0.1,\"twist_deg\":10}]}",
       ASCR_EGEOM, "outside hub .. tip"},
      {HEAD "\"sections\":{\"a\":\"naca4412\",\"b\":\"naca0012\"},\"stations\":[{\"r\":0.2,\"chord\":0.1,\"twist_deg\":20,\"section\":\"a\"},{\"r\":1,\"chord\":0.1,\"twist_deg\":10,\"section\":\"c\"}]}",
       ASCR_EPARSE, "unknown section 'c'"},
      {HEAD "\"sections\":{\"a\":\"no-such-file.dat\"},\"stations\":[]}", ASCR_EIO, "sections.a"},
      {HEAD SECS "\"stations\":[{\"r\":0.2,\"chord\":0.1,\"twist_deg\":20,\"twsit\":1},{\"r\":1,\"chord\":0.1,\"twist_deg\":10}]}",
       ASCR_EPARSE, "stations[0].twsit: unknown field"},
      {HEAD SECS "\"stations\":[{\"r\":\"0.2\",\"chord\":0.1,\"twist_deg\":20},{\"r\":1,\"chord\":0.1,\"twist_deg\":10}]}",
       ASCR_EPARSE, "stations[0].r: must be a number"},
      {"{\"format\":\"airscrew-blade-1\",\"blades\":0}", ASCR_EINVAL, "blades"},
      {"{\"format\":\"airscrew-blade-1\",\"blades\":2,\"length_unit\":\"ft\"}", ASCR_EPARSE, "length_unit"},
      {"{\"format\":\"airscrew-blade-1\",\"blades\":2,\"format\":\"airscrew-blade-1\"}", ASCR_EPARSE, "bad.json"},
      {HEAD SECS "\"stations\":[{\"r\":0.2,\"chord\":0.1,\"twist_deg\":20}]}", ASCR_EPARSE, "at least 2"},
      {HEAD "\"tip_radius_m\":0.1," SECS "\"stations\":[]}", ASCR_EPARSE, "not both"},
      {HEAD "\"envelope\":{\"rpm_min\":9000,\"rpm_max\":5000}," SECS "\"stations\":[]}", ASCR_EINVAL,
       "envelope: rpm_min 9000"},
      {HEAD "\"envelope\":{\"rpm_min\":5000}," SECS "\"stations\":[]}", ASCR_EPARSE,
       "envelope.rpm_max: missing"},
      {HEAD "\"envelope\":{\"rpm_min\":5000,\"rpm_max\":9000,\"speed\":3}," SECS "\"stations\":[]}",
       ASCR_EPARSE, "envelope.speed: unknown field"},
  };
  for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++) {
    ascr_blade *b = NULL;
    ascr_errbuf err;
    err.msg[0] = '\0';
    ascr_status st = ascr_blade_parse(cases[i].text, strlen(cases[i].text), "bad.json", NULL, &b, &err);
    if (st != cases[i].code || strstr(err.msg, cases[i].fragment) == NULL ||
        strstr(err.msg, "bad.json") == NULL) {
      fail_msg("case %zu: status %d (want %d), message '%s' (want '%s')", i, (int)st,
               (int)cases[i].code, err.msg, cases[i].fragment);
    }
    assert_null(b);
  }
  /* binary data */
  const char bin[] = {'{', 0, 1, 2, '}'};
  ascr_blade *b = NULL;
  assert_int_equal(ascr_blade_parse(bin, sizeof bin, "bad.json", NULL, &b, NULL), ASCR_EPARSE);
  assert_int_equal(ascr_blade_read("/nonexistent/blade.json", &b, NULL), ASCR_EIO);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_example),
      cmocka_unit_test(test_tip_radius_in_metres),
      cmocka_unit_test(test_bad_files),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
