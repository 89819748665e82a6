/* fuzz/fuzz_section.c
 * libFuzzer target: the coordinate-file reader (ascr_geom_section_parse) and, when a section is
 * accepted, its repanelling and metrics. Any crash, hang, leak or sanitizer report is a bug.
 */
#include <airscrew/airscrew.h>
#include <stddef.h>
#include <stdint.h>

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
  ascr_geom_section *s = NULL;
  ascr_errbuf err;
  if (ascr_geom_section_parse((const char *)data, size, "fuzz.dat", &s, NULL, &err) == ASCR_OK) {
    ascr_geom_section *r = NULL;
    ascr_geom_repanel_params p = ascr_geom_repanel_defaults();
    p.n_panels = 60;
    if (ascr_geom_section_repanel(s, &p, &r, &err) == ASCR_OK) {
      ascr_geom_metrics m;
      (void)ascr_geom_section_metrics(r, &m, &err);
      ascr_geom_section_free(r);
    }
    ascr_geom_section_free(s);
  }
  return 0;
}
