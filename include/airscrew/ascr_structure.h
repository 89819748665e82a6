/* include/airscrew/ascr_structure.h
 * Blade structure: the section properties of a solid blade section.
 *
 * Method (docs/theory/structure.md): the section's contour (chord-normalised coordinates,
 * the trailing-edge gap closed by a straight line) scaled by the chord is a simple polygon; its
 * area, centroid and second moments follow exactly from Green's theorem over the polygon's
 * edges (e.g. Steger, "On the calculation of arbitrary moments of polygons", TU Munich
 * FGBV-96-05, 1996; from memory). The torsion constant of a solid section is Saint-Venant's
 * approximation J = A^4 / (4 pi^2 Ip), Ip the polar second moment about the centroid (Timoshenko
 * & Goodier, Theory of Elasticity, 3rd ed. 1970, ch. 10; from memory): exact for the ellipse,
 * within about 10 % for compact and thin solid sections (8.1 % high for the square, 3.6 % low
 * for a 10:1 rectangle: tests/structure/test_section_props.c).
 *
 * Axes: x along the chord from the leading edge towards the trailing edge, y normal to it
 * (upper surface positive). Thread safety: reentrant.
 */
#ifndef ASCR_STRUCTURE_H
#define ASCR_STRUCTURE_H

#include <stddef.h>
#include "airscrew/ascr_errno.h"
#include "airscrew/ascr_geom.h"
#include "airscrew/ascr_rotor.h"

