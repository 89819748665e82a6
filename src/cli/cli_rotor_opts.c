/* src/cli/cli_rotor_opts.c
 * Options shared by rotor and drive; see cli_rotor_opts.h.
 */
#include "cli_rotor_opts.h"

#include <math.h>
#include <string.h>

void cli_rotor_opts_init(cli_rotor_opts *o)
{
  memset(o, 0, sizeof *o);
  o->altitude = o->density = o->viscosity = o->sound = o->temp_c = o->press = NAN;
  o->inflow = "bemt";
  cli_table_opts_init(&o->to);
  o->rp = ascr_rotor_params_defaults();
}

int cli_rotor_opts_parse(cli_rotor_opts *o, int c, char *arg)
{
  cli_table_opts *to = &o->to;
  switch (c) {
  case 'i':
    if (strcmp(arg, "bemt") != 0 && strcmp(arg, "vortex") != 0) {
      cli_error("--inflow: '%s' is not a model (bemt or vortex)", arg);
      return 1;
    }
    o->inflow = arg;
    return 0;
  case 'A': return cli_parse_double("--altitude", arg, -500.0, 11000.0, &o->altitude);
  case 'D': return cli_parse_double("--density", arg, 0.01, 50.0, &o->density);
  case 'V': return cli_parse_double("--viscosity", arg, 1e-7, 1e-2, &o->viscosity);
  case 'S': return cli_parse_double("--sound-speed", arg, 50.0, 2000.0, &o->sound);
  case 'K': return cli_parse_double("--temperature", arg, -90.0, 75.0, &o->temp_c);
  case 'Y': return cli_parse_double("--pressure", arg, 1e4, 1.2e5, &o->press);
  case 'N': case 'T': case 'W': case 'U': case 'L':
    return cli_visc_opts_parse(&to->vo, c, arg);
  case 'a':
    return cli_parse_range("--table-alpha", arg, -30.0, 30.0, &to->alpha_lo, &to->alpha_hi,
                           &to->alpha_step);
  case 'p': return cli_parse_size("--panels", arg, 40, 400, &to->panels);
  case 'P': {
    char *eq = strchr(arg, '=');
    if (eq == NULL || eq == arg || eq[1] == '\0' || to->n_files >= CLI_MAX_LIST) {
      cli_error("--polar-table: '%s' is not NAME=FILE", arg);
      return 1;
    }
    *eq = '\0';
    to->file_section[to->n_files] = arg;
    to->file_path[to->n_files++] = eq + 1;
    return 0;
  }
  case 'c': o->cache_dir = arg; return 0;
  case 'X': o->no_cache = 1; return 0;
  case 'e': return cli_parse_size("--elements", arg, 8, 400, &o->rp.n_elements);
  case CLI_OPT_STALL_DELAY:
    if (strcmp(arg, "none") == 0) {
      o->rp.stall_delay = ASCR_STALL_DELAY_NONE;
    } else if (strcmp(arg, "snel") == 0) {
      o->rp.stall_delay = ASCR_STALL_DELAY_SNEL;
    } else {
      cli_error("--stall-delay: '%s' is not a model (none or snel)", arg);
      return 1;
    }
    return 0;
  default: return -1;
  }
}

int cli_rotor_opts_finish(cli_rotor_opts *o, const char *cmd)
{
  if (o->no_cache && o->cache_dir != NULL) {
    cli_error("%s: --no-cache and --cache-dir exclude each other", cmd);
    return CLI_EXIT_USAGE;
  }
  ascr_rotor_params *rp = &o->rp;
  if (!isnan(o->altitude)) {
    if (!isnan(o->density) || !isnan(o->viscosity) || !isnan(o->sound)) {
      cli_error("%s: --altitude excludes --density, --viscosity and --sound-speed", cmd);
      return CLI_EXIT_USAGE;
    }
    ascr_errbuf err;
    if (ascr_isa(o->altitude, &rp->density_kg_m3, &rp->viscosity_pa_s, &rp->sound_speed_m_s,
                 &err) != ASCR_OK) {
      cli_error("--altitude: %s", err.msg);
      return CLI_EXIT_USAGE;
    }
  }
  if (!isnan(o->temp_c) || !isnan(o->press)) {
    if (!isnan(o->altitude) || !isnan(o->density) || !isnan(o->viscosity) || !isnan(o->sound)) {
      cli_error("%s: --temperature/--pressure exclude --altitude, --density, --viscosity and "
                "--sound-speed", cmd);
      return CLI_EXIT_USAGE;
    }
    ascr_errbuf err;
    if (ascr_air_from_tp(273.15 + (isnan(o->temp_c) ? 15.0 : o->temp_c),
                         isnan(o->press) ? 101325.0 : o->press, &rp->density_kg_m3,
                         &rp->viscosity_pa_s, &rp->sound_speed_m_s, &err) != ASCR_OK) {
      cli_error("--temperature/--pressure: %s", err.msg);
      return CLI_EXIT_USAGE;
    }
  }
  if (!isnan(o->density)) rp->density_kg_m3 = o->density;
  if (!isnan(o->viscosity)) rp->viscosity_pa_s = o->viscosity;
  if (!isnan(o->sound)) rp->sound_speed_m_s = o->sound;
  o->to.cache_dir = o->no_cache ? NULL : (o->cache_dir != NULL ? o->cache_dir : cli_default_cache_dir());
  return 0;
}

ascr_inflow cli_rotor_opts_model(const cli_rotor_opts *o)
{
  return strcmp(o->inflow, "vortex") == 0 ? ASCR_INFLOW_VORTEX : ASCR_INFLOW_BEMT;
}
