/* fuzz/fuzz_material.c
 * libFuzzer target: the material-file reader (ascr_material_parse); on a file it accepts, every
 * value it reports is finite where required and inside its range.
 */
#include <airscrew/airscrew.h>
#include <math.h>
#include <stddef.h>
#include <stdint.h>
#include <stdlib.h>

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
  ascr_material m;
  ascr_errbuf err;
  if (ascr_material_parse((const char *)data, size, "fuzz.json", &m, &err) == ASCR_OK) {
    if (!(m.density_kg_m3.value > 0.0) || !(m.elastic_modulus_pa.value > 0.0) ||
        !(m.shear_modulus_pa.value > 0.0) || !(m.tensile_strength_pa.value > 0.0) ||
        !isfinite(m.poisson_ratio.value)) {
      abort();
    }
  }
  return 0;
}
