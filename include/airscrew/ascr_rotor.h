/* include/airscrew/ascr_rotor.h
 * Blades and rotor performance: a blade layout (radius, chord, twist and section by station),
 * the section tables of ascr_table.h, and an inflow model that turns them into thrust, torque,
 * power and efficiency at an operating point (rpm, axial speed).
 *
 * Inflow models:
 * - BEMT (ascr_rotor_bemt): annulus momentum with swirl + blade element, Prandtl tip and hub
 *   loss (Glauert 1935, in Durand, Aerodynamic Theory IV, div. L), one residual in the inflow
 *   angle per element solved inside a bracket (Ning 2014, Wind Energy 17:1327) with GSL's
 *   Brent solver; hover, climb and windmilling (Buhl 2005, NREL/TP-500-36834, for the
 *   turbulent-wake state).
 * - Vortex (ascr_rotor_vortex): lifting line with a helical trailing wake.
 * Our formulations: docs/theory/rotor.md.
 *
 * Conventions: SI units; twist and angles in degrees where the name says _deg; the blade
 * spans from its first to its last station; positive thrust pushes air downstream, torque is
 * the shaft torque the motor must supply. Thread safety: reentrant; no hidden state.
 */
#ifndef ASCR_ROTOR_H
#define ASCR_ROTOR_H

#include <stddef.h>
#include "airscrew/ascr_errno.h"
#include "airscrew/ascr_table.h"

