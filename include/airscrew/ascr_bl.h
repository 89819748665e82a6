/* include/airscrew/ascr_bl.h
 * Integral boundary layer on a prescribed edge-velocity distribution: the two-equation
 * method (momentum and kinetic-energy shape parameter) with laminar Falkner-Skan closures, a
 * turbulent closure with a lag equation for the shear-stress coefficient, and e^N envelope
 * transition (Drela & Giles 1987, AIAA J. 25(10); Green, Weeks & Brooman 1977, ARC R&M 3791).
 *
 * This is the "direct" march: the edge velocity is given and the layer is integrated
 * downstream, station by station. It serves for flat plates, stagnation flow and attached
 * layers; it stops, and says so, where the layer separates (the direct problem is singular
 * there). The coupled viscous-inviscid solution of whole sections builds on the same closures.
 *
 * Units: lengths in chord (or any reference length c), speeds in free-stream units V,
 * Re = V c / nu. Thread safety: reentrant; no hidden state.
 */
#ifndef ASCR_BL_H
#define ASCR_BL_H

#include <stddef.h>
#include "airscrew/ascr_errno.h"

#ifdef __cplusplus
extern "C" {
#endif

/** How the layer starts at the first station. */
typedef enum ascr_bl_start {
  ASCR_BL_START_SIMILAR = 0,  /* laminar Falkner-Skan similarity with the local exponent
                                 m = (s/ue) due/ds from the first two stations (m = 1 at a
                                 stagnation point, m = 0 on a flat plate) */
  ASCR_BL_START_TURBULENT = 1 /* turbulent from the first station (tripped at the leading edge) */
} ascr_bl_start;

/** March parameters. */
typedef struct ascr_bl_params {
  double re;          /* Reynolds number V c / nu (> 0) */
  double mach;        /* free-stream Mach number; edge Mach taken as mach * ue (0 .. 0.9) */
  double ncrit;       /* critical amplification exponent for transition (default 9) */
  double s_trip;      /* forced transition at this s, chord units; negative for none */
  ascr_bl_start start;
  double turb_rth_min;   /* least Re_theta at which the turbulent fits are evaluated (default
                          * 320: Preston's minimum for a turbulent layer, J. Fluid Mech. 3, 1958) */
  double turb_rth_width; /* width of the smooth maximum that holds it (default 60; 0: a plain
                          * maximum) */
  double turb_lag_coles; /* weight 0 .. 1 of Coles' bound on the lag thickness (default 1; 0:
                          * the entrainment fit alone) */
} ascr_bl_params;

/** Defaults: Re 1e6, Mach 0, N_crit 9, no trip, similarity start, turbulent Re_theta floor 320 (width 60). */
ASCR_EXPORT ascr_bl_params ascr_bl_params_defaults(void);

/** State at one station. */
typedef struct ascr_bl_station {
  double s;         /* arc length from the start, chord */
  double ue;        /* edge velocity / V */
  double theta;     /* momentum thickness, chord */
  double dstar;     /* displacement thickness, chord */
  double h;         /* shape parameter dstar/theta */
  double hk;        /* kinematic shape parameter */
  double cf;        /* skin-friction coefficient based on ue */
  double cd;        /* dissipation coefficient */
  double re_theta;  /* Re ue theta */
  double n;         /* amplification exponent (laminar stations; N_crit after transition) */
  double ctau;      /* max shear-stress coefficient (turbulent stations; 0 when laminar) */
  int turbulent;    /* 1 if the station is turbulent */
} ascr_bl_station;

/** Outcome of a march. */
typedef struct ascr_bl_result {
  size_t n_done;        /* stations solved; equals n unless the layer separated or failed */
  double s_transition;  /* transition location, chord (NaN if the layer stayed laminar) */
  int forced;           /* 1 if the transition was the trip */
  double s_separation;  /* where the march stopped on separation (NaN if it did not) */
  int max_iterations;   /* largest Newton iteration count at one station */
} ascr_bl_result;

/** March the layer over stations s[0..n-1] (strictly increasing, s[0] > 0 for a similarity
 *  start) with edge velocities ue[0..n-1] (> 0). out[0..n-1] receives the stations (caller
 *  owned; entries past res->n_done are left zero).
 *  @return ASCR_OK (check res->s_separation: the march stops at separation, which is a
 *          property of the flow, not an error); ASCR_EINVAL for bad arguments (message names
 *          the station); ASCR_EMAXITER if the station Newton iteration fails (message names
 *          the station and the residual). */
ASCR_EXPORT ascr_status ascr_bl_march(const double *s, const double *ue, size_t n,
                                      const ascr_bl_params *p, ascr_bl_station *out,
                                      ascr_bl_result *res, ascr_errbuf *err);

/** Critical amplification exponent from the free-stream turbulence level in percent
 *  (Mack 1977): N_crit = -8.43 - 2.4 ln(Tu / 100). Returns NaN for Tu <= 0. */
ASCR_EXPORT double ascr_bl_ncrit_from_turbulence(double tu_percent);

/** A named transition setting for the conditions a propeller designer meets (surface finish,
 *  inflow), as a critical amplification exponent with the basis of its value. */
typedef struct ascr_transition_preset {
  const char *name;   /* e.g. "tunnel", "rotor-inflow", "printed-rough" */
  double ncrit;
  const char *basis;  /* where the value comes from ("common practice" where it is that) */
} ascr_transition_preset;

/** The presets (static storage), *n receives their count. */
ASCR_EXPORT const ascr_transition_preset *ascr_transition_presets(size_t *n);

/** The preset called name, or NULL. */
ASCR_EXPORT const ascr_transition_preset *ascr_transition_preset_find(const char *name);

#ifdef __cplusplus
}
#endif
#endif /* ASCR_BL_H */
