/* src/cli/main.c
 * The airscrew program: dispatch to subcommands, global --help and --version.
 */
#include "cli.h"
#include "commands.h"

#include <gsl/gsl_errno.h>
#include <string.h>

static void main_help(FILE *fp)
{
  fputs("usage: airscrew COMMAND [options]\n"
        "\n"
        "Section and propeller aerodynamics for small propellers, from the section shape.\n"
        "\n"
        "commands:\n"
        "  section   read or generate a section, repanel it, report its shape, write coordinates\n"
        "  flow      analyse one section at one angle of attack (viscous with --re, or --inviscid)\n"
        "  polar     viscous polars over angle of attack for several Reynolds numbers\n"
        "  rotor     propeller thrust, torque, power and efficiency from a blade file\n"
        "  drive     the propeller on its motor, controller and battery: rpm, current and\n"
        "            thrust against throttle, the throttle for a thrust\n"
        "  design    the minimum-induced-loss blade for a design point, or a multi-point\n"
        "            design under limits, as a blade file\n"
        "  structure a blade's mass, stresses and rotating modes (Campbell diagram)\n"
        "  export    the printable shape of a blade file as STL\n"
        "  cache     show or clear the cache of computed section polars\n"
        "  plot      draw the figures of a saved polar or rotor result (JSON or CSV), or\n"
        "            compare several side by side\n"
        "  demo      built-in demonstration on sample sections\n"
        "\n"
        "  airscrew COMMAND --help    options of a command\n"
        "  airscrew --version         program and library version\n"
        "\n"
        "Results are estimates from published methods. A spinning propeller can cut and a blade\n"
        "can fail at speed: test on a guarded thrust stand and follow local rules.\n",
        fp);
}

/* OpenBLAS (Debian's libopenblas) */
void openblas_set_num_threads(int num_threads);

int cli_check_options_only = 0;

int cli_main(int argc, char **argv)
{
  if (argc < 2) {
    main_help(stderr);
    return CLI_EXIT_USAGE;
  }
  const char *cmd = argv[1];
  if (strcmp(cmd, "--help") == 0 || strcmp(cmd, "-h") == 0 || strcmp(cmd, "help") == 0) {
    main_help(stdout);
    return CLI_EXIT_OK;
  }
  if (strcmp(cmd, "--version") == 0) {
    printf("airscrew %s\n", ascr_version());
    return CLI_EXIT_OK;
  }
  for (int i = 2; i < argc; i++) {
    if (strcmp(argv[i], "--version") == 0) {
      printf("airscrew %s\n", ascr_version());
      return CLI_EXIT_OK;
    }
    if (strcmp(argv[i], "--") == 0) break;
  }
  if (strcmp(cmd, "section") == 0) return cmd_section(argc - 1, argv + 1);
  if (strcmp(cmd, "flow") == 0) return cmd_flow(argc - 1, argv + 1);
  if (strcmp(cmd, "demo") == 0) return cmd_demo(argc - 1, argv + 1);
  if (strcmp(cmd, "polar") == 0) return cmd_polar(argc - 1, argv + 1);
  if (strcmp(cmd, "rotor") == 0) return cmd_rotor(argc - 1, argv + 1);
  if (strcmp(cmd, "drive") == 0) return cmd_drive(argc - 1, argv + 1);
  if (strcmp(cmd, "design") == 0) return cmd_design(argc - 1, argv + 1);
  if (strcmp(cmd, "structure") == 0) return cmd_structure(argc - 1, argv + 1);
  if (strcmp(cmd, "export") == 0) return cmd_export(argc - 1, argv + 1);
  if (strcmp(cmd, "cache") == 0) return cmd_cache(argc - 1, argv + 1);
  if (strcmp(cmd, "plot") == 0) return cmd_plot(argc - 1, argv + 1);
  if (cmd[0] == '-') {
    cli_error("unknown option '%s' (see airscrew --help)", cmd);
  } else {
    cli_error("unknown command '%s' (commands: section, flow, polar, rotor, drive, design, structure, export, cache, plot, demo; see airscrew --help)", cmd);
  }
  return CLI_EXIT_USAGE;
}

#ifndef CLI_NO_MAIN
int main(int argc, char **argv)
{
  gsl_set_error_handler_off();
  cli_signals_install();
  /* the dense systems here are a few hundred unknowns: one thread is faster than several */
  openblas_set_num_threads(1);
  return cli_main(argc, argv);
}
#endif
