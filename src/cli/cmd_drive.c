/* src/cli/cmd_drive.c
 * "airscrew drive": a propeller on its motor, controller and battery (a powertrain file): the
 * operating point at each throttle and airspeed, the throttle for a thrust, and the throttle
 * map with its linearity figures. The numerics are the library's (ascr_powertrain.h).
 */
#define _GNU_SOURCE
#include "cli.h"
#include "cli_figures.h"
#include "cli_rotor_opts.h"
#include "cli_tables.h"
#include "commands.h"

#include <getopt.h>
#include <jansson.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#define DRIVE_MAX_VALUES 101

static const char *const drive_cautions[] = {
    "Predictions are estimates: confirm thrust, current and temperatures on a guarded thrust "
    "stand before flight.",
    "A spinning propeller cuts; blades and hubs can fail at high rpm. Keep clear of the rotor "
    "plane, use guards and follow local rules and qualified practice.",
    "Currents above the motor's, controller's or battery's stated limits overheat them; "
    "lithium packs can catch fire when overloaded or damaged.",
    NULL};

static const char *const state_names[3] = {"full", "nominal", "loaded"};

static void drive_help(FILE *fp)
{
  fputs("usage: airscrew drive BLADE.json POWERTRAIN.json [--throttle VALUES] [--speed VALUES]\n"
        "                      [options]\n"
        "       airscrew drive BLADE.json POWERTRAIN.json --thrust N [--speed VALUES] [options]\n"
        "\n"
        "A propeller on its motor, speed controller and battery (the powertrain file): the rpm\n"
        "where the motor's torque meets the propeller's, with thrust, currents, voltages, powers\n"
        "and efficiencies, at each throttle and airspeed; or the throttle that gives a thrust.\n"
        "With throttles, the thrust-against-throttle map (0 to 100 % by 5 %) at each airspeed\n"
        "and its linearity: the largest departure from its best straight line and the ratio of\n"
        "the thrust gain at 25 % throttle to that at 75 %. VALUES: comma list or START:END:STEP.\n"
        "\n"
        "operating points:\n"
        "  -t, --throttle VALUES   throttle settings, percent 0..100 (default 0:100:10)\n"
        "  -v, --speed VALUES      axial airspeeds, m/s (default 0); --airspeed is the same\n"
        "      --thrust N          the throttle giving N newtons at each airspeed (hover: 0)\n"
        "      --incidence DEG     the airflow at DEG to the rotor axis (0 axial, 90 edgewise;\n"
        "                          BEMT only): in-plane force and hub moments too; no map\n"
        "      --battery STATE     open-circuit voltage of the pack: full, nominal (default) or\n"
        "                          loaded (late in the flight), from the powertrain file\n"
        "craft (the powertrain file's \"craft\": mass, rotors on the pack, drag area):\n"
        "      --hover             the hover throttle, currents and endurance\n"
        "      --climb             the largest vertical climb rate at full throttle\n"
        "      --top-speed         the top speed in level flight, discs tilted forward (BEMT at\n"
        "                          incidence; takes some seconds)\n"
        "                          (with any of these three and no --throttle, no throttle\n"
        "                          points are run)\n"
        CLI_ROTOR_OPTS_HELP
        "output:\n"
        "      --plot DIR          also draw thrust, rpm, current and power against throttle\n"
        "                          (DIR/drive.svg and .png)\n"
        "      --json, --csv       machine-readable output\n"
        "  -o, --output FILE       write to FILE (whole or not at all)\n"
        "      --force             replace FILE if it exists\n"
        "  -h, --help              this help\n"
        "\n"
        "Predictions are estimates. Test on a guarded thrust stand; a spinning propeller cuts.\n",
        fp);
}

typedef struct drive_row {
  ascr_drive_point p;
  int solved;                  /* the library returned a point */
  char note[ASCR_ERRBUF_SIZE]; /* why there is none (thrust search) */
} drive_row;

