/* src/cli/demo_drive.c
 * The powertrain section of "airscrew demo": the demo prop on the example powertrain
 * (docs/examples/inspection-3in-powertrain.json, embedded): hover throttle, currents and
 * endurance at the three states of charge, the climb rate, full throttle, the throttle maps with
 * their linearity; written as powertrain.json, drive-map.csv, drive.svg/.png and an HTML
 * fragment for the report. The section tables are made over the same range as "airscrew drive"
 * (a fifth of the full-throttle no-load speed to it), so its numbers are the command's.
 */
#define _POSIX_C_SOURCE 200809L
#include "demo_drive.h"
#include "cli_figures.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

/* docs/examples/inspection-3in-powertrain.json */
static const char demo_powertrain[] =
  "{\n"
  "  \"format\": \"airscrew-powertrain-1\",\n"
  "  \"name\": \"inspection micro-drone: 11 mm stator motor class on a 2S pack (airscrew demo)\",\n"
  "  \"motor\": {\"kv_rpm_per_V\": 4500, \"resistance_ohm\": 0.32, \"no_load_current_A\": 0.35,\n"
  "            \"no_load_voltage_V\": 7.4, \"no_load_speed_share\": 0.5, \"max_current_A\": 7.0,\n"
  "            \"mass_kg\": 0.0075},\n"
  "  \"esc\": {\"resistance_ohm\": 0.02, \"max_current_A\": 12.0, \"mass_kg\": 0.002},\n"
  "  \"battery\": {\"cells_series\": 2, \"cells_parallel\": 1, \"cell_voltage_full_V\": 4.2,\n"
  "              \"cell_voltage_nominal_V\": 3.7, \"cell_voltage_loaded_V\": 3.5,\n"
  "              \"cell_resistance_ohm\": 0.025, \"capacity_Ah\": 0.45, \"max_current_A\": 13.5,\n"
  "              \"usable_share\": 0.8, \"mass_kg\": 0.026},\n"
  "  \"wiring_resistance_ohm\": 0.01,\n"
  "  \"craft\": {\"mass_kg\": 0.140, \"rotors\": 4, \"drag_area_m2\": 0.0035}\n"
  "}\n";

#define NMAP 2
static const double map_speed[NMAP] = {0.0, 8.0};
static const char *const state_name[3] = {"full", "nominal", "loaded"};

