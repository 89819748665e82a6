/* fuzz/fuzz_design.c
 * libFuzzer target: the design-specification reader (ascr_design_spec_parse). Section file
 * paths are resolved against a folder that does not exist, so no file is read.
 */
#include <airscrew/airscrew.h>
#include <stddef.h>
#include <stdint.h>

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
  ascr_design_spec *s = NULL;
  ascr_errbuf err;
  if (ascr_design_spec_parse((const char *)data, size, "fuzz.json", "/nonexistent-airscrew-fuzz", &s,
                             &err) == ASCR_OK) {
    ascr_design_spec_free(s);
  }
  return 0;
}
