/* include/airscrew/ascr_powertrain.h
 * Powertrain: battery, wiring, speed controller (ESC) and brushless motor driving a propeller,
 * and the operating point where the motor's torque meets the propeller's.
 *
 * Models (docs/theory/powertrain.md; each equation lives once, in src/power/circuit.c):
 * - Motor: the first-order DC machine of the equivalent circuit (Hughes & Drury, Electric Motors
 *   and Drives, 4th ed., 2013, ch. 3): back-EMF E = k w, shaft torque k (I - I0), terminal
 *   voltage E + I R. The constant k is the same for EMF and torque in SI units (power balance
 *   E I = T w), k = 60 / (2 pi KV) with KV in rpm per volt. A brushless motor driven by its
 *   controller behaves so to first order (the same book, ch. 9). The no-load current I0 stands
 *   for the friction and iron losses: a part constant with speed (bearing friction, hysteresis,
 *   whose losses grow like the speed) and a part proportional to it (eddy currents, whose losses
 *   grow like its square), after the loss separation of Bertotti (IEEE Trans. Magn. 24(1), 1988).
 * - ESC: an ideal PWM switch at duty cycle = throttle, averaged over the switching period
 *   (state-space averaging, Middlebrook & Cuk, IEEE PESC 1976; the buck-converter relations of
 *   Mohan, Undeland & Robbins, Power Electronics, 3rd ed., 2003, ch. 7): the motor sees the mean
 *   voltage d V_in, the controller draws the mean current d I from its supply. Valid while the
 *   motor current is continuous (winding inductance large against the switching period, the
 *   usual case at the controllers' 8-48 kHz); its switch resistance is in the motor's path.
 * - Battery: open-circuit voltage behind an internal resistance (the simplest equivalent
 *   circuit; Plett, Battery Management Systems vol. I, 2015, ch. 2), cells in series and
 *   parallel; the open-circuit cell voltage is taken at one of three states of charge the file
 *   gives (full, nominal, loaded: see ascr_battery_state).
 * - Wiring: a resistance between battery and controller.
 *
 * Conventions: SI units; rpm for shaft speeds; throttle is the duty cycle 0..1. Thread safety:
 * reentrant; no hidden state.
 */
#ifndef ASCR_POWERTRAIN_H
#define ASCR_POWERTRAIN_H

#include <stddef.h>
#include "airscrew/ascr_errno.h"
#include "airscrew/ascr_rotor.h"