#ifdef __cplusplus
extern "C" {
#endif

/** Properties of a solid section (SI units: m, m^2, m^4). */
typedef struct ascr_section_props {
  double area;                /* A */
  double x_c, y_c;            /* centroid */
  double i_xx, i_yy, i_xy;    /* about the centroid: int (y - y_c)^2 dA (bending out of the chord
                                 plane), int (x - x_c)^2 dA (bending in it), int (x - x_c)(y - y_c) dA */
  double i_1, i_2;            /* principal second moments, i_1 >= i_2 */
  double principal_deg;       /* angle from the x axis to the axis of i_1, degrees (-90 .. 90] */
  double j_torsion;           /* torsion constant, A^4 / (4 pi^2 (i_xx + i_yy)) */
} ascr_section_props;

/** Properties of the polygon (x[i], y[i]), i < n (n >= 3, closed from the last vertex back to
 *  the first; either orientation), every coordinate multiplied by scale (> 0).
 *  @return ASCR_OK; ASCR_EINVAL (bad arguments); ASCR_EGEOM (no area). */
ASCR_EXPORT ascr_status ascr_section_props_polygon(const double *x, const double *y, size_t n,
                                                   double scale, ascr_section_props *out,
                                                   ascr_errbuf *err);

/** Properties of a section (its contour as read or generated) at chord chord_m.
 *  @return as ascr_section_props_polygon. */
ASCR_EXPORT ascr_status ascr_section_props_of(const ascr_geom_section *s, double chord_m,
                                              ascr_section_props *out, ascr_errbuf *err);

/* ---- materials ------------------------------------------------------------------------ */

/** One material property with where it comes from. */
typedef struct ascr_material_value {
  double value;               /* SI units; NaN: not known */
  char source[160];           /* e.g. "datasheet class, typical" */
} ascr_material_value;

/** A blade material (file schema: docs/file-formats.md, "Material file"). */
typedef struct ascr_material {
  char name[160];
  ascr_material_value density_kg_m3;
  ascr_material_value elastic_modulus_pa;
  ascr_material_value shear_modulus_pa;   /* given, or E / (2 (1 + nu)) (isotropic) */
  ascr_material_value poisson_ratio;      /* given, or 0.35 (common practice for polymers) */
  ascr_material_value tensile_strength_pa;
  ascr_material_value fatigue_limit_pa;   /* NaN where the file gives none */
} ascr_material;

/** Read a material file (JSON, "airscrew-material-1"); messages name the file and the field.
 *  @return ASCR_OK, ASCR_EIO, ASCR_EPARSE, ASCR_EINVAL. */
ASCR_EXPORT ascr_status ascr_material_read(const char *path, ascr_material *out, ascr_errbuf *err);
/** As ascr_material_read from a buffer; name labels messages. */
ASCR_EXPORT ascr_status ascr_material_parse(const char *text, size_t len, const char *name,
                                            ascr_material *out, ascr_errbuf *err);

/* ---- the blade under load ------------------------------------------------------------- */

/** Most stations of a structural analysis. */
#define ASCR_STRUCTURE_MAX_STATIONS 401

/** One station of the blade (SI units). Rotor frame: flap = bending out of the plane of
 *  rotation (by thrust), lag = bending in it (by the torque's in-plane forces). */
typedef struct ascr_structure_station {
  double r_m, chord_m, twist_deg;
  ascr_section_props props;        /* in the section's axes (sections blended as the rotor does) */
  double mass_per_length_kg_m;     /* rho A */
  double ei_flap_nm2, ei_lag_nm2;  /* E I about the in-plane tangential axis and the rotor axis:
                                      the section's tensor turned by the twist */
  double gj_nm2;                   /* G J */
  double centrifugal_force_N;      /* carried at r: int_r^R rho A Omega^2 r' dr' */
  double moment_flap_Nm, moment_lag_Nm; /* from the air loads outboard (one blade) */
  double moment_twist_Nm;          /* the twisting moment carried at r (positive nose-up): the
                                      centrifugal int_r^R -rho Omega^2 (I_yy - I_xx) sin th cos th
                                      dr' plus the air's (moment_twist_air_Nm) */
  double moment_twist_air_Nm;      /* the air's share: int_r^R dM/dr dr' of the elements'
                                      pitching moments about the quarter chord (the twist axis) */
  double stress_pa;                /* centrifugal tension plus the largest bending stress over the
                                      section's contour (its sign not distinguished) */
} ascr_structure_station;

typedef struct ascr_structure_summary {
  double mass_kg, volume_m3;       /* one blade, root station to tip */
  double cg_r_m;                   /* radius of its centre of mass */
  double root_centrifugal_N;       /* centrifugal force at the root station */
  double max_stress_pa, max_stress_r_m;
  double safety_factor;            /* tensile strength / max_stress */
  double fatigue_factor;           /* fatigue limit / max_stress (NaN: no fatigue limit given) */
  double tip_deflection_m;         /* flap, clamped at the root station, static and without
                                      centrifugal stiffening (an upper bound) */
  double tip_pitch_change_deg;     /* the elastic twist at the tip under the twisting moment,
                                      int M_twist / GJ dr (negative: towards flat pitch) */
  double tip_pitch_change_air_deg; /* the part of it due to the air's pitching moment */
} ascr_structure_summary;

/** The blade b (sections[i]: the contour of section i) of material m at rpm under the air
 *  loads el (n_el rotor elements of one point, dT/dr and dQ/dr of all blades; NULL: none) on
 *  n stations evenly spaced from the first blade station to the tip (3 .. ASCR_STRUCTURE_MAX_
 *  STATIONS; st[n] by the caller). Centrifugal force by the trapezoidal rule; bending moments
 *  of the loads outboard, M(r) = int_r^R q(r') (r' - r) dr' with the elements' loads constant
 *  over each element; stresses by the flexure formula for unsymmetric sections (Gere &
 *  Timoshenko, Mechanics of Materials, ch. 6); the tip deflection by integrating M / EI twice
 *  from the clamped root (Euler-Bernoulli); the tip's pitch change by integrating the
 *  centrifugal twisting moment and the air's pitching moment (the elements' dM_dr_Nm_m about
 *  the quarter chord, taken as the twist axis) over GJ. @return ASCR_OK, ASCR_EINVAL, ASCR_EGEOM. */
ASCR_EXPORT ascr_status ascr_blade_structure(const ascr_blade *b,
                                             const ascr_geom_section *const *sections,
                                             const ascr_material *m, double rpm,
                                             const ascr_rotor_element *el, size_t n_el, size_t n,
                                             ascr_structure_station *st,
                                             ascr_structure_summary *sum, ascr_errbuf *err);

/* ---- rotating modes ------------------------------------------------------------------- */

/** Modes reported per family. */
#define ASCR_MODES_MAX 4

typedef struct ascr_modes_params {
  int hinged_root;            /* 0 (default): clamped at the root station; 1: a flapping hinge
                                 there (w = 0 only; the checks against the rotating string) */
  size_t n_modes;             /* per family, 1 .. ASCR_MODES_MAX (default 3) */
} ascr_modes_params;

ASCR_EXPORT ascr_modes_params ascr_modes_params_defaults(void);

/** Natural frequencies at one rpm, lowest first (Hz); NaN where a mode is unstable (a lag
 *  "frequency" squared below zero) or missing. */
typedef struct ascr_blade_modes {
  double rpm;
  double flap_hz[ASCR_MODES_MAX], lag_hz[ASCR_MODES_MAX], torsion_hz[ASCR_MODES_MAX];
  size_t n_modes;
} ascr_blade_modes;

/** Modes of the rotating blade from its stations (ascr_blade_structure: r, mass per length,
 *  EI_flap, EI_lag, GJ and the sections' I_xx, I_yy and twist; n >= 3 stations, the first the
 *  root): uncoupled flap and lag bending by Euler-Bernoulli finite elements (Hermite cubics,
 *  consistent mass) with the centrifugal tension's geometric stiffness, lag also with the
 *  in-plane -Omega^2 m term, and torsion by linear elements with the propeller-moment term
 *  Omega^2 rho (I_yy - I_xx) cos 2 theta; each a symmetric-definite eigenproblem (LAPACKE
 *  dsygv). The centrifugal tension is recomputed at this rpm from the mass per length.
 *  @return ASCR_OK, ASCR_EINVAL, ASCR_ENOMEM, ASCR_ESING (the eigen solver failed). */
ASCR_EXPORT ascr_status ascr_blade_modes_at(const ascr_structure_station *st, size_t n, double rpm,
                                            const ascr_modes_params *p, ascr_blade_modes *out,
                                            ascr_errbuf *err);

/** Where a mode's frequency meets an engine order: f_mode(rpm) = order x rpm / 60. */
typedef struct ascr_campbell_crossing {
  int family;                 /* 0 flap, 1 lag, 2 torsion */
  size_t mode;                /* 0: the lowest of its family */
  int order;                  /* 1 .. max_order (1P, 2P, ...) */
  double rpm, hz;             /* linear between the two neighbouring rpm of the map */
} ascr_campbell_crossing;

/** The crossings of the modes m[0 .. n-1] (ascending rpm) with the orders 1 .. max_order (a
 *  sign change of f - order rpm/60 between neighbouring rpm; a mode exactly on a line at a
 *  computed rpm counts once). Up to max_out written to out; returns how many there are. */
ASCR_EXPORT size_t ascr_campbell_crossings(const ascr_blade_modes *m, size_t n, int max_order,
                                           ascr_campbell_crossing *out, size_t max_out);

#ifdef __cplusplus
}
#endif
#endif /* ASCR_STRUCTURE_H */
