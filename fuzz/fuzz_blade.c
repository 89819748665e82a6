/* fuzz/fuzz_blade.c
 * libFuzzer target: the blade-file reader (ascr_blade_parse) and blade validation. Section file
 * paths in the input are resolved against a folder that does not exist, so no file is read.
 */
#include <airscrew/airscrew.h>
#include <stddef.h>
#include <stdint.h>

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
  ascr_blade *b = NULL;
  ascr_errbuf err;
  if (ascr_blade_parse((const char *)data, size, "fuzz.json", "/nonexistent-airscrew-fuzz", &b,
                       &err) == ASCR_OK) {
    (void)ascr_blade_validate(b, &err);
    ascr_blade_free(b);
  }
  return 0;
}
