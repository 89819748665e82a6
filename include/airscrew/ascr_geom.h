/* include/airscrew/ascr_geom.h
 * Section geometry: read coordinate files, generate NACA 4/5-digit and thin cambered-plate
 * sections, repanel on an arc-length spline, and measure the shape.
 *
 * A section (ascr_geom_section) is an ordered closed-or-nearly-closed contour normalised to
 * unit chord: node 0 is the trailing edge of the upper surface, the nodes run over the upper
 * surface to the leading edge (at the origin) and back along the lower surface to node n-1,
 * the lower trailing edge. This is the counter-clockwise sense (x to the right, y up), so the
 * body interior lies to the left of the direction of travel. The chord line runs from the
 * leading edge (0,0) to the trailing-edge midpoint (1,0).
 *
 * Thread safety: all functions are reentrant; a section object may be read from several
 * threads at once once built.
 */
#ifndef ASCR_GEOM_H
#define ASCR_GEOM_H

#include <stddef.h>
#include "airscrew/ascr_errno.h"

#ifdef __cplusplus
extern "C" {
#endif

/** Opaque section object. Create with ascr_geom_section_read(), _from_points(), _from_spec(),
 *  ascr_geom_naca(), ascr_geom_plate() or ascr_geom_section_repanel(); free with
 *  ascr_geom_section_free(). */
typedef struct ascr_geom_section ascr_geom_section;

/** How a coordinate list was laid out in its file. */
typedef enum ascr_geom_layout {
  ASCR_GEOM_LAYOUT_CONTOUR = 0,     /* one run around the contour, trailing edge to trailing edge */
  ASCR_GEOM_LAYOUT_TWO_SURFACES = 1 /* two runs, each from the leading edge to the trailing edge */
} ascr_geom_layout;

/** What was done while loading a point list (filled by the readers; may be NULL). */
typedef struct ascr_geom_load_info {
  size_t n_points_read;     /* coordinate rows accepted (a count row is not counted) */
  ascr_geom_layout layout;  /* layout detected */
  int reversed;             /* 1 if the contour was reversed to run over the upper surface first */
  int had_count_row;        /* 1 if a leading row of two surface point counts was recognised */
  int merged_le_duplicate;  /* 1 if the leading-edge point shared by two surfaces was merged */
  double chord_orig;        /* chord of the input, input length units */
  double rotation_deg;      /* angle by which the input was rotated to put the chord on x, deg */
  double le_x_orig;         /* leading edge position in the input, input length units */
  double le_y_orig;
  double te_gap;            /* trailing-edge gap after normalisation, chord units */
  char title[128];          /* title line, if the file had one, else empty */
} ascr_geom_load_info;

/** Largest trailing-edge gap accepted for a contour before it is called open, chord units. */
#define ASCR_GEOM_MAX_TE_GAP 0.05
/** Fewest points a coordinate list must have. */
#define ASCR_GEOM_MIN_POINTS 8

/** Read a plain x-y coordinate file (see docs/file-formats.md).
 *  @param path  file to read (copied; not kept).
 *  @param out   on success *out is a new section the caller frees with ascr_geom_section_free();
 *               on failure *out is set to NULL.
 *  @param info  optional; filled on success.
 *  @param err   optional; on failure holds "<path>:<line>: <what is wrong>".
 *  @return ASCR_OK, ASCR_EIO (unreadable), ASCR_EPARSE (bad text), ASCR_EGEOM (bad shape),
 *          ASCR_ENOMEM. */
ASCR_EXPORT ascr_status ascr_geom_section_read(const char *path, ascr_geom_section **out,
                                               ascr_geom_load_info *info, ascr_errbuf *err);

/** As ascr_geom_section_read() but from text in memory; name is used in messages (copied). */
ASCR_EXPORT ascr_status ascr_geom_section_parse(const char *text, size_t len, const char *name,
                                                ascr_geom_section **out,
                                                ascr_geom_load_info *info, ascr_errbuf *err);

/** Build a section from a point list in either layout (arrays copied). Line numbers in
 *  messages are 1-based point indices. Same returns as ascr_geom_section_read(). */
ASCR_EXPORT ascr_status ascr_geom_section_from_points(const double *x, const double *y, size_t n,
                                                      const char *name, ascr_geom_section **out,
                                                      ascr_geom_load_info *info,
                                                      ascr_errbuf *err);

/** NACA 4-digit ("2412") or 5-digit ("23012") section (Abbott & von Doenhoff 1959, sec. 6.4;
 *  NACA Report 460 and 537), n_side points per surface on a cosine spacing (n_side >= 8),
 *  closed_te = 1 for the closed-trailing-edge thickness variant (a4 = -0.1036).
 *  Returns ASCR_EPARSE for an unknown designation, ASCR_EDOM for reflexed 5-digit mean lines. */
ASCR_EXPORT ascr_status ascr_geom_naca(const char *digits, int closed_te, size_t n_side,
                                       ascr_geom_section **out, ascr_errbuf *err);

/** Parameters of the thin cambered plate, all as fractions of chord. */
typedef struct ascr_geom_plate_params {
  double thickness;     /* plate thickness t/c (0.002 .. 0.2) */
  double camber;        /* maximum camber f/c (0 .. 0.15) */
  double camber_pos;    /* x/c of the maximum camber (0.1 .. 0.9) */
  double nose_length;   /* length of the elliptic nose, in multiples of the thickness (0.5 .. 5) */
  double taper_length;  /* chord fraction over which the thickness tapers to the TE (0 .. 0.6) */
  double te_thickness;  /* trailing-edge thickness t_te/c (0 .. thickness) */
} ascr_geom_plate_params;

/** Default plate: 3 % thick, 4 % camber at 50 %, 1-thickness nose, 20 % taper, sharp TE. */
ASCR_EXPORT ascr_geom_plate_params ascr_geom_plate_defaults(void);

/** Thin cambered plate (our construction, docs/theory/geometry.md): NACA-style two-parabola
 *  camber line, constant thickness with an elliptic nose and a tapered trailing edge, thickness
 *  laid perpendicular to the camber line. ASCR_EDOM for parameters outside their ranges. */
ASCR_EXPORT ascr_status ascr_geom_plate(const ascr_geom_plate_params *p, size_t n_side,
                                        ascr_geom_section **out, ascr_errbuf *err);

/** Parse a generator spec: "naca2412", "naca0012c" (closed TE), "naca23012", or
 *  "plate:t=3,f=4,xf=50[,nose=1][,taper=20][,te=0]" (percent of chord; nose in thicknesses).
 *  Returns ASCR_EPARSE for text that is not a spec (so the caller may try it as a file). */
ASCR_EXPORT ascr_status ascr_geom_section_from_spec(const char *spec, ascr_geom_section **out,
                                                    ascr_errbuf *err);

/** Nonzero if text has the form of a generator spec (naca..., plate:...). */
ASCR_EXPORT int ascr_geom_is_spec(const char *text);

/** Open a section named as in a blade file or on a command line: an existing coordinate file
 *  (ascr_geom_section_read), else a generator spec (ascr_geom_section_from_spec).
 *  @return ASCR_OK; ASCR_EIO (a folder; unreadable); the reader's or generator's status;
 *          ASCR_EINVAL when source is neither a file nor a spec (the message lists the spec
 *          forms). */
ASCR_EXPORT ascr_status ascr_geom_section_open(const char *source, ascr_geom_section **out,
                                               ascr_errbuf *err);

/** Repanelling parameters. */
typedef struct ascr_geom_repanel_params {
  size_t n_panels;       /* panels on the contour (nodes = n_panels + 1), 20 .. 2000 */
  double curv_weight;    /* node density gain with curvature (dimensionless) */
  double te_weight;      /* extra node density at the trailing edge (ratio - 1) */
  double te_extent;      /* arc-length scale of trailing-edge clustering, chord units */
} ascr_geom_repanel_params;

/** Default panel count, chosen by the convergence study in docs/theory/panel-convergence.md. */
#define ASCR_GEOM_DEFAULT_PANELS 160

/** Defaults: ASCR_GEOM_DEFAULT_PANELS panels and the documented clustering. */
ASCR_EXPORT ascr_geom_repanel_params ascr_geom_repanel_defaults(void);

/** The panel count of a viscous analysis at chord Reynolds number re: ASCR_GEOM_DEFAULT_PANELS
 *  up to Re 1e6, 240 above it and 320 above 6.5e6. A leading-edge transition at high Re falls
 *  within a few hundredths of the chord, and 160 panels leave its interval too long for the
 *  young turbulent layer (it runs to the closure's floor and the Newton iteration stalls).
 *  Measured, converged points of 41 (NACA 0012 -2..18 deg, NACA 4412 and 2412 -4..16 deg):
 *  NACA 0012 at 2e6 / 3e6 / 6e6: 36 / 37 / 29 at 160 panels, 41 / 41 / 38 at 240; at 8e6 and
 *  1e7, 38 and 36 at 240, 40 and 39 at 320; NACA 4412 at 3e6 and 6e6: 37 and 35 at 160, 41 and
 *  41 at 240; NACA 2412 at 3e6: 39 and 41; SD7003 at 2e6: 38 and 41 (docs/theory/viscous.md,
 *  "Known limits"). Up to 1e6 the count stays at the default and every result there is the
 *  one of the convergence study. A NaN or non-positive re gives the default. */
ASCR_EXPORT size_t ascr_geom_panels_for_re(double re);

/** Respace the nodes of a section along a cubic spline of its arc length, with nodes clustered
 *  where the curvature is high and near the trailing edge, and one node at the leading edge.
 *  *out is new (caller frees); the input is unchanged. */
ASCR_EXPORT ascr_status ascr_geom_section_repanel(const ascr_geom_section *in,
                                                  const ascr_geom_repanel_params *p,
                                                  ascr_geom_section **out, ascr_errbuf *err);

/** Shape metrics, chord units (thickness and camber measured normal to the chord line). */
typedef struct ascr_geom_metrics {
  double thickness;       /* maximum thickness t/c */
  double thickness_x;     /* x/c of the maximum thickness */
  double camber;          /* maximum camber (signed, largest magnitude) */
  double camber_x;        /* x/c of the maximum camber */
  double le_radius;       /* leading-edge radius of curvature / c */
  double te_gap;          /* distance between the two trailing-edge points / c */
  double te_angle_deg;    /* included angle between the surfaces at the trailing edge, deg */
  double area;            /* enclosed area / c^2 (gap closed by a straight line) */
  double arc_length;      /* perimeter from upper TE to lower TE / c */
} ascr_geom_metrics;

/** Measure a section. ASCR_EGEOM if the surfaces cannot be separated into upper and lower. */
ASCR_EXPORT ascr_status ascr_geom_section_metrics(const ascr_geom_section *s,
                                                  ascr_geom_metrics *m, ascr_errbuf *err);

/** Number of nodes. */
ASCR_EXPORT size_t ascr_geom_section_size(const ascr_geom_section *s);
/** Node coordinates, chord units (owned by the object; valid until ascr_geom_section_free()). */
ASCR_EXPORT const double *ascr_geom_section_x(const ascr_geom_section *s);
ASCR_EXPORT const double *ascr_geom_section_y(const ascr_geom_section *s);
/** Index of the node at (or nearest) the leading edge. */
ASCR_EXPORT size_t ascr_geom_section_le_index(const ascr_geom_section *s);
/** Name of the section (owned by the object). */
ASCR_EXPORT const char *ascr_geom_section_name(const ascr_geom_section *s);
/** Free a section; NULL is a no-op. */
ASCR_EXPORT void ascr_geom_section_free(ascr_geom_section *s);

#ifdef __cplusplus
}
#endif
#endif /* ASCR_GEOM_H */