/* notes of a point, '; '-separated */
static void row_notes(const drive_row *r, char *buf, size_t n)
{
  size_t u = 0;
  buf[0] = '\0';
#define ADD(...)                                                                                   \
  do {                                                                                             \
    if (u < n) u += (size_t)snprintf(buf + u, n - u, "%s", u > 0 ? "; " : "");                     \
    if (u < n) u += (size_t)snprintf(buf + u, n - u, __VA_ARGS__);                                 \
  } while (0)
  if (!r->solved) {
    ADD("no solution: %s", r->note);
    return;
  }
  unsigned f = r->p.flags;
  if (f & ASCR_DRIVE_WINDMILLING) ADD("the airflow drives the propeller (windmilling): outside the model");
  else if (f & ASCR_DRIVE_STANDSTILL) ADD("motor standing");
  else if (!r->p.converged) ADD("not converged");
  if (f & ASCR_DRIVE_OVER_MOTOR_CURRENT) ADD("motor current above its stated limit");
  if (f & ASCR_DRIVE_OVER_ESC_CURRENT) ADD("controller current above its stated limit");
  if (f & ASCR_DRIVE_OVER_BATTERY_CURRENT) ADD("battery current above its stated limit");
  if (f & ASCR_DRIVE_LOW_CONFIDENCE) {
    ADD("low confidence: %.0f %% of the thrust on flagged elements", 100.0 * r->p.rotor.flagged_thrust_share);
  }
#undef ADD
}

static json_t *flags_json(unsigned f)
{
  json_t *a = json_array();
  static const struct {
    unsigned bit;
    const char *name;
  } fl[] = {{ASCR_DRIVE_OVER_MOTOR_CURRENT, "over_motor_current"},
            {ASCR_DRIVE_OVER_ESC_CURRENT, "over_esc_current"},
            {ASCR_DRIVE_OVER_BATTERY_CURRENT, "over_battery_current"},
            {ASCR_DRIVE_LOW_CONFIDENCE, "low_confidence"},
            {ASCR_DRIVE_WINDMILLING, "windmilling"},
            {ASCR_DRIVE_STANDSTILL, "standstill"}};
  for (size_t i = 0; i < sizeof fl / sizeof fl[0]; i++) {
    if (f & fl[i].bit) json_array_append_new(a, json_string(fl[i].name));
  }
  return a;
}

static json_t *point_json(const drive_row *r, const ascr_powertrain *pt)
{
  const ascr_drive_point *p = &r->p;
  int ok = r->solved && p->converged;
  const ascr_power_state *e = &p->power;
  json_t *o = json_object();
  json_object_set_new(o, "throttle", cli_json_num(r->solved, p->throttle));
  json_object_set_new(o, "rpm", cli_json_num(ok, p->rotor.rpm));
  json_object_set_new(o, "speed_m_s", json_real(p->speed_m_s));
  json_object_set_new(o, "thrust_N", cli_json_num(ok, p->rotor.thrust_N));
  json_object_set_new(o, "torque_Nm", cli_json_num(ok, p->rotor.torque_Nm));
  json_object_set_new(o, "current_A", cli_json_num(ok, e->motor_current_A));
  json_object_set_new(o, "battery_current_A", cli_json_num(ok, e->battery_current_A));
  json_object_set_new(o, "motor_voltage_V", cli_json_num(ok, e->motor_voltage_V));
  json_object_set_new(o, "battery_voltage_V", cli_json_num(ok, e->battery_voltage_V));
  json_object_set_new(o, "shaft_power_W", cli_json_num(ok, e->shaft_power_W));
  json_object_set_new(o, "electrical_power_W", cli_json_num(ok, e->electrical_power_W));
  json_object_set_new(o, "copper_loss_W", cli_json_num(ok, e->copper_loss_W));
  json_object_set_new(o, "no_load_loss_W", cli_json_num(ok, e->no_load_loss_W));
  json_object_set_new(o, "esc_loss_W", cli_json_num(ok, e->esc_loss_W));
  json_object_set_new(o, "wiring_loss_W", cli_json_num(ok, e->wiring_loss_W));
  json_object_set_new(o, "motor_efficiency", cli_json_num(ok, e->motor_efficiency));
  json_object_set_new(o, "overall_efficiency", cli_json_num(ok, e->overall_efficiency));
  double gw = ok && e->electrical_power_W > 0.0 ? 1000.0 * p->rotor.thrust_N / 9.80665 / e->electrical_power_W : NAN;
  json_object_set_new(o, "thrust_per_power_g_W", cli_json_num(ok, gw));
  json_object_set_new(o, "incidence_deg", json_real(p->incidence_deg));
  if (p->incidence_deg > 0.0) {
    json_object_set_new(o, "h_force_N", cli_json_num(ok, p->h_force_N));
    json_object_set_new(o, "side_force_N", cli_json_num(ok, p->side_force_N));
    json_object_set_new(o, "roll_moment_Nm", cli_json_num(ok, p->roll_moment_Nm));
    json_object_set_new(o, "pitch_moment_Nm", cli_json_num(ok, p->pitch_moment_Nm));
  }
  json_object_set_new(o, "converged", json_boolean(ok));
  json_object_set_new(o, "confidence", ok ? json_string(p->rotor.low_confidence ? "low" : "normal") : json_null());
  json_object_set_new(o, "flags", flags_json(r->solved ? p->flags : 0));
  char w[1024];
  row_notes(r, w, sizeof w);
  json_object_set_new(o, "warnings", json_string(w));
  json_object_set_new(o, "kv_rpm_per_V", json_real(pt->motor.kv_rpm_per_V));
  json_object_set_new(o, "resistance_ohm", json_real(pt->motor.resistance_ohm));
  json_object_set_new(o, "no_load_current_A", json_real(pt->motor.no_load_current_A));
  return o;
}

