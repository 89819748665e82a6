/* fuzz/fuzz_powertrain.c
 * libFuzzer target: the powertrain-file reader (ascr_powertrain_parse) and, on a file it
 * accepts, the circuit at a few throttles and speeds (every number finite or flagged).
 */
#include <airscrew/airscrew.h>
#include <stddef.h>
#include <stdint.h>

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
  ascr_powertrain *pt = NULL;
  ascr_errbuf err;
  if (ascr_powertrain_parse((const char *)data, size, "fuzz.json", &pt, &err) == ASCR_OK) {
    for (int s = 0; s < 3; s++) {
      for (int i = 0; i <= 4; i++) {
        double d = 0.25 * i;
        double n = ascr_power_no_load_rpm(pt, (ascr_battery_state)s, d);
        ascr_power_state ps;
        (void)ascr_power_state_at(pt, (ascr_battery_state)s, d, 0.5 * n, &ps, &err);
        double need;
        (void)ascr_power_throttle_for(pt, (ascr_battery_state)s, 0.5 * n, ps.motor_torque_Nm, &need);
      }
    }
    ascr_powertrain_free(pt);
  }
  return 0;
}