#ifdef __cplusplus
extern "C" {
#endif

/** Brushless motor, first order. Limits and mass are NaN where the file states none. */
typedef struct ascr_motor {
  double kv_rpm_per_V;          /* speed constant, rpm per volt (no-load) */
  double resistance_ohm;        /* winding resistance (phase to phase) */
  double no_load_current_A;     /* no-load current at no_load_voltage_V */
  double no_load_voltage_V;     /* voltage at which it was measured (sets the reference speed
                                   KV V); NaN: I0 taken as constant */
  double no_load_speed_share;   /* share of I0 proportional to speed (eddy-current losses),
                                   0..1; 0: I0 constant with speed (default) */
  double max_current_A;         /* stated continuous current limit */
  double mass_kg;
} ascr_motor;

/** Speed controller. */
typedef struct ascr_esc {
  double resistance_ohm;        /* switch resistance in the motor current's path */
  double max_current_A;         /* stated continuous current limit (NaN: none stated) */
  double mass_kg;
} ascr_esc;

/** Battery pack. */
typedef struct ascr_battery {
  int cells_series, cells_parallel;
  double cell_voltage_full_V;    /* open-circuit cell voltage, fully charged */
  double cell_voltage_nominal_V; /* the rated cell voltage (about the middle of the discharge) */
  double cell_voltage_loaded_V;  /* open-circuit cell voltage late in the usable discharge: the
                                    pack as it is near the end of a flight */
  double cell_resistance_ohm;    /* internal resistance of one cell */
  double capacity_Ah;            /* pack capacity */
  double max_current_A;          /* stated continuous discharge limit (NaN: none stated) */
  double usable_share;           /* share of the capacity a flight may use (default 0.8: common
                                    practice for lithium-polymer packs) */
  double mass_kg;
} ascr_battery;

/** State of charge at which the open-circuit voltage is taken. */
typedef enum ascr_battery_state {
  ASCR_BATTERY_FULL = 0,
  ASCR_BATTERY_NOMINAL = 1,
  ASCR_BATTERY_LOADED = 2
} ascr_battery_state;

/** The craft the powertrain flies: its rotors share the one battery (each with its own motor
 *  and controller, all at the same throttle). */
typedef struct ascr_craft {
  double mass_kg;                /* all-up mass */
  int rotors;                    /* 1 .. 16 */
  double drag_area_m2;           /* drag coefficient times its reference area (the body's
                                    parasite drag, taken the same in climb; 0: none stated) */
} ascr_craft;

typedef struct ascr_powertrain {
  char *name;                    /* may be NULL */
  ascr_motor motor;
  ascr_esc esc;
  ascr_battery battery;
  double wiring_resistance_ohm;  /* battery to controller, both leads, one rotor's branch */
  int has_craft;                 /* craft given: its rotors share the pack */
  ascr_craft craft;
} ascr_powertrain;

/** Check ranges (KV, resistances, cell counts and voltages, shares); the message names the
 *  field (for example "motor.kv_rpm_per_V"). @return ASCR_OK or ASCR_EINVAL. */
ASCR_EXPORT ascr_status ascr_powertrain_validate(const ascr_powertrain *pt, ascr_errbuf *err);

/** Read a powertrain file (JSON, schema in docs/file-formats.md, "Powertrain files"). Messages
 *  name the file and the field path (and the line of a syntax error).
 *  @return ASCR_OK, ASCR_EIO, ASCR_EPARSE, ASCR_EINVAL, ASCR_ENOMEM. */
ASCR_EXPORT ascr_status ascr_powertrain_read(const char *path, ascr_powertrain **out,
                                             ascr_errbuf *err);
/** As ascr_powertrain_read from a text buffer; name labels the messages. */
ASCR_EXPORT ascr_status ascr_powertrain_parse(const char *text, size_t len, const char *name,
                                              ascr_powertrain **out, ascr_errbuf *err);
/** Free what _read/_parse made; NULL is a no-op. */
ASCR_EXPORT void ascr_powertrain_free(ascr_powertrain *pt);

/** Open-circuit pack voltage at a state of charge. */
ASCR_EXPORT double ascr_battery_open_voltage(const ascr_battery *b, ascr_battery_state s);

/** The electrical state of the powertrain at a throttle and shaft speed (no propeller). */
typedef struct ascr_power_state {
  double throttle, rpm;
  double motor_current_A;
  double battery_current_A;      /* the pack's whole current (every rotor of the craft) */
  double back_emf_V;
  double motor_voltage_V;        /* mean voltage at the motor's terminals (d V_in less the
                                    controller's switch drop) */
  double esc_input_voltage_V;    /* after battery and wiring */
  double battery_voltage_V;      /* at the battery's terminals */
  double motor_torque_Nm;        /* shaft torque k (I - I0) */
  double shaft_power_W;          /* torque times angular speed */
  double electrical_power_W;     /* drawn at the battery's terminals by this rotor */
  double copper_loss_W, no_load_loss_W, esc_loss_W, wiring_loss_W;
  double battery_loss_W;         /* inside the pack (not part of electrical_power_W) */
  double motor_efficiency;       /* shaft / motor input (NaN when the input is not positive) */
  double overall_efficiency;     /* shaft / electrical (NaN likewise) */
} ascr_power_state;

/** Torque constant k = 60/(2 pi KV), N m per A (= V s per rad). */
ASCR_EXPORT double ascr_motor_torque_constant(const ascr_motor *m);

/** Electrical state at throttle (0..1) and shaft speed rpm >= 0 with the battery at state s:
 *  closed form (the circuit is linear in the currents). @return ASCR_OK or ASCR_EINVAL. */
ASCR_EXPORT ascr_status ascr_power_state_at(const ascr_powertrain *pt, ascr_battery_state s,
                                            double throttle, double rpm, ascr_power_state *out,
                                            ascr_errbuf *err);

/** Shaft speed at which the motor's torque falls to zero at a throttle (its no-load speed under
 *  this supply); 0 if the motor cannot overcome its own no-load losses. */
ASCR_EXPORT double ascr_power_no_load_rpm(const ascr_powertrain *pt, ascr_battery_state s,
                                          double throttle);

/** Throttle at which the motor turns at rpm while delivering shaft torque torque_Nm (the
 *  inverse of the circuit: a quadratic in the duty cycle, its physical root). NaN if no duty
 *  cycle up to 1 supplies it (*needed receives the required duty cycle's lower bound, or NaN
 *  when the supply cannot deliver the power at any duty cycle). */
ASCR_EXPORT double ascr_power_throttle_for(const ascr_powertrain *pt, ascr_battery_state s,
                                           double rpm, double torque_Nm, double *needed);

/** What drives the propeller: the blade with its section tables and air, the inflow model and
 *  the powertrain at a state of charge. Everything borrowed. */
typedef struct ascr_drive {
  const ascr_blade *blade;
  const ascr_polar_table *const *tables;
  const ascr_rotor_params *params;
  ascr_inflow model;
  const ascr_vortex_params *vortex;    /* may be NULL */
  const ascr_powertrain *powertrain;
  ascr_battery_state state;
} ascr_drive;

/** Flags of a drive point (bits). */
enum {
  ASCR_DRIVE_OVER_MOTOR_CURRENT = 1,   /* motor current above the motor's stated limit */
  ASCR_DRIVE_OVER_ESC_CURRENT = 2,     /* above the controller's */
  ASCR_DRIVE_OVER_BATTERY_CURRENT = 4, /* battery current above the pack's */
  ASCR_DRIVE_LOW_CONFIDENCE = 8,       /* the propeller point is low-confidence (ascr_rotor.h) */
  ASCR_DRIVE_WINDMILLING = 16,         /* the airflow turns the propeller faster than the motor
                                          would: no driving equilibrium (outside the model) */
  ASCR_DRIVE_STANDSTILL = 32           /* the motor cannot overcome its no-load losses */
};

/** One operating point of motor and propeller. */
typedef struct ascr_drive_point {
  double throttle, speed_m_s;
  double incidence_deg;            /* of the airflow to the rotor axis (0: axial) */
  ascr_power_state power;          /* electrical state at the balance */
  ascr_rotor_result rotor;         /* the propeller at the balance */
  double h_force_N, side_force_N;  /* in-plane forces at incidence (ascr_rotor_incidence; 0 axial) */
  double roll_moment_Nm, pitch_moment_Nm;
  unsigned flags;
  int converged;                   /* balance found and the propeller point converged */
} ascr_drive_point;

/** The balance of motor and propeller torque at a throttle and axial airspeed: GSL's Brent
 *  solver on Q_motor(rpm) - Q_prop(rpm) in a bracket whose ends are guaranteed by the circuit
 *  (positive near standstill, where the motor gives its stall torque and the propeller almost
 *  none; negative at the motor's no-load speed, where the motor gives none), to 1e-9 relative
 *  in rpm. Throttle 0 or a motor that cannot turn: rpm 0, ASCR_DRIVE_STANDSTILL, converged.
 *  @return ASCR_OK (see out->converged and flags), ASCR_EINVAL, ASCR_ENOMEM. */
ASCR_EXPORT ascr_status ascr_drive_point_at(const ascr_drive *d, double throttle,
                                            double speed_m_s, ascr_drive_point *out,
                                            ascr_errbuf *err);

/** As ascr_drive_point_at with the airflow at incidence_deg (0 .. 90) to the rotor axis: the
 *  propeller by ascr_rotor_incidence (BEMT; the vortex model is not available at incidence:
 *  ASCR_EINVAL) unless the incidence is 0. */
ASCR_EXPORT ascr_status ascr_drive_point_incidence(const ascr_drive *d, double throttle,
                                                   double speed_m_s, double incidence_deg,
                                                   ascr_drive_point *out, ascr_errbuf *err);

/** The throttle at which the propeller gives thrust_N at an airspeed: the rpm from the rotor's
 *  thrust search (ascr_rotor_rpm_for_thrust, from a low rpm to the full-throttle no-load
 *  speed), then the duty cycle from the circuit (ascr_power_throttle_for).
 *  @return ASCR_OK; ASCR_EDOM when full throttle does not reach the thrust (message says how
 *          far short); ASCR_EMAXITER; ASCR_EINVAL. */
ASCR_EXPORT ascr_status ascr_drive_throttle_for_thrust(const ascr_drive *d, double thrust_N,
                                                       double speed_m_s, ascr_drive_point *out,
                                                       ascr_errbuf *err);

/** Linearity of thrust against throttle at an airspeed. */
#define ASCR_DRIVE_MAP_POINTS 21   /* throttle 0, 0.05, .., 1 */
typedef struct ascr_drive_linearity {
  double speed_m_s;
  double band[2];             /* usable throttle band: from the first grid throttle at which the
                                 prop turns and gives thrust (every point above converged) to 1 */
  double max_deviation;       /* largest |T - fit| over the band's grid points, as a share of
                                 the full-throttle thrust (fit: least squares straight line) */
  double gain_ratio;          /* dT/dthrottle at 0.25 over that at 0.75 (central differences,
                                 +-0.025); 1 for a linear response */
  double fit_offset_N, fit_slope_N; /* T = offset + slope throttle */
  ascr_drive_point grid[ASCR_DRIVE_MAP_POINTS];
  int complete;               /* band found, gains computed */
} ascr_drive_linearity;

/** Throttle map and linearity at an airspeed. @return ASCR_OK (see out->complete) or the
 *  status of a failed point. */
ASCR_EXPORT ascr_status ascr_drive_linearity_at(const ascr_drive *d, double speed_m_s,
                                                ascr_drive_linearity *out, ascr_errbuf *err);

/** Standard gravity (m/s^2; the 1901 CGPM value) for the craft's weight. */
#define ASCR_STANDARD_GRAVITY 9.80665

/** Hover of the craft (the powertrain must carry one): each rotor carries its share of the
 *  weight at zero airspeed (ascr_drive_throttle_for_thrust). endurance_s (may be NULL): the
 *  pack's usable capacity over its current, a constant-current discharge at the chosen state of
 *  charge (no voltage-charge curve: the states full / nominal / loaded bracket a flight).
 *  @return as ascr_drive_throttle_for_thrust; ASCR_EINVAL without a craft. */
ASCR_EXPORT ascr_status ascr_drive_hover(const ascr_drive *d, ascr_drive_point *out,
                                         double *endurance_s, ascr_errbuf *err);

/** Largest steady vertical climb rate: at full throttle, rotors x T(1, Vc) = m g + 1/2 rho Vc^2
 *  (drag area), the propellers in axial inflow at the climb speed (the body's drag area taken
 *  the same as in forward flight: an assumption), by GSL's Brent solver on Vc between 0 (where
 *  full throttle must lift the craft) and the speed where the surplus has gone (found by
 *  doubling from 2 m/s up to 128 m/s). out: the full-throttle point at that climb rate.
 *  @return ASCR_OK; ASCR_EDOM when full throttle does not lift the craft; ASCR_EMAXITER;
 *          ASCR_EINVAL without a craft. */
ASCR_EXPORT ascr_status ascr_drive_max_climb(const ascr_drive *d, double *climb_m_s,
                                             ascr_drive_point *out, ascr_errbuf *err);

/** Top speed in level flight: at full throttle the discs tilt forward by tau until, with the
 *  rotors' thrust T and in-plane force H at incidence 90 - tau to the airflow,
 *  rotors (T cos tau + H sin tau) = m g (vertical) — tau by Brent's method at each speed — and
 *  the top speed is where rotors (T sin tau - H cos tau) = 1/2 rho V^2 (drag area), by Brent's
 *  method on V (bracket from 1 m/s, doubling to 128 m/s). No body lift; the rotors' mutual
 *  interference is ignored. out: the full-throttle point there; tilt_deg: tau.
 *  @return ASCR_OK; ASCR_EDOM when full throttle does not hold the craft up; ASCR_EMAXITER;
 *          ASCR_EINVAL without a craft or with the vortex model. */
ASCR_EXPORT ascr_status ascr_drive_top_speed(const ascr_drive *d, double *speed_m_s,
                                             double *tilt_deg, ascr_drive_point *out,
                                             ascr_errbuf *err);

#ifdef __cplusplus
}
#endif
#endif /* ASCR_POWERTRAIN_H */