#ifdef __cplusplus
extern "C" {
#endif

/** One blade station. */
typedef struct ascr_blade_station {
  double r_m;       /* radius */
  double chord_m;   /* chord */
  double twist_deg; /* section angle to the plane of rotation (pitch offset added) */
  size_t section;   /* index into the blade's sections (and the tables passed to the solver) */
} ascr_blade_station;

/** A blade layout (all arrays owned by whoever built it; ascr_blade_free for read ones). */
typedef struct ascr_blade {
  char *name;                  /* may be NULL */
  int n_blades;                /* 1 .. 12 */
  double r_tip_m, r_hub_m;     /* tip and hub radius */
  double pitch_offset_deg;     /* added to every station's twist */
  int rotation;                /* +1 counter-clockwise, -1 clockwise, seen from the front */
  size_t n_stations;
  ascr_blade_station *stations; /* ascending radius, hub <= r <= tip */
  size_t n_sections;
  char **section_source;       /* per section: generator spec or resolved file path */
  char **section_name;         /* per section: the name used in the file */
  double envelope_rpm[2];      /* the blade's operating range for its section tables (blade file
                                  "envelope"); NaN (or 0, a blade built in code) when not given */
  double envelope_airspeed_max_m_s; /* its highest airspeed (0 when the file gives none) */
} ascr_blade;

/** Check a blade: counts and ranges, ascending stations within hub..tip, chord > 0, section
 *  indices valid. The message names the field (for example "stations[3].chord").
 *  @return ASCR_OK or ASCR_EGEOM / ASCR_EINVAL. */
ASCR_EXPORT ascr_status ascr_blade_validate(const ascr_blade *b, ascr_errbuf *err);

/** Read a blade file (JSON, schema in docs/file-formats.md). Relative section file paths are
 *  resolved against the file's directory. Messages name the file and the field path.
 *  @return ASCR_OK, ASCR_EIO, ASCR_EPARSE (syntax, with line), ASCR_EINVAL / ASCR_EGEOM. */
ASCR_EXPORT ascr_status ascr_blade_read(const char *path, ascr_blade **out, ascr_errbuf *err);

/** As ascr_blade_read from a text buffer; name labels messages, base_dir resolves paths
 *  (NULL: as given). */
ASCR_EXPORT ascr_status ascr_blade_parse(const char *text, size_t len, const char *name,
                                         const char *base_dir, ascr_blade **out,
                                         ascr_errbuf *err);

/** Free a blade made by ascr_blade_read/_parse; NULL is a no-op. */
ASCR_EXPORT void ascr_blade_free(ascr_blade *b);

/** Air and solver settings. */
typedef struct ascr_rotor_params {
  double density_kg_m3;     /* default 1.225 (ISA sea level) */
  double viscosity_pa_s;    /* dynamic viscosity, default 1.789e-5 (ISA sea level) */
  double sound_speed_m_s;   /* default 340.29 */
  size_t n_elements;        /* blade elements, sine-spaced: fine at the tip (default 40) */
  int tip_loss, hub_loss;   /* Prandtl factors (default on) */
  int swirl;                /* swirl (tangential induction) in the momentum balance (default on) */
  int stall_delay;          /* rotational stall delay of the section lift: ASCR_STALL_DELAY_NONE
                               (default) or ASCR_STALL_DELAY_SNEL */
} ascr_rotor_params;

/** Stall-delay models (ascr_rotor_params.stall_delay). SNEL: the lift of a rotating section
 *  rises towards the attached-flow line by 3 (c/r)^2 of the gap,
 *  cl = cl_2D + 3 (c/r)^2 (cl_lin - cl_2D) where cl_lin > cl_2D (H. Snel, R. Houwink and
 *  J. Bosschers, "Sectional prediction of lift coefficients on rotating wind turbine blades in
 *  stall", ECN-C--93-052, 1994; form from memory), the factor held at most 1 and the correction
 *  faded out from 25 to 45 deg above the zero-lift angle (our choice: the model is not claimed
 *  in deep stall); drag unchanged. docs/theory/rotor.md, "Rotational stall delay". */
enum { ASCR_STALL_DELAY_NONE = 0, ASCR_STALL_DELAY_SNEL = 1 };

/** Defaults as documented above. */
ASCR_EXPORT ascr_rotor_params ascr_rotor_params_defaults(void);

/** International Standard Atmosphere 1976 (troposphere, 0..11 km): density, dynamic viscosity
 *  (Sutherland) and speed of sound at a geopotential altitude. ASCR_EDOM outside -500..11000 m. */
ASCR_EXPORT ascr_status ascr_isa(double altitude_m, double *density_kg_m3, double *viscosity_pa_s,
                                 double *sound_speed_m_s, ascr_errbuf *err);

/** Air at a temperature (K) and static pressure (Pa): density (ideal gas), viscosity
 *  (Sutherland), speed of sound, with the 1976 standard's constants. ASCR_EDOM outside
 *  180..350 K or 10..120 kPa. */
ASCR_EXPORT ascr_status ascr_air_from_tp(double temperature_k, double pressure_pa,
                                         double *density_kg_m3, double *viscosity_pa_s,
                                         double *sound_speed_m_s, ascr_errbuf *err);

/** Chord Reynolds-number range that section `section` of blade b meets over rpm in
 *  rpm_lo..rpm_hi and axial speed in v_lo..v_hi (relative speed without induction, widened by
 *  0.8 and 1.25 for the induced velocities, which change it by less than that at the loadings
 *  of propellers). Elements that blend two sections count for both.
 *  @return ASCR_OK or ASCR_EINVAL. */
ASCR_EXPORT ascr_status ascr_rotor_section_re_range(const ascr_blade *b, size_t section,
                                                    const ascr_rotor_params *p, double rpm_lo,
                                                    double rpm_hi, double v_lo, double v_hi,
                                                    double *re_lo, double *re_hi,
                                                    ascr_errbuf *err);

/** Per-element results. */
typedef struct ascr_rotor_element {
  double r_m, dr_m, chord_m;
  double phi_deg;          /* inflow angle to the plane of rotation */
  double alpha_deg;        /* angle of attack */
  double re, mach;         /* local chord Reynolds and Mach numbers */
  double cl, cd;
  double cm;               /* section pitching moment about the quarter chord (nose-up +) */
  double dM_dr_Nm_m;       /* the air's pitching moment per unit radius on one blade about the
                              quarter chord, 1/2 rho W^2 c^2 cm (nose-up +) */
  double v_axial_m_s;      /* induced axial velocity at the blade (W sin phi - V) */
  double v_swirl_m_s;      /* induced swirl velocity at the blade (Omega r - W cos phi) */
  double loss;             /* Prandtl tip x hub factor (1 in the vortex model) */
  double dT_dr_N_m;        /* thrust per unit radius, all blades */
  double dQ_dr_Nm_m;       /* torque per unit radius, all blades */
  int region;              /* ASCR_TABLE_COMPUTED / _BRIDGED / _EXTENDED */
  int stalled, re_outside, converged;
  int trip_unbound;        /* bit 0 upper, bit 1 lower: the section's trip bound nothing at
                              this angle (ascr_table_sample.trip_unbound): free transition */
} ascr_rotor_element;

/** A point whose thrust rests more than this share on flagged elements (extended, bridged or
 *  outside the table's Re range) is reported with low confidence. 10 %: a choice of ours, the
 *  size of the end-to-end errors the validation set shows with computed polars. */
#define ASCR_ROTOR_LOW_CONFIDENCE_SHARE 0.10

/** Results at one operating point. Numbers of an unconverged point must not be reported as
 *  results (converged = 0). */
typedef struct ascr_rotor_result {
  double rpm, speed_m_s;
  double thrust_N, torque_Nm, power_W;
  double CT, CP, CQ, J;       /* CT = T/(rho n^2 D^4), CP = P/(rho n^3 D^5), CQ = Q/(rho n^2 D^5) */
  double CT_rotor, CP_rotor;  /* rotor convention: T/(rho A (Omega R)^2), P/(rho A (Omega R)^3) */
  double solidity;            /* B int c dr / (pi R^2) over the blade span */
  double CT_over_sigma;       /* blade loading CT_rotor / solidity */
  double re_075;              /* chord Reynolds number at 0.75 R without induction,
                                 rho c sqrt((0.75 Omega R)^2 + V^2) / mu: the reference Re of
                                 small-propeller tests */
  double efficiency;          /* T V / P; NaN unless V > 0, T > 0 and P > 0 */
  double figure_of_merit;     /* T^1.5 / (P sqrt(2 rho A)) in hover (V = 0, T > 0); else NaN */
  double tip_mach;            /* helical tip Mach number (no induction) */
  size_t n_stalled, n_extended, n_re_outside; /* elements flagged */
  size_t n_bridged;           /* elements in a bridged gap of their curve */
  size_t n_trip_unbound;      /* elements where a requested trip bound nothing (free
                                 transition there; not counted in the flagged share: the
                                 numbers are computed ones, of another condition) */
  double flagged_thrust_share; /* share of sum |dT| resting on elements whose coefficients are
                                  not between computed points of their own curves (extended,
                                  bridged, or Re outside the table) */
  int low_confidence;         /* flagged_thrust_share > ASCR_ROTOR_LOW_CONFIDENCE_SHARE */
  int converged;              /* every element solved */
} ascr_rotor_result;

/** BEMT at one operating point. tables[i] serves section i of the blade (b->n_sections
 *  entries). el: NULL or p->n_elements entries. speed_m_s >= 0 (axial, towards the rotor).
 *  @return ASCR_OK (converged or not: see res->converged); ASCR_EINVAL for bad input. */
ASCR_EXPORT ascr_status ascr_rotor_bemt(const ascr_blade *b, const ascr_polar_table *const *tables,
                                        const ascr_rotor_params *p, double rpm, double speed_m_s,
                                        ascr_rotor_result *res, ascr_rotor_element *el,
                                        ascr_errbuf *err);

/** The span of a rotor point over several section-table sets (e.g. N_crit low, nominal, high:
 *  the transition-uncertainty band). */
typedef struct ascr_rotor_band {
  double thrust_N[2], power_W[2], efficiency[2]; /* [min, max]; efficiency NaN unless every
                                                    result has one */
  double re_075;        /* chord Reynolds number at 0.75 R of the first result (as re_075) */
  int complete;         /* every result converged (else the band is over the converged ones) */
  size_t n_used;        /* converged results in the band */
} ascr_rotor_band;

/** Band of n results of one operating point (NaN band when none converged). */
ASCR_EXPORT void ascr_rotor_band_of(const ascr_rotor_result *r, size_t n, ascr_rotor_band *out);

/** Settings of the vortex (helical-wake lifting-line) model. Defaults from the convergence
 *  study in docs/theory/rotor.md ("Vortex model: wake length and discretisation"). */
typedef struct ascr_vortex_params {
  double wake_length_radii;  /* axial length of the modelled wake, tip radii (default 12) */
  double near_step_deg;      /* azimuth step of the wake segments over the first revolution
                                (default 10; later segments grow by 5 % up to 45 deg) */
  double core_widths;        /* vortex core radius, fraction of the narrower neighbouring element
                                (default 0.25): a numerical regularisation, not a physical core */
  int max_wake_iter;         /* wake-pitch updates (default 30) */
} ascr_vortex_params;

/** Defaults as documented above. */
ASCR_EXPORT ascr_vortex_params ascr_vortex_params_defaults(void);

/** Vortex model at one operating point: a lifting line on every blade (bound vortex on the
 *  radial quarter-chord line, one horseshoe per element), trailing vortices on a rigid helical
 *  wake of the blade's radius whose pitch follows the mean axial induced velocity at the blades
 *  (iterated from the BEMT value), Biot-Savart for straight segments with a cut-off core (van
 *  Garrel 2003, ECN-C--03-079), circulation solved with the section tables by Newton's method
 *  (dense Jacobian, LAPACKE dgesv). Results as ascr_rotor_bemt; vp may be NULL.
 *  @return ASCR_OK (converged or not: see res->converged), ASCR_EINVAL, ASCR_ENOMEM. */
ASCR_EXPORT ascr_status ascr_rotor_vortex(const ascr_blade *b, const ascr_polar_table *const *tables,
                                          const ascr_rotor_params *p, const ascr_vortex_params *vp,
                                          double rpm, double speed_m_s, ascr_rotor_result *res,
                                          ascr_rotor_element *el, ascr_errbuf *err);

/** Inflow models. */
typedef enum ascr_inflow { ASCR_INFLOW_BEMT = 0, ASCR_INFLOW_VORTEX = 1 } ascr_inflow;

/** One operating point with the chosen inflow model (vp used by the vortex model; may be
 *  NULL). Returns as ascr_rotor_bemt / ascr_rotor_vortex. */
ASCR_EXPORT ascr_status ascr_rotor_point(const ascr_blade *b, const ascr_polar_table *const *tables,
                                         const ascr_rotor_params *p, ascr_inflow model,
                                         const ascr_vortex_params *vp, double rpm,
                                         double speed_m_s, ascr_rotor_result *res,
                                         ascr_rotor_element *el, ascr_errbuf *err);

/** Find the rpm in rpm_lo..rpm_hi at which the thrust of the chosen model equals thrust_N at
 *  axial speed speed_m_s (GSL's Brent solver on T(rpm) - thrust_N, to 1e-7 relative in rpm).
 *  res and el (may be NULL) hold the solution at that rpm.
 *  @return ASCR_OK; ASCR_EDOM if the thrust is not reached within the rpm range (message gives
 *          the thrust at both ends); ASCR_EMAXITER if the model fails to converge on the way;
 *          ASCR_EINVAL. */
ASCR_EXPORT ascr_status ascr_rotor_rpm_for_thrust(const ascr_blade *b,
                                                  const ascr_polar_table *const *tables,
                                                  const ascr_rotor_params *p, ascr_inflow model,
                                                  const ascr_vortex_params *vp, double thrust_N,
                                                  double speed_m_s, double rpm_lo, double rpm_hi,
                                                  ascr_rotor_result *res, ascr_rotor_element *el,
                                                  ascr_errbuf *err);

/** A rotor whose disc meets the airflow at incidence (a multirotor in forward flight). */
typedef struct ascr_rotor_incidence_result {
  ascr_rotor_result r;        /* thrust (along the axis), torque, power, coefficients, flags;
                                 J and efficiency with the axial component V cos(i) */
  double incidence_deg;       /* between the airflow and the rotor axis: 0 axial, 90 edgewise */
  double v_axial_m_s, v_inplane_m_s; /* V cos(i), V sin(i) */
  double mu;                  /* advance ratio of the in-plane flow, V sin(i) / (Omega R) */
  double h_force_N;           /* in-plane force along the in-plane flow (a drag on the disc) */
  double side_force_N;        /* in-plane force across it, towards the advancing side */
  double roll_moment_Nm;      /* hub moment about the in-plane flow's axis, advancing side up */
  double pitch_moment_Nm;     /* hub moment about the axis across it, downstream side up */
  double induced_mean_m_s;    /* area-weighted mean axial induced velocity */
  double skew_deg;            /* wake skew angle chi, tan chi = V sin(i) / (V cos(i) + v_mean) */
  size_t n_azimuth;
} ascr_rotor_incidence_result;

/** BEMT at incidence: every annulus in Glauert's forward-flight momentum balance,
 *  dT = 4 pi r rho F v sqrt(Vp^2 + (Va + v)^2) dr and dQ = 4 pi r^2 rho F u sqrt(...) dr
 *  (Glauert, ARC R&M 1111, 1926; Leishman, Principles of Helicopter Aerodynamics, 2nd ed.,
 *  2006, ch. 2), against the blade elements averaged over n_azimuth azimuths (each with the
 *  in-plane flow added to its tangential speed, radial flow neglected), the induced velocity
 *  skewed across the disc by the linear inflow of Coleman, Feingold & Stempin (NACA ARR L5E10,
 *  1945): v (1 + tan(chi/2) (r/R) cos psi). With Vp = 0 these are the axial BEMT's equations
 *  (ascr_rotor_bemt, which the tests compare). Per annulus (v, u) by Newton's method, then
 *  alternating bracketed solves where Newton fails; the skew from the disc's mean inflow,
 *  repeated until it settles. n_azimuth 4 .. 360 (0: 24).
 *  @return ASCR_OK (converged or not: res->r.converged), ASCR_EINVAL. */
ASCR_EXPORT ascr_status ascr_rotor_incidence(const ascr_blade *b,
                                             const ascr_polar_table *const *tables,
                                             const ascr_rotor_params *p, double rpm,
                                             double speed_m_s, double incidence_deg,
                                             size_t n_azimuth, ascr_rotor_incidence_result *res,
                                             ascr_errbuf *err);

/** Most airspeeds a summary lists. */
#define ASCR_SUMMARY_MAX_SPEEDS 8

/** The key numbers of a set of operating points of one blade (a rotor map), for comparing
 *  candidates side by side. */
typedef struct ascr_rotor_summary {
  double hover_thrust_N;       /* the thrust asked (NaN: none) */
  double hover_rpm, hover_power_W; /* at that thrust among the static points; NaN outside them */
  int hover_interpolated;      /* 1: between two static points, 0: a point at that thrust */
  double fm_max, fm_max_rpm;   /* the best figure of merit of the static points (NaN: none) */
  size_t n_speeds;             /* airspeeds > 0 among the points, ascending */
  double speed_m_s[ASCR_SUMMARY_MAX_SPEEDS];
  double eta_max[ASCR_SUMMARY_MAX_SPEEDS], eta_max_rpm[ASCR_SUMMARY_MAX_SPEEDS]; /* best
                                  efficiency among the points at that speed, and its rpm */
  size_t n_used;               /* converged points */
} ascr_rotor_summary;

/** Summarise n operating points of one blade (converged ones; rpm, speed_m_s, thrust_N,
 *  power_W, CT, CP, efficiency read). Hover at hover_thrust_N (NaN: none) between the two
 *  static points whose thrusts bracket it, with sqrt(T) and P^(1/3) linear in rpm (exact where
 *  CT and CP are constant between them, T ~ n^2 and P ~ n^3); the figure of merit from the
 *  coefficients, CT^1.5 / (CP sqrt(pi/2)) (= T^1.5 / (P sqrt(2 rho A))); best values among the
 *  points given (not interpolated between rpm). @return ASCR_OK or ASCR_EINVAL. */
ASCR_EXPORT ascr_status ascr_rotor_summarize(const ascr_rotor_result *pts, size_t n,
                                             double hover_thrust_N, ascr_rotor_summary *out,
                                             ascr_errbuf *err);

#ifdef __cplusplus
}
#endif
#endif /* ASCR_ROTOR_H */
