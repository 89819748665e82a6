/* src/cli/cmd_cache.c
 * "airscrew cache": where the computed section polars are kept, and clearing them.
 */
#define _POSIX_C_SOURCE 200809L
#include "cli.h"
#include "cli_tables.h"
#include "commands.h"

#include <ctype.h>
#include <dirent.h>
#include <errno.h>
#include <stdio.h>
#include <string.h>
#include <sys/stat.h>

static void cache_help(FILE *fp)
{
  fputs("usage: airscrew cache show|clear [--cache-dir DIR]\n"
        "\n"
        "  show    print the cache folder and the number of stored polar curves\n"
        "  clear   delete the stored polar curves (they are recomputed when next needed)\n"
        "\n"
        "The folder is DIR, else $AIRSCREW_CACHE_DIR, $XDG_CACHE_HOME/airscrew or\n"
        "~/.cache/airscrew. Only airscrew's own entries (16 hex digits + .json) are touched.\n",
        fp);
}

static int is_entry(const char *name)
{
  size_t n = strlen(name);
  if (n != 21 || strcmp(name + 16, ".json") != 0) return 0;
  for (size_t i = 0; i < 16; i++) {
    if (!isxdigit((unsigned char)name[i]) || isupper((unsigned char)name[i])) return 0;
  }
  return 1;
}

/* A temporary left by a run that was killed while storing an entry: ".airscrew-tmp-" or
 * ".airscrew-probe-" and six characters (cli_common.c, cli_tables.c), or an entry name with
 * ".tmp-" and six characters (the form before 2026-12-02). */
static int is_leftover(const char *name)
{
  size_t n = strlen(name);
  if ((strncmp(name, ".airscrew-tmp-", 14) == 0 && n == 20) ||
      (strncmp(name, ".airscrew-probe-", 16) == 0 && n == 22)) {
    return 1;
  }
  if (n == 32 && strncmp(name + 16, ".json.tmp-", 10) == 0) {
    char entry[22];
    memcpy(entry, name, 21);
    entry[21] = '\0';
    return is_entry(entry);
  }
  return 0;
}

int cmd_cache(int argc, char **argv)
{
  const char *dir = NULL, *action = NULL;
  for (int i = 1; i < argc; i++) {
    if (strcmp(argv[i], "--help") == 0 || strcmp(argv[i], "-h") == 0) {
      cache_help(stdout);
      return CLI_EXIT_OK;
    } else if (strcmp(argv[i], "--cache-dir") == 0) {
      if (i + 1 >= argc) {
        cli_error("cache: --cache-dir needs a value");
        return CLI_EXIT_USAGE;
      }
      dir = argv[++i];
    } else if (action == NULL && (strcmp(argv[i], "show") == 0 || strcmp(argv[i], "clear") == 0)) {
      action = argv[i];
    } else {
      cli_error("cache: unexpected '%s' (see airscrew cache --help)", argv[i]);
      return CLI_EXIT_USAGE;
    }
  }
  if (action == NULL) {
    cli_error("cache: give show or clear (see airscrew cache --help)");
    return CLI_EXIT_USAGE;
  }
  if (dir == NULL) dir = cli_default_cache_dir();
  if (dir == NULL) {
    cli_error("cache: no cache folder (set AIRSCREW_CACHE_DIR or HOME)");
    return CLI_EXIT_USAGE;
  }
  if (cli_check_options_only) return CLI_EXIT_OK;
  DIR *d = opendir(dir);
  if (d == NULL) {
    if (errno == ENOENT) {
      printf("cache folder %s (not created yet): 0 curves\n", dir);
      return CLI_EXIT_OK;
    }
    cli_error("cache: %s: %s", dir, strerror(errno));
    return CLI_EXIT_OUTPUT;
  }
  size_t n = 0, removed = 0;
  int rc = CLI_EXIT_OK;
  struct dirent *e;
  size_t left = 0;
  while ((e = readdir(d)) != NULL) {
    if (strcmp(action, "clear") == 0 && is_leftover(e->d_name)) {
      char path[4400];
      snprintf(path, sizeof path, "%s/%s", dir, e->d_name);
      struct stat sb;
      if (lstat(path, &sb) == 0 && S_ISREG(sb.st_mode) && remove(path) == 0) left++;
      continue;
    }
    if (!is_entry(e->d_name)) continue;
    n++;
    if (strcmp(action, "clear") == 0) {
      char path[4400];
      snprintf(path, sizeof path, "%s/%s", dir, e->d_name);
      if (remove(path) == 0) {
        removed++;
      } else {
        cli_error("cache: cannot remove %s: %s", path, strerror(errno));
        rc = CLI_EXIT_OUTPUT;
      }
    }
  }
  closedir(d);
  if (strcmp(action, "clear") == 0) {
    printf("cache folder %s: %zu curves removed", dir, removed);
    if (left > 0) printf(", and %zu temporary files of interrupted runs", left);
    printf("\n");
  } else {
    printf("cache folder %s: %zu curves\n", dir, n);
  }
  return rc;
}
