/* include/airscrew/ascr_design.h
 * Blade design: the minimum-induced-loss (MIL) blade for a design point.
 *
 * Method (docs/theory/design.md): the Betz condition with Prandtl's tip (and hub) factor in the
 * form of Adkins & Liebeck (J. Propulsion and Power 10(5), 1994, 676-682; after Larrabee, SAE
 * 790585, 1979), written in the displacement velocity v' rather than its ratio to the airspeed
 * so that hover (V = 0) is the same equations: the wake moves as a rigid helicoid at v', the
 * flow angle is tan(phi) = (V + v'/2) / (Omega r), the circulation
 * Gamma = 2 pi r F v' sin(phi) cos(phi) / B, and the velocity at the blade follows from the
 * interference factors with the drag-to-lift ratio eps = cd/cl:
 *   W sin(phi) = V + (v'/2) cos^2(phi) (1 - eps tan(phi)),
 *   chord = 2 Gamma / (W cl),  dT/dr = B rho W Gamma (cos phi - eps sin phi),
 *   dQ/dr = B rho W Gamma r (sin phi + eps cos phi).
 * In hover these give the ideal rotor's uniform inflow v'/2 (twist ~ 1/r: Leishman, Principles
 * of Helicopter Aerodynamics, 2nd ed., 2006, sec. 3.3). v' is found by Brent's method to meet the
 * thrust or the shaft power. The design lift coefficient per station is given, or chosen where
 * the section's table has its best cl/cd at the station's own Reynolds and Mach numbers (the
 * chord sets the Re, the Re the polar: iterated per station).
 *
 * Thread safety: reentrant.
 */
#ifndef ASCR_DESIGN_H
#define ASCR_DESIGN_H

#include <stddef.h>
#include "airscrew/ascr_errno.h"
#include "airscrew/ascr_rotor.h"