int demo_drive_section(const ascr_blade *b, const ascr_rotor_params *rp, const cli_table_opts *to,
                       const char *outdir, demo_drive_out *o)
{
  memset(o, 0, sizeof *o);
  ascr_powertrain *pt = NULL;
  ascr_errbuf err;
  if (ascr_powertrain_parse(demo_powertrain, sizeof demo_powertrain - 1, "demo powertrain", &pt, &err) != ASCR_OK) {
    cli_error("%s", err.msg);
    return CLI_EXIT_INTERNAL;
  }
  char path[4200];
  snprintf(path, sizeof path, "%s/powertrain.json", outdir);
  int rc = cli_write_atomic(path, demo_powertrain, sizeof demo_powertrain - 1, 1);
  double n_max = ascr_power_no_load_rpm(pt, ASCR_BATTERY_FULL, 1.0);
  cli_tables tabs;
  memset(&tabs, 0, sizeof tabs);
  if (rc == 0) rc = cli_tables_prepare(b, rp, 0.2 * n_max, n_max, 0.0, b->envelope_airspeed_max_m_s > 0.0 ? b->envelope_airspeed_max_m_s : 12.0, to, &tabs);
  if (rc != 0) {
    ascr_powertrain_free(pt);
    return rc;
  }
  ascr_drive d = {b, (const ascr_polar_table *const *)tabs.tables, rp, ASCR_INFLOW_BEMT, NULL, pt,
                  ASCR_BATTERY_NOMINAL};
  ascr_drive_point hov[3], climb_pt, full;
  double endur[3], vclimb = NAN;
  int hok[3], cok, fok;
  for (int s = 0; s < 3; s++) {
    d.state = (ascr_battery_state)s;
    hok[s] = ascr_drive_hover(&d, &hov[s], &endur[s], &err) == ASCR_OK && hov[s].converged;
  }
  d.state = ASCR_BATTERY_NOMINAL;
  cok = ascr_drive_max_climb(&d, &vclimb, &climb_pt, &err) == ASCR_OK && climb_pt.converged;
  fok = ascr_drive_point_at(&d, 1.0, 0.0, &full, &err) == ASCR_OK && full.converged;
  o->full_throttle_rpm = fok ? full.rotor.rpm : NAN;
  static ascr_drive_linearity lin[NMAP];
  int lok = 1;
  for (int k = 0; k < NMAP && lok; k++) lok = ascr_drive_linearity_at(&d, map_speed[k], &lin[k], &err) == ASCR_OK;
  if (!lok) {
    cli_error("demo: throttle map: %s", err.msg);
    rc = CLI_EXIT_ANALYSIS;
  }
  /* drive-map.csv */
  char *buf = NULL;
  size_t len = 0;
  FILE *f = rc == 0 ? open_memstream(&buf, &len) : NULL;
  if (f != NULL) {
    fputs("# the demo prop on the demo powertrain (nominal pack); unconverged points have empty numbers\n"
          "speed_m_s,throttle,rpm,thrust_N,torque_Nm,motor_current_A,pack_current_A,electrical_power_W,converged\n", f);
    for (int k = 0; k < NMAP; k++) {
      for (size_t i = 0; i < ASCR_DRIVE_MAP_POINTS; i++) {
        const ascr_drive_point *p = &lin[k].grid[i];
        if (p->converged) {
          fprintf(f, "%g,%.2f,%.1f,%.6f,%.7f,%.5f,%.5f,%.5f,true\n", p->speed_m_s, p->throttle, p->rotor.rpm,
                  p->rotor.thrust_N, p->rotor.torque_Nm, p->power.motor_current_A,
                  p->power.battery_current_A, p->power.electrical_power_W);
        } else {
          fprintf(f, "%g,%.2f,,,,,,,false\n", p->speed_m_s, p->throttle);
        }
      }
    }
    fclose(f);
    snprintf(path, sizeof path, "%s/drive-map.csv", outdir);
    rc = cli_write_atomic(path, buf, len, 1);
    free(buf);
  }
  if (rc == 0) rc = fig_drive(outdir, lin, NMAP);
  /* the report's fragment and the summary */
  buf = NULL;
  f = rc == 0 ? open_memstream(&buf, &len) : NULL;
  if (f != NULL) {
    const ascr_motor *m = &pt->motor;
    const ascr_battery *bt = &pt->battery;
    fprintf(f, "<h2>Powertrain</h2>\n<p>Each rotor on a %g rpm/V motor (%.2f&nbsp;&Omega;, no-load %.2f&nbsp;A) "
               "and its own controller, all four on one %dS pack of %.0f&nbsp;mAh (%.3f&nbsp;&Omega; a cell); "
               "file powertrain.json, models in docs/theory/powertrain.md.</p>\n",
            m->kv_rpm_per_V, m->resistance_ohm, m->no_load_current_A, bt->cells_series,
            1000.0 * bt->capacity_Ah, bt->cell_resistance_ohm);
    fprintf(f, "<table><tr><th>pack</th><th>open-circuit (V)</th><th>hover throttle</th><th>rpm</th>"
               "<th>motor (A)</th><th>pack (A)</th><th>from the pack (W)</th><th>endurance (min)</th></tr>\n");
    for (int s = 0; s < 3; s++) {
      if (hok[s]) {
        fprintf(f, "<tr><td>%s</td><td>%.2f</td><td>%.1f&nbsp;%%</td><td>%.0f</td><td>%.3f</td><td>%.3f</td>"
                   "<td>%.2f</td><td>%.1f</td></tr>\n", state_name[s],
                ascr_battery_open_voltage(bt, (ascr_battery_state)s), 100.0 * hov[s].throttle, hov[s].rotor.rpm,
                hov[s].power.motor_current_A, hov[s].power.battery_current_A,
                pt->craft.rotors * hov[s].power.electrical_power_W, endur[s] / 60.0);
      } else {
        fprintf(f, "<tr><td>%s</td><td colspan=\"7\">no hover solution</td></tr>\n", state_name[s]);
      }
    }
    fprintf(f, "</table>\n<p>");
    if (fok) {
      fprintf(f, "Full throttle, static, nominal pack: %.0f&nbsp;rpm, %.3f&nbsp;N a rotor (%.2f times the "
                 "hover thrust), motor %.2f&nbsp;A%s, pack %.2f&nbsp;A%s. ", full.rotor.rpm, full.rotor.thrust_N,
              hov[1].converged ? full.rotor.thrust_N / hov[1].rotor.thrust_N : NAN,
              full.power.motor_current_A,
              full.flags & ASCR_DRIVE_OVER_MOTOR_CURRENT ? " (above the motor's stated limit)" : "",
              full.power.battery_current_A,
              full.flags & ASCR_DRIVE_OVER_BATTERY_CURRENT ? " (above the pack's stated limit)" : "");
    }
    if (cok) fprintf(f, "Largest vertical climb rate: %.1f&nbsp;m/s. ", vclimb);
    for (int k = 0; k < NMAP; k++) {
      if (isfinite(lin[k].max_deviation)) {
        fprintf(f, "At %g&nbsp;m/s thrust departs from its best straight line by at most %.1f&nbsp;%% of the "
                   "full-throttle thrust (usable from %.0f&nbsp;%% throttle)", map_speed[k],
                100.0 * lin[k].max_deviation, 100.0 * lin[k].band[0]);
        if (isfinite(lin[k].gain_ratio)) {
          fprintf(f, "; the thrust gain at 25&nbsp;%% throttle is %.2f times that at 75&nbsp;%%", lin[k].gain_ratio);
        }
        fputs(". ", f);
      }
    }
    fputs("</p>\n", f);
    fclose(f);
    o->html = buf;
  }
  if (rc == 0 && (o->summary = malloc(512)) != NULL) {
    char climb[64] = "";
    if (cok) snprintf(climb, sizeof climb, "; climbs at up to %.1f m/s", vclimb);
    if (hok[1]) {
      snprintf(o->summary, 512, "  powertrain: hover at %.1f %% throttle, %.2f A from the pack, %.1f min "
               "(nominal pack)%s", 100.0 * hov[1].throttle, hov[1].power.battery_current_A,
               endur[1] / 60.0, climb);
    } else {
      snprintf(o->summary, 512, "  powertrain: no hover solution%s", climb);
    }
  }
  cli_tables_free(&tabs);
  ascr_powertrain_free(pt);
  return rc;
}

void demo_drive_out_free(demo_drive_out *o)
{
  free(o->html);
  free(o->summary);
  o->html = o->summary = NULL;
}
