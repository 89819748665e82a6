/* src/cli/cli_rotor_opts.h
 * Options shared by the commands that run a blade (rotor, drive): air, inflow model, section
 * tables and cache. One parser, so that both commands take the same words the same way.
 */
#ifndef ASCR_CLI_ROTOR_OPTS_H
#define ASCR_CLI_ROTOR_OPTS_H

#include "cli.h"
#include "cli_tables.h"

/* getopt_long entries of the shared options (codes A D V S K Y i N T W U L a p P c X e, and
 * CLI_OPT_STALL_DELAY) */
#define CLI_OPT_STALL_DELAY 257
#define CLI_ROTOR_LONGOPTS                                                                      \
  {"inflow", required_argument, NULL, 'i'}, {"altitude", required_argument, NULL, 'A'},         \
      {"density", required_argument, NULL, 'D'}, {"viscosity", required_argument, NULL, 'V'},   \
      {"sound-speed", required_argument, NULL, 'S'},                                            \
      {"temperature", required_argument, NULL, 'K'},                                            \
      {"pressure", required_argument, NULL, 'Y'}, {"ncrit", required_argument, NULL, 'N'},      \
      {"turbulence", required_argument, NULL, 'T'},                                             \
      {"transition", required_argument, NULL, 'W'},                                             \
      {"trip-upper", required_argument, NULL, 'U'},                                             \
      {"trip-lower", required_argument, NULL, 'L'},                                             \
      {"table-alpha", required_argument, NULL, 'a'}, {"panels", required_argument, NULL, 'p'},  \
      {"polar-table", required_argument, NULL, 'P'}, {"cache-dir", required_argument, NULL, 'c'}, \
      {"no-cache", no_argument, NULL, 'X'}, {"elements", required_argument, NULL, 'e'},     \
      {"stall-delay", required_argument, NULL, CLI_OPT_STALL_DELAY}

/* The help lines of the shared options. */
#define CLI_ROTOR_OPTS_HELP                                                                     \
  "  -i, --inflow MODEL      bemt (default) or vortex\n"                                     \
  "air (default ISA sea level):\n"                                                          \
  "      --altitude M        ISA 1976 troposphere at M metres\n"                              \
  "      --density RHO       kg/m3        --viscosity MU   Pa s\n"                           \
  "      --sound-speed A     m/s\n"                                                           \
  "      --temperature C     air temperature, deg C (default 15), and/or\n"                   \
  "      --pressure P        static pressure, Pa (default 101325): density, viscosity and\n"  \
  "                          speed of sound from them\n"                                      \
  "section tables:\n"                                                                       \
  "      --ncrit N, --turbulence PCT, --transition NAME, --trip-upper X, --trip-lower X\n"    \
  "                          as for polar (NAME: quiet-air, tunnel, sanded, rotor-inflow,\n"  \
  "                          printed-rough)\n"                                                \
  "      --table-alpha A:B:S angles of the computed curves (default -8:16:1)\n"               \
  "  -p, --panels N          panels on each section (default 160)\n"                         \
  "      --polar-table NAME=FILE  use a polar-table file for section NAME\n"                  \
  "      --cache-dir DIR     cache folder (default $AIRSCREW_CACHE_DIR, $XDG_CACHE_HOME/airscrew\n" \
  "                          or ~/.cache/airscrew)\n"                                         \
  "      --no-cache          neither read nor write the cache\n"                              \
  "model:\n"                                                                                \
  "  -e, --elements N        blade elements (default 40)\n"                                  \
  "      --stall-delay MODEL none (default) or snel: the inner sections' lift raised towards\n" \
  "                          the attached-flow line by 3 (c/r)^2 of the gap (Snel et al.\n"  \
  "                          1994; rotational stall delay, an estimate)\n"

typedef struct cli_rotor_opts {
  double altitude, density, viscosity, sound, temp_c, press; /* NaN: not given */
  const char *inflow;                                        /* "bemt" or "vortex" */
  const char *cache_dir;
  int no_cache;
  cli_table_opts to;
  ascr_rotor_params rp;
} cli_rotor_opts;

void cli_rotor_opts_init(cli_rotor_opts *o);

/* One option of getopt code `code` (arg may be modified): 0 taken, 1 usage error (printed),
 * -1 not a shared option. */
int cli_rotor_opts_parse(cli_rotor_opts *o, int code, char *arg);

/* After parsing: check combinations, set the air of o->rp and the cache folder of o->to.
 * cmd names the command in messages. 0 or an exit code (message printed). */
int cli_rotor_opts_finish(cli_rotor_opts *o, const char *cmd);

/* The inflow model chosen. */
ascr_inflow cli_rotor_opts_model(const cli_rotor_opts *o);

#endif
