/* src/cli/commands.h
 * Subcommands of the airscrew program. Each takes the arguments after the subcommand name
 * (argv[0] is the subcommand) and returns an exit code (cli.h).
 */
#ifndef ASCR_CLI_COMMANDS_H
#define ASCR_CLI_COMMANDS_H

int cmd_section(int argc, char **argv);
int cmd_flow(int argc, char **argv);
int cmd_demo(int argc, char **argv);
int cmd_polar(int argc, char **argv);
int cmd_rotor(int argc, char **argv);
int cmd_drive(int argc, char **argv);
int cmd_structure(int argc, char **argv);
int cmd_export(int argc, char **argv);
int cmd_design(int argc, char **argv);
int cmd_cache(int argc, char **argv);
int cmd_plot(int argc, char **argv);
/* the propeller scenario of "airscrew demo" (cmd_demo_prop.c) */
int demo_prop(int argc, char **argv);

#endif
