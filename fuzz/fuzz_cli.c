/* fuzz/fuzz_cli.c
 * libFuzzer target: the command line. The input is one argument per line (the program name is
 * added); it goes through the same dispatcher and option checks as the program, which stop before
 * reading a file, creating a folder or computing (cli_check_options_only).
 */
#include "cli.h"

#include <stddef.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

enum { FUZZ_MAX_ARGS = 64 };

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
  if (size > 4096) return 0;
  char *buf = malloc(size + 1);
  if (buf == NULL) return 0;
  memcpy(buf, data, size);
  buf[size] = '\0';
  char *argv[FUZZ_MAX_ARGS + 2];
  int argc = 0;
  argv[argc++] = "airscrew";
  char *p = buf;
  while (argc <= FUZZ_MAX_ARGS) {
    argv[argc++] = p;
    char *nl = memchr(p, '\n', (size_t)(buf + size - p));
    if (nl == NULL) break;
    *nl = '\0';
    p = nl + 1;
  }
  argv[argc] = NULL;
  cli_check_options_only = 1;
  (void)cli_main(argc, argv);
  free(buf);
  return 0;
}