#ifdef __cplusplus
extern "C" {
#endif

/** Most stations of a design. */
#define ASCR_MIL_MAX_STATIONS 200

typedef struct ascr_mil_spec {
  int n_blades;              /* 1 .. 12 */
  double r_tip_m, r_hub_m;   /* the blade spans hub .. tip */
  double rpm, speed_m_s;     /* design point (speed 0: hover) */
  double thrust_N;           /* > 0: design for this thrust ... */
  double power_W;            /* ... else for this shaft power (> 0) */
  size_t n_stations;         /* 3 .. ASCR_MIL_MAX_STATIONS (default 21), cosine-spaced */
  double cl_design;          /* design lift coefficient at every station; NaN: each station's
                                best cl/cd from its table */
  size_t n_sections;         /* sections over the span (tables[i] for section i) */
  const double *section_from_r_m; /* section i from this radius outwards (ascending; the first
                                     <= r_hub); NULL with one section */
  double alpha_lo_deg, alpha_hi_deg; /* range searched for the best cl/cd (default -4 .. 12) */
  double min_chord_m;        /* chords below are raised to it (the loss factor's zero at the
                                tip and hub; default 2 % of the tip radius) */
} ascr_mil_spec;

/** Defaults: 2 blades, 21 stations, cl auto, alpha -4 .. 12, no radii or design point. */
ASCR_EXPORT ascr_mil_spec ascr_mil_spec_defaults(void);

typedef struct ascr_mil_station {
  double r_m, chord_m, twist_deg;
  double phi_deg, alpha_deg, cl, cd, re, mach;
  double loss;               /* Prandtl factor F */
  double circulation;        /* Gamma, m^2/s */
  size_t section;
  int chord_raised;          /* the chord was raised to the minimum */
} ascr_mil_station;

typedef struct ascr_mil_result {
  double v_displacement_m_s; /* v' */
  double thrust_N, power_W, efficiency; /* of the design by its own equations */
  ascr_rotor_result analysis; /* the designed blade analysed by the BEMT at the design point */
  size_t n;
  ascr_mil_station st[ASCR_MIL_MAX_STATIONS];
  int converged;
} ascr_mil_result;

/** Design the MIL blade for spec with section tables (one per section) and air p (NULL:
 *  defaults). The blade (stations: out->st; sections by index) is analysed by ascr_rotor_bemt
 *  at the design point (out->analysis).
 *  @return ASCR_OK; ASCR_EINVAL (spec); ASCR_EDOM (the thrust or power cannot be reached);
 *          ASCR_EMAXITER. */
ASCR_EXPORT ascr_status ascr_mil_design(const ascr_mil_spec *spec,
                                        const ascr_polar_table *const *tables,
                                        const ascr_rotor_params *p, ascr_mil_result *out,
                                        ascr_errbuf *err);

/** The designed blade as an ascr_blade whose stations point into st (n entries, owned by the
 *  caller; sections by index, no names). */
ASCR_EXPORT void ascr_mil_blade(const ascr_mil_spec *spec, const ascr_mil_result *res,
                                ascr_blade_station *st, ascr_blade *b);

/* ---- constrained multi-point design ------------------------------------------------- */

/** Most operating points and control points of an optimisation. */
#define ASCR_OPT_MAX_POINTS 8
#define ASCR_OPT_MAX_CONTROL 8

/** One operating point of a multi-point design: the rpm is trimmed (BEMT) until the blade
 *  gives thrust_N at the axial airspeed; the point's shaft power, times its weight, enters
 *  the objective. */
typedef struct ascr_opt_point {
  double speed_m_s;          /* axial airspeed, >= 0 */
  double thrust_N;           /* > 0 */
  double weight;             /* > 0 (e.g. the share of flight time at the point) */
} ascr_opt_point;

/** The optimisation problem (docs/theory/design.md, "Multi-point design"). */
typedef struct ascr_opt_spec {
  size_t n_points;                       /* 1 .. ASCR_OPT_MAX_POINTS */
  ascr_opt_point points[ASCR_OPT_MAX_POINTS];
  size_t n_control;                      /* control points of chord and of twist, evenly
                                            spaced hub .. tip: 2 .. ASCR_OPT_MAX_CONTROL
                                            (default 5) */
  double chord_min_m, chord_max_m;       /* every chord stays inside (required, min > 0) */
  double min_thickness_m;                /* chord x thickness ratio of its section at least
                                            this (0: none; needs section_thickness) */
  const double *section_thickness;       /* thickness/chord per section (NULL: none known) */
  double max_tip_mach;                   /* helical tip Mach at every point at most this
                                            (NaN or 0: no limit) */
  double rpm_lo, rpm_hi;                 /* range of the rpm trims (> 0) */
  int allow_extended;                    /* 0 (default): a point whose thrust rests on flagged
                                            elements (extended or bridged polars, Re outside
                                            the table) beyond ASCR_ROTOR_LOW_CONFIDENCE_SHARE
                                            is penalised like a violated limit; 1: not */
  int max_iterations;                    /* simplex iterations (default 3000) */
  double tolerance;                      /* stop when the simplex's size (in the scaled
                                            variables) falls below (default 1e-3) */
} ascr_opt_spec;

/** Defaults: 5 control points, 3000 iterations, tolerance 1e-3, no tip-Mach or thickness
 *  limit; no points, chord bounds or rpm range. */
ASCR_EXPORT ascr_opt_spec ascr_opt_spec_defaults(void);

/** An operating point of the optimised blade. */
typedef struct ascr_opt_point_result {
  double rpm, thrust_N, power_W, tip_mach;
  double efficiency, figure_of_merit;    /* NaN where not defined (see ascr_rotor_result) */
  double tip_mach_margin;                /* max_tip_mach - tip_mach (NaN without a limit) */
  double flagged_thrust_share;           /* as ascr_rotor_result */
  int low_confidence;                    /* the analysis leans on extended polars */
  int trimmed;                           /* the thrust was reached inside the rpm range */
} ascr_opt_point_result;

typedef struct ascr_opt_result {
  size_t n;                              /* stations (the start blade's radii) */
  ascr_blade_station st[ASCR_MIL_MAX_STATIONS];
  size_t n_control;
  double control_r_m[ASCR_OPT_MAX_CONTROL], control_chord_m[ASCR_OPT_MAX_CONTROL],
      control_twist_deg[ASCR_OPT_MAX_CONTROL];
  double objective_W, start_objective_W; /* sum of weight x power (the start's on the control
                                            points, its chords inside the bounds) */
  int start_feasible;                    /* the start keeps every limit (if not, the optimised
                                            blade may need more power than it) */
  ascr_opt_point_result points[ASCR_OPT_MAX_POINTS];
  ascr_opt_point_result start_points[ASCR_OPT_MAX_POINTS];
  double chord_margin_m;                 /* smallest distance of a chord to its bounds */
  double thickness_margin_m;             /* smallest chord x t/c - min_thickness (NaN: none) */
  int iterations, evaluations;
  double simplex_size;                   /* at the end */
  int converged;                         /* simplex size below the tolerance */
  int feasible;                          /* every point trimmed, every limit kept */
} ascr_opt_result;

/** Optimise chord and twist of a start blade (its radii, sections and blade count are kept)
 *  for the weighted shaft power of the operating points, with the limits of o: chord and twist
 *  as monotone cubic (Steffen) interpolants of n_control values, chords bounded by a logistic
 *  transform, the other limits (tip Mach, thickness, and unless allowed the share of thrust on
 *  flagged polars) by exterior quadratic penalties that leave violations of order 1e-5 of the
 *  limit (a blade is reported feasible within 1e-4); GSL's Nelder-Mead simplex
 *  (nmsimplex2). The start blade must trim every point. tables as for the rotor models.
 *  @return ASCR_OK (converged or not: out->converged, out->feasible); ASCR_EINVAL; ASCR_EDOM
 *          (the start blade does not reach a point's thrust); ASCR_ENOMEM. */
ASCR_EXPORT ascr_status ascr_design_optimize(const ascr_blade *start,
                                             const ascr_polar_table *const *tables,
                                             const ascr_rotor_params *p, const ascr_opt_spec *o,
                                             ascr_opt_result *out, ascr_errbuf *err);

/* ---- design specification files ------------------------------------------------------ */

/** Most sections a design spans. */
#define ASCR_DESIGN_MAX_SECTIONS 8

/** A design specification (file schema in docs/file-formats.md, "Design specification"). */
typedef struct ascr_design_spec {
  char *name;                  /* may be NULL */
  ascr_mil_spec mil;           /* its section_from_r_m points into from_r */
  double from_r[ASCR_DESIGN_MAX_SECTIONS];
  ascr_blade *layout;          /* the sections (names, sources resolved) on a provisional layout
                                  whose chords (0.3 R inboard to the minimum at the tip) bound
                                  the Reynolds numbers the design can need: the tables' range */
  int optimize;                /* the file asks for the multi-point design ("optimize") */
  ascr_opt_spec opt;           /* its problem (section_thickness points into thickness) */
  double thickness[ASCR_DESIGN_MAX_SECTIONS]; /* t/c of each span's section */
} ascr_design_spec;

/** Read a design specification (JSON). Section files are resolved against the file's folder;
 *  messages name the file and the field. @return ASCR_OK, ASCR_EIO, ASCR_EPARSE, ASCR_EINVAL. */
ASCR_EXPORT ascr_status ascr_design_spec_read(const char *path, ascr_design_spec **out,
                                              ascr_errbuf *err);
/** As ascr_design_spec_read from a text buffer; name labels messages, base_dir resolves section
 *  files (NULL: as given). */
ASCR_EXPORT ascr_status ascr_design_spec_parse(const char *text, size_t len, const char *name,
                                               const char *base_dir, ascr_design_spec **out,
                                               ascr_errbuf *err);
ASCR_EXPORT void ascr_design_spec_free(ascr_design_spec *s);

/** The designed blade with the specification's sections (names and sources copied), ready for
 *  the rotor models or for ascr_blade_to_json. @return ASCR_OK or ASCR_ENOMEM. */
ASCR_EXPORT ascr_status ascr_design_blade(const ascr_design_spec *s, const ascr_mil_result *r,
                                          ascr_blade **out, ascr_errbuf *err);

/** A blade as a blade file (JSON text, "airscrew-blade-1", lengths in mm; file sections by
 *  absolute path). *text is allocated (free()). @return ASCR_OK or ASCR_ENOMEM. */
ASCR_EXPORT ascr_status ascr_blade_to_json(const ascr_blade *b, char **text, size_t *len,
                                           ascr_errbuf *err);

#ifdef __cplusplus
}
#endif
#endif /* ASCR_DESIGN_H */