static void lin_text(FILE *fp, const ascr_drive_linearity *l)
{
  if (!l->complete && isnan(l->band[0])) {
    fprintf(fp, "thrust against throttle at %g m/s: fewer than three usable throttles; no "
            "linearity figure\n", l->speed_m_s);
    return;
  }
  fprintf(fp, "thrust against throttle at %g m/s: usable from %.0f %% to 100 %%; best line "
          "T = %.4g + %.4g throttle N; largest departure %.1f %% of full-throttle thrust",
          l->speed_m_s, 100.0 * l->band[0], l->fit_offset_N, l->fit_slope_N, 100.0 * l->max_deviation);
  if (isfinite(l->gain_ratio)) {
    fprintf(fp, "; thrust gain at 25 %% / at 75 %% = %.3f\n", l->gain_ratio);
  } else {
    fprintf(fp, "; gain ratio not determined (25 %% is below the usable band)\n");
  }
}

int cmd_drive(int argc, char **argv)
{
  static const struct option opts[] = {
    {"throttle", required_argument, NULL, 't'},     {"speed", required_argument, NULL, 'v'},
    {"airspeed", required_argument, NULL, 'v'},     {"thrust", required_argument, NULL, 'H'},
    {"battery", required_argument, NULL, 'b'},      {"hover", no_argument, NULL, 'Q'},
    {"climb", no_argument, NULL, 'M'},              {"top-speed", no_argument, NULL, 'Z'},
    {"incidence", required_argument, NULL, 'I'},
    CLI_ROTOR_LONGOPTS,
    {"json", no_argument, NULL, 'J'},               {"csv", no_argument, NULL, 'C'},
    {"output", required_argument, NULL, 'o'},       {"force", no_argument, NULL, 'F'},
    {"plot", required_argument, NULL, 'G'},         {"help", no_argument, NULL, 'h'},
    {NULL, 0, NULL, 0}};
  double thr[DRIVE_MAX_VALUES], speeds[DRIVE_MAX_VALUES] = {0.0};
  size_t nthr = 0, nspeed = 1;
  double thrust = NAN;
  int state = ASCR_BATTERY_NOMINAL, json = 0, csv = 0, force = 0, hover = 0, climb = 0, top = 0, c;
  double incidence = 0.0;
  const char *outpath = NULL, *plotdir = NULL;
  cli_rotor_opts ro;
  cli_rotor_opts_init(&ro);
  opterr = 0;
  cli_getopt_reset();
  while ((c = getopt_long(argc, argv, ":t:v:i:p:e:o:h", opts, NULL)) != -1) {
    switch (c) {
    case 't': if (cli_parse_values("--throttle", optarg, 0.0, 100.0, DRIVE_MAX_VALUES, thr, &nthr)) return CLI_EXIT_USAGE; break;
    case 'v': if (cli_parse_values("--speed", optarg, 0.0, 300.0, DRIVE_MAX_VALUES, speeds, &nspeed)) return CLI_EXIT_USAGE; break;
    case 'H': if (cli_parse_double("--thrust", optarg, 1e-6, 1e6, &thrust)) return CLI_EXIT_USAGE; break;
    case 'b': {
      int k = 0;
      while (k < 3 && strcmp(optarg, state_names[k]) != 0) k++;
      if (k == 3) {
        cli_error("--battery: '%s' is not a state (full, nominal or loaded)", optarg);
        return CLI_EXIT_USAGE;
      }
      state = k;
      break;
    }
    case 'Q': hover = 1; break;
    case 'M': climb = 1; break;
    case 'Z': top = 1; break;
    case 'I': if (cli_parse_double("--incidence", optarg, 0.0, 90.0, &incidence)) return CLI_EXIT_USAGE; break;
    case 'G': plotdir = optarg; break;
    case 'J': json = 1; break;
    case 'C': csv = 1; break;
    case 'o': outpath = optarg; break;
    case 'F': force = 1; break;
    case 'h': drive_help(stdout); return CLI_EXIT_OK;
    case ':': cli_error("drive: option %s needs a value", argv[optind - 1]); return CLI_EXIT_USAGE;
    default: {
      int r = cli_rotor_opts_parse(&ro, c, optarg);
      if (r == 0) break;
      if (r < 0) cli_error("drive: unknown option '%s' (see airscrew drive --help)", argv[optind - 1]);
      return CLI_EXIT_USAGE;
    }
    }
  }
  if (optind != argc - 2) {
    cli_error("drive: give a BLADE file and a POWERTRAIN file; see airscrew drive --help");
    return CLI_EXIT_USAGE;
  }
  int trim = !isnan(thrust);
  if (trim && nthr > 0) {
    cli_error("drive: --thrust and --throttle exclude each other");
    return CLI_EXIT_USAGE;
  }
  if (json && csv) {
    cli_error("drive: --json and --csv exclude each other");
    return CLI_EXIT_USAGE;
  }
  int orc = cli_rotor_opts_finish(&ro, "drive");
  if (orc) return orc;
  if ((top || incidence > 0.0) && cli_rotor_opts_model(&ro) != ASCR_INFLOW_BEMT) {
    cli_error("drive: --top-speed and --incidence use the BEMT (the vortex model has no disc at incidence)");
    return CLI_EXIT_USAGE;
  }
  if (trim && incidence > 0.0) {
    cli_error("drive: --thrust is axial; --incidence goes with --throttle");
    return CLI_EXIT_USAGE;
  }
  if (!trim && nthr == 0 && !hover && !climb && !top) {
    for (size_t i = 0; i <= 10; i++) thr[i] = 10.0 * (double)i;
    nthr = 11;
  }
  int map = !trim && nthr > 0 && incidence == 0.0; /* the throttle map and its linearity */
  if (cli_check_options_only) return CLI_EXIT_OK;
  if (outpath != NULL && (orc = cli_output_check(outpath, force)) != 0) return orc;
  if (plotdir != NULL && (orc = fig_prepare_dir(plotdir, (const char *const[]){"drive", NULL}, force)) != 0) {
    return orc;
  }
  cli_output out;
  int rc = cli_output_open(&out, outpath, force);
  if (rc) return rc;
  const char *bfile = argv[optind], *pfile = argv[optind + 1];
  ascr_blade *blade = NULL;
  ascr_powertrain *pt = NULL;
  ascr_errbuf err;
  ascr_status st = ascr_blade_read(bfile, &blade, &err);
  if (st == ASCR_OK) {
    st = ascr_powertrain_read(pfile, &pt, &err);
  }
  if (st != ASCR_OK) {
    cli_error("%s", err.msg);
    ascr_blade_free(blade);
    cli_output_discard(&out);
    return st == ASCR_ENOMEM ? CLI_EXIT_INTERNAL : CLI_EXIT_INPUT;
  }
  if ((hover || climb || top) && !pt->has_craft) {
    cli_error("%s: --hover, --climb and --top-speed need a \"craft\" (mass_kg, rotors) in the "
              "powertrain file", pfile);
    ascr_powertrain_free(pt);
    ascr_blade_free(blade);
    cli_output_discard(&out);
    return CLI_EXIT_INPUT;
  }
  /* the tables: up to the highest speed the motor can reach (full throttle, full pack) down to
   * a fifth of it, whatever the request's throttles, so that a point's tables do not depend on
   * what else was asked; slower points are flagged by the rotor models */
  double n_max = ascr_power_no_load_rpm(pt, ASCR_BATTERY_FULL, 1.0);
  double vmax = 0.0;
  for (size_t i = 0; i < nspeed; i++) vmax = fmax(vmax, speeds[i]);
  if (blade->envelope_airspeed_max_m_s > 0.0) vmax = fmax(vmax, blade->envelope_airspeed_max_m_s);
  cli_tables tabs;
  memset(&tabs, 0, sizeof tabs);
  drive_row *rows = NULL;
  ascr_drive_linearity *lin = NULL;
  size_t nrow = trim ? nspeed : nthr * nspeed, nconv = 0;
  ascr_drive_point hov, clp;
  ascr_drive_point tsp;
  double endurance = NAN, vclimb = NAN, vtop = NAN, tilt = NAN;
  int hov_ok = 0, cl_ok = 0, top_ok = 0;
  char hov_msg[ASCR_ERRBUF_SIZE] = "", cl_msg[ASCR_ERRBUF_SIZE] = "", top_msg[ASCR_ERRBUF_SIZE] = "";
  if (!(n_max > 100.0)) {
    cli_error("%s: the motor cannot turn at full throttle (no-load speed %.0f rpm)", pfile, n_max);
    rc = CLI_EXIT_INPUT;
    goto done;
  }
  rc = cli_tables_prepare(blade, &ro.rp, 0.2 * n_max, n_max, 0.0, vmax, &ro.to, &tabs);
  if (rc) goto done;
  rows = calloc(nrow + 1, sizeof *rows);
  lin = calloc(nspeed, sizeof *lin);
  if (rows == NULL || lin == NULL) {
    cli_error("out of memory");
    rc = CLI_EXIT_INTERNAL;
    goto done;
  }
  ascr_drive drv = {blade, (const ascr_polar_table *const *)tabs.tables, &ro.rp,
                    cli_rotor_opts_model(&ro), NULL, pt, (ascr_battery_state)state};
  for (size_t k = 0; k < nrow && rc == 0; k++) {
    drive_row *r = &rows[k];
    double v = trim ? speeds[k] : speeds[k % nspeed];
    if (trim) {
      st = ascr_drive_throttle_for_thrust(&drv, thrust, v, &r->p, &err);
      if (st == ASCR_EDOM || st == ASCR_EMAXITER) {
        snprintf(r->note, sizeof r->note, "%s", err.msg);
        r->p.speed_m_s = v;
        cli_warn("speed %g m/s: %s", v, err.msg);
        continue;
      }
    } else {
      st = ascr_drive_point_incidence(&drv, thr[k / nspeed] / 100.0, v, incidence, &r->p, &err);
    }
    if (st != ASCR_OK) {
      cli_error("%s", err.msg);
      rc = cli_exit_for(st);
      break;
    }
    r->solved = 1;
    nconv += (size_t)r->p.converged;
  }
  if (rc == 0 && hover) {
    st = ascr_drive_hover(&drv, &hov, &endurance, &err);
    if (st == ASCR_EDOM || st == ASCR_EMAXITER) {
      snprintf(hov_msg, sizeof hov_msg, "%s", err.msg);
      cli_warn("hover: %s", err.msg);
    } else if (st != ASCR_OK) {
      cli_error("%s", err.msg);
      rc = cli_exit_for(st);
    } else {
      hov_ok = hov.converged;
      nconv += (size_t)hov_ok;
    }
  }
  if (rc == 0 && climb) {
    st = ascr_drive_max_climb(&drv, &vclimb, &clp, &err);
    if (st == ASCR_EDOM || st == ASCR_EMAXITER) {
      snprintf(cl_msg, sizeof cl_msg, "%s", err.msg);
      cli_warn("climb: %s", err.msg);
    } else if (st != ASCR_OK) {
      cli_error("%s", err.msg);
      rc = cli_exit_for(st);
    } else {
      cl_ok = clp.converged;
      nconv += (size_t)cl_ok;
    }
  }
  if (rc == 0 && top) {
    st = ascr_drive_top_speed(&drv, &vtop, &tilt, &tsp, &err);
    if (st == ASCR_EDOM || st == ASCR_EMAXITER) {
      snprintf(top_msg, sizeof top_msg, "%s", err.msg);
      cli_warn("top speed: %s", err.msg);
    } else if (st != ASCR_OK) {
      cli_error("%s", err.msg);
      rc = cli_exit_for(st);
    } else {
      top_ok = tsp.converged;
      nconv += (size_t)top_ok;
    }
  }
  for (size_t s = 0; rc == 0 && map && s < nspeed; s++) {
    st = ascr_drive_linearity_at(&drv, speeds[s], &lin[s], &err);
    if (st != ASCR_OK) {
      cli_error("%s", err.msg);
      rc = cli_exit_for(st);
    }
  }
  if (rc == 0 && nconv == 0) {
    cli_error("drive: no operating point found");
    rc = CLI_EXIT_ANALYSIS;
  }
  if (rc != 0) goto done;
  const char *bname = blade->name != NULL ? blade->name : bfile;
  const char *pname = pt->name != NULL ? pt->name : pfile;
  double voc = ascr_battery_open_voltage(&pt->battery, (ascr_battery_state)state);
  if (plotdir != NULL && map && (rc = fig_drive(plotdir, lin, nspeed)) != 0) goto done;
  FILE *fp = out.fp;
  if (json) {
    json_t *o = json_object();
    json_object_set_new(o, "blade", json_string(bname));
    json_object_set_new(o, "blade_file", json_string(bfile));
    json_object_set_new(o, "powertrain", json_string(pname));
    json_object_set_new(o, "powertrain_file", json_string(pfile));
    json_object_set_new(o, "inflow", json_string(ro.inflow));
    json_object_set_new(o, "stall_delay", json_string(ro.rp.stall_delay == ASCR_STALL_DELAY_SNEL ? "snel" : "none"));
    json_object_set_new(o, "battery_state", json_string(state_names[state]));
    json_object_set_new(o, "battery_open_voltage_V", json_real(voc));
    json_t *air = json_object();
    json_object_set_new(air, "density_kg_m3", json_real(ro.rp.density_kg_m3));
    json_object_set_new(air, "viscosity_pa_s", json_real(ro.rp.viscosity_pa_s));
    json_object_set_new(air, "sound_speed_m_s", json_real(ro.rp.sound_speed_m_s));
    json_object_set_new(o, "air", air);
    if (trim) json_object_set_new(o, "target_thrust_N", json_real(thrust));
    json_t *pa = json_array();
    for (size_t k = 0; k < nrow; k++) json_array_append_new(pa, point_json(&rows[k], pt));
    json_object_set_new(o, "points", pa);
    if (hover) {
      drive_row r = {hov, hov_ok || hov_msg[0] == '\0', ""};
      snprintf(r.note, sizeof r.note, "%s", hov_msg);
      json_t *h = point_json(&r, pt);
      json_object_set_new(h, "craft_mass_kg", json_real(pt->craft.mass_kg));
      json_object_set_new(h, "rotors", json_integer(pt->craft.rotors));
      json_object_set_new(h, "endurance_min", cli_json_num(hov_ok, endurance / 60.0));
      json_object_set_new(o, "hover", h);
    }
    if (climb) {
      drive_row r = {clp, cl_ok || cl_msg[0] == '\0', ""};
      snprintf(r.note, sizeof r.note, "%s", cl_msg);
      json_t *h = point_json(&r, pt);
      json_object_set_new(h, "climb_rate_m_s", cli_json_num(cl_ok, vclimb));
      json_object_set_new(h, "drag_area_m2", json_real(pt->craft.drag_area_m2));
      json_object_set_new(o, "max_climb", h);
    }
    if (top) {
      drive_row r = {tsp, top_ok || top_msg[0] == '\0', ""};
      snprintf(r.note, sizeof r.note, "%s", top_msg);
      json_t *h = point_json(&r, pt);
      json_object_set_new(h, "top_speed_m_s", cli_json_num(top_ok, vtop));
      json_object_set_new(h, "tilt_deg", cli_json_num(top_ok, tilt));
      json_object_set_new(h, "drag_area_m2", json_real(pt->craft.drag_area_m2));
      json_object_set_new(o, "top_speed", h);
    }
    if (map) {
      json_t *la = json_array();
      for (size_t s = 0; s < nspeed; s++) {
        const ascr_drive_linearity *l = &lin[s];
        json_t *lo = json_object(), *band = json_array(), *mapa = json_array();
        int has = !isnan(l->band[0]);
        json_object_set_new(lo, "speed_m_s", json_real(l->speed_m_s));
        json_array_append_new(band, cli_json_num(has, l->band[0]));
        json_array_append_new(band, cli_json_num(has, l->band[1]));
        json_object_set_new(lo, "usable_band", band);
        json_object_set_new(lo, "max_deviation", cli_json_num(has, l->max_deviation));
        json_object_set_new(lo, "gain_ratio_25_75", cli_json_num(l->complete, l->gain_ratio));
        json_object_set_new(lo, "fit_offset_N", cli_json_num(has, l->fit_offset_N));
        json_object_set_new(lo, "fit_slope_N", cli_json_num(has, l->fit_slope_N));
        json_object_set_new(lo, "complete", json_boolean(l->complete));
        for (size_t i = 0; i < ASCR_DRIVE_MAP_POINTS; i++) {
          drive_row r = {l->grid[i], 1, ""};
          json_array_append_new(mapa, point_json(&r, pt));
        }
        json_object_set_new(lo, "map", mapa);
        json_array_append_new(la, lo);
      }
      json_object_set_new(o, "linearity", la);
    }
    json_t *ca = json_array();
    for (size_t i = 0; drive_cautions[i] != NULL; i++) json_array_append_new(ca, json_string(drive_cautions[i]));
    json_object_set_new(o, "cautions", ca);
    json_dumpf(o, fp, JSON_REAL_PRECISION(10) | JSON_COMPACT);
    fputc('\n', fp);
    json_decref(o);
  } else if (csv) {
    fprintf(fp, "# blade: %s\n# powertrain: %s\n# battery: %s (%.3f V open circuit)\n", bname, pname,
            state_names[state], voc);
    for (size_t i = 0; drive_cautions[i] != NULL; i++) fprintf(fp, "# caution: %s\n", drive_cautions[i]);
    if (hover && hov_ok) {
      fprintf(fp, "# hover: throttle %.4f, %.0f rpm, pack current %.4g A, endurance %.2f min\n", hov.throttle,
              hov.rotor.rpm, hov.power.battery_current_A, endurance / 60.0);
    }
    if (climb && cl_ok) fprintf(fp, "# max_climb: %.4g m/s\n", vclimb);
    if (top && top_ok) fprintf(fp, "# top_speed: %.4g m/s, tilt %.2f deg\n", vtop, tilt);
    for (size_t s = 0; map && s < nspeed; s++) {
      const ascr_drive_linearity *l = &lin[s];
      fprintf(fp, "# linearity at %g m/s: usable_band %.2f..1, max_deviation %.4f, gain_ratio_25_75 %.4f\n",
              l->speed_m_s, l->band[0], l->max_deviation, l->gain_ratio);
    }
    fputs("throttle,speed_m_s,rpm,thrust_N,torque_Nm,current_A,battery_current_A,motor_voltage_V,"
          "battery_voltage_V,shaft_power_W,electrical_power_W,motor_efficiency,overall_efficiency,"
          "converged,confidence,warnings\n", fp);
    for (size_t k = 0; k < nrow; k++) {
      const drive_row *r = &rows[k];
      const ascr_drive_point *p = &r->p;
      char w[1024];
      row_notes(r, w, sizeof w);
      for (char *q = w; *q; q++) if (*q == ',' || *q == '"') *q = ' ';
      if (r->solved) fprintf(fp, "%.6g,", p->throttle);
      else fputc(',', fp);
      fprintf(fp, "%.6g,", p->speed_m_s);
      if (r->solved && p->converged) {
        fprintf(fp, "%.6g,%.6g,%.6g,%.6g,%.6g,%.6g,%.6g,%.6g,%.6g,%.5f,%.5f,true,%s,%s\n", p->rotor.rpm,
                p->rotor.thrust_N, p->rotor.torque_Nm, p->power.motor_current_A,
                p->power.battery_current_A, p->power.motor_voltage_V, p->power.battery_voltage_V,
                p->power.shaft_power_W, p->power.electrical_power_W, p->power.motor_efficiency,
                p->power.overall_efficiency, p->rotor.low_confidence ? "low" : "normal", w);
      } else {
        fprintf(fp, ",,,,,,,,,,,false,,%s\n", w);
      }
    }
  } else {
    const ascr_motor *m = &pt->motor;
    const ascr_battery *b = &pt->battery;
    fprintf(fp, "blade       %s (%d blades, diameter %.1f mm), inflow model %s%s\n", bname, blade->n_blades,
            2000.0 * blade->r_tip_m, ro.inflow,
            ro.rp.stall_delay == ASCR_STALL_DELAY_SNEL ? ", stall delay (Snel)" : "");
    fprintf(fp, "powertrain  %s: motor %g rpm/V, %.4g ohm, no-load %.3g A; pack %dS%dP, %.2f / %.2f / "
            "%.2f V per cell, %.3g Ah\n", pname, m->kv_rpm_per_V, m->resistance_ohm,
            m->no_load_current_A, b->cells_series, b->cells_parallel, b->cell_voltage_full_V,
            b->cell_voltage_nominal_V, b->cell_voltage_loaded_V, b->capacity_Ah);
    fprintf(fp, "battery     %s charge: %.2f V open circuit\n", state_names[state], voc);
    fprintf(fp, "air         density %.4f kg/m3\n", ro.rp.density_kg_m3);
    if (trim) fprintf(fp, "target      %g N\n", thrust);
    if (nrow > 0) fprintf(fp, "\n%8s %6s %7s %8s %9s %8s %8s %7s %7s %8s %8s %6s %6s  %s\n", "throttle", "V m/s", "rpm",
            "thrust N", "torque Nm", "I mot A", "I bat A", "V mot", "V bat", "shaft W", "elec W",
            "eta_m", "g/W", "notes");
    for (size_t k = 0; k < nrow; k++) {
      const drive_row *r = &rows[k];
      const ascr_drive_point *p = &r->p;
      char w[1024];
      row_notes(r, w, sizeof w);
      if (!r->solved || !p->converged) {
        if (r->solved) fprintf(fp, "%7.1f%% %6.2f  %s\n", 100.0 * p->throttle, p->speed_m_s, w);
        else fprintf(fp, "%8s %6.2f  %s\n", "-", p->speed_m_s, w);
        continue;
      }
      char em[16] = "-", gw[16] = "-";
      if (isfinite(p->power.motor_efficiency)) snprintf(em, sizeof em, "%.3f", p->power.motor_efficiency);
      if (p->power.electrical_power_W > 0.0) {
        snprintf(gw, sizeof gw, "%.2f", 1000.0 * p->rotor.thrust_N / 9.80665 / p->power.electrical_power_W);
      }
      fprintf(fp, "%7.1f%% %6.2f %7.0f %8.4f %9.5f %8.3f %8.3f %7.3f %7.3f %8.2f %8.2f %6s %6s  %s\n",
              100.0 * p->throttle, p->speed_m_s, p->rotor.rpm, p->rotor.thrust_N, p->rotor.torque_Nm,
              p->power.motor_current_A, p->power.battery_current_A, p->power.motor_voltage_V,
              p->power.battery_voltage_V, p->power.shaft_power_W, p->power.electrical_power_W, em, gw, w);
    }
    fputc('\n', fp);
    for (size_t s = 0; map && s < nspeed; s++) lin_text(fp, &lin[s]);
    if (hover) {
      const ascr_craft *cr = &pt->craft;
      if (hov_ok) {
        fprintf(fp, "hover: %.4g kg on %d rotors, %.4f N each: throttle %.1f %%, %.0f rpm, motor %.3f A, "
                "pack %.3f A at %.3f V, %.2f W from the pack in all; endurance %.1f min (%.0f %% of "
                "%.3g Ah)%s\n", cr->mass_kg, cr->rotors, hov.rotor.thrust_N, 100.0 * hov.throttle,
                hov.rotor.rpm, hov.power.motor_current_A, hov.power.battery_current_A,
                hov.power.battery_voltage_V, cr->rotors * hov.power.electrical_power_W, endurance / 60.0,
                100.0 * pt->battery.usable_share, pt->battery.capacity_Ah,
                hov.flags & ASCR_DRIVE_LOW_CONFIDENCE ? " (low confidence)" : "");
      } else {
        fprintf(fp, "hover: no solution: %s\n", hov_msg[0] ? hov_msg : "not converged");
      }
    }
    if (top) {
      if (top_ok) {
        fprintf(fp, "top speed: %.2f m/s in level flight, discs tilted %.1f deg forward (full throttle, "
                "%.0f rpm, %.4f N thrust and %.4f N in-plane force a rotor, drag area %.4g m2)%s\n",
                vtop, tilt, tsp.rotor.rpm, tsp.rotor.thrust_N, tsp.h_force_N, pt->craft.drag_area_m2,
                tsp.flags & ASCR_DRIVE_LOW_CONFIDENCE ? " (low confidence)" : "");
      } else {
        fprintf(fp, "top speed: no solution: %s\n", top_msg[0] ? top_msg : "not converged");
      }
    }
    if (climb) {
      if (cl_ok) {
        fprintf(fp, "climb: at most %.2f m/s vertically (full throttle, %.0f rpm, %.4f N a rotor, drag "
                "area %.4g m2)%s\n", vclimb, clp.rotor.rpm, clp.rotor.thrust_N, pt->craft.drag_area_m2,
                clp.flags & ASCR_DRIVE_LOW_CONFIDENCE ? " (low confidence)" : "");
      } else {
        fprintf(fp, "climb: no solution: %s\n", cl_msg[0] ? cl_msg : "not converged");
      }
    }
    if (nrow > 0) {
      fputs("(I mot: motor current; I bat: the pack's current (throttle x motor current, times the\n"
            " rotors on the pack); V mot: at the motor's terminals; g/W: thrust in grams-force per\n"
            " electrical watt drawn from the pack)\n", fp);
    }
    fputc('\n', fp);
    for (size_t i = 0; drive_cautions[i] != NULL; i++) fprintf(fp, "caution: %s\n", drive_cautions[i]);
  }
done:
  free(rows);
  free(lin);
  cli_tables_free(&tabs);
  ascr_powertrain_free(pt);
  ascr_blade_free(blade);
  if (rc != 0) {
    cli_output_discard(&out);
    return rc;
  }
  return cli_output_commit(&out);
}
