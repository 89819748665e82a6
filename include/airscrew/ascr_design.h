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
