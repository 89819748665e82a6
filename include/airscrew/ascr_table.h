/* include/airscrew/ascr_table.h
 * Section coefficient tables for the rotor: cl, cd, cm over angle of attack (-180..180 deg)
 * and chord Reynolds number, built from computed polars (one curve per Re), smoothly
 * interpolated, and extended beyond the computed range by the post-stall model of Viterna &
 * Corrigan (1982, NASA CP-2230, pp. 69-85). Compressibility by a Prandtl-Glauert factor on
 * the lift of the attached range.
 *
 * How a curve becomes a table (docs/theory/rotor.md, "Section tables"):
 * - only converged points are used; a run of unconverged points inside the converged range is
 *   bridged by a monotone cubic (Steffen 1990, A&A 239:443) through the converged neighbours
 *   and the lookups there are flagged ASCR_TABLE_BRIDGED;
 * - beyond the highest converged angle the Viterna-Corrigan relations continue from that point
 *   up to 90 deg, then a flat plate to 180 deg; below the lowest converged angle the lift line
 *   continues with the slope of the lowest points down to a negative stall angle (4 deg below
 *   the zero-lift angle, at most -2 deg) when the computed range stops short of it, and the
 *   mirrored relations take over from there to -180 deg; lookups there are flagged
 *   ASCR_TABLE_EXTENDED;
 * - the curves are resampled on one angle grid (0.5 deg within +-40 deg, 5 deg outside) and
 *   interpolated bicubically in (alpha, log Re) with GSL's interp2d (bilinear with fewer than
 *   four curves); outside the Re range the nearest curve is used and the lookup flagged;
 * - a curve computed with trips may say, per point, that a trip bound nothing there (the
 *   stagnation point behind it); lookups near such points carry that flag (trip_unbound).
 *
 * Thread safety: a built table is read-only; lookups are reentrant.
 */
#ifndef ASCR_TABLE_H
#define ASCR_TABLE_H

#include <stddef.h>
#include "airscrew/ascr_errno.h"

#ifdef __cplusplus
extern "C" {
#endif

typedef struct ascr_polar_table ascr_polar_table;

/** One computed polar at one Reynolds number (arrays borrowed during the build). */
typedef struct ascr_table_curve {
  double re;
  size_t n;
  const double *alpha_deg; /* ascending */
  const double *cl, *cd, *cm;
  const int *converged;    /* NULL: all converged */
  const int *trip_not_applied; /* per point, bit 0 upper, bit 1 lower: a requested trip bound
                                  nothing there (ascr_curve_data.trip_not_applied); NULL: none */
} ascr_table_curve;

/** Build options. */
typedef struct ascr_table_options {
  double cd_max;      /* drag coefficient at 90 deg for the post-stall extension (default 1.3,
                         common practice for rotor blades: 1.11 + 0.018 x aspect ratio 10) */
  double cd_reverse;  /* drag coefficient at 180 deg (default 0.05; assumption, documented) */
  double mach;        /* Mach number the curves were computed at (default 0) */
} ascr_table_options;

/** Defaults as documented above. */
ASCR_EXPORT ascr_table_options ascr_table_options_defaults(void);

/** Where a lookup came from. */
enum {
  ASCR_TABLE_COMPUTED = 0, /* between converged computed points */
  ASCR_TABLE_BRIDGED = 1,  /* in a gap of unconverged points, interpolated across */
  ASCR_TABLE_EXTENDED = 2  /* beyond the computed range: post-stall extension */
};

/** Result of a lookup. */
typedef struct ascr_table_sample {
  double cl, cd, cm;
  int region;     /* ASCR_TABLE_COMPUTED / _BRIDGED / _EXTENDED, at the nearer curve */
  int re_outside; /* 1 if Re lay outside the table's range (nearest curve used) */
  int stalled;    /* 1 if alpha lies beyond the angle of cl_max (or of cl_min) */
  int trip_unbound; /* bit 0 upper, bit 1 lower: a requested trip bound nothing at the
                       converged points of either curve around this angle (beyond a curve's
                       computed range: at its end point), so its numbers there are those of
                       free transition */
  double cl_lin;  /* the attached-flow lift line of thin-airfoil theory at this angle,
                     2 pi (alpha - alpha0) / sqrt(1 - M^2), alpha0 the zero-lift angle of the
                     curves (interpolated in log Re as cl is): the reference of stall-delay
                     models (ascr_rotor_params.stall_delay) */
} ascr_table_sample;

/** Build a table from n_curves computed polars (distinct Re, any order). A curve needs at
 *  least four converged points, the highest above 1 deg; curves that do not qualify are left
 *  out (count them with ascr_polar_table_curves()).
 *  @return ASCR_OK; ASCR_EINVAL (bad arguments, NaN, Re <= 0, unsorted angles, repeated Re;
 *          the message names the curve and point); ASCR_EDOM (no curve qualified);
 *          ASCR_ENOMEM. */
ASCR_EXPORT ascr_status ascr_polar_table_build(const ascr_table_curve *curves, size_t n_curves,
                                               const ascr_table_options *opt,
                                               ascr_polar_table **out, ascr_errbuf *err);

/** An analytic section for tests and quick studies: cl = a (alpha - alpha0) at every angle
 *  (no stall), constant cd, cm = 0, independent of Re and Mach. */
ASCR_EXPORT ascr_status ascr_polar_table_linear(double lift_slope_per_rad, double alpha0_rad,
                                                double cd, ascr_polar_table **out,
                                                ascr_errbuf *err);

/** Look up at angle alpha_rad (any value; wrapped to -pi..pi), Reynolds number re and Mach
 *  number mach (Prandtl-Glauert on cl within the computed range, factor capped at Mach 0.8).
 *  Never fails for finite input; out is always filled. */
ASCR_EXPORT void ascr_polar_table_eval(const ascr_polar_table *t, double alpha_rad, double re,
                                       double mach, ascr_table_sample *out);

/** Number of curves used, and the Re range they span. */
ASCR_EXPORT size_t ascr_polar_table_curves(const ascr_polar_table *t);
ASCR_EXPORT double ascr_polar_table_re_min(const ascr_polar_table *t);
ASCR_EXPORT double ascr_polar_table_re_max(const ascr_polar_table *t);
/** Computed (converged) angle range of curve i, degrees. */
ASCR_EXPORT void ascr_polar_table_curve_range(const ascr_polar_table *t, size_t i, double *re,
                                              double *alpha_lo_deg, double *alpha_hi_deg);

/* ---- computed curves, polar-table files and the on-disk cache -------------------------- */

/** One computed curve with its own storage (as computed by ascr_table_curve_compute or read
 *  from a polar-table file). */
typedef struct ascr_curve_data {
  double re, mach, ncrit, trip_upper, trip_lower;
  size_t n;
  double *alpha_deg, *cl, *cd, *cm;
  int *converged;
  int *trip_not_applied; /* per point, as ascr_polar_point.trip_not_applied (bit 0 upper, bit 1
                            lower: the trip lies ahead of the stagnation point and binds
                            nothing, transition there is free); NULL: none */
} ascr_curve_data;

/** Count a curve's converged points where a trip bound nothing (trip_not_applied): upper in
 *  n[0], lower in n[1]. */
ASCR_EXPORT void ascr_curve_trip_counts(const ascr_curve_data *c, size_t n[2]);

/** Free the arrays of a curve (not the struct); NULL is a no-op. */
ASCR_EXPORT void ascr_curve_data_clear(ascr_curve_data *c);

/** What to compute for a table curve. */
typedef struct ascr_curve_request {
  double re, mach, ncrit;          /* ncrit default 9 */
  double trip_upper, trip_lower;   /* x/c; > 1 for none */
  double alpha_lo_deg, alpha_hi_deg, alpha_step_deg; /* default -8 .. 16 by 1 */
  size_t n_panels;                 /* 0 (the default): ascr_geom_panels_for_re(re) */
} ascr_curve_request;

/** Defaults as documented above, at Re re. */
ASCR_EXPORT ascr_curve_request ascr_curve_request_defaults(double re);

struct ascr_geom_section;

/** Compute one curve: repanel the section, sweep the viscous solver (ascr_polar_sweep) over
 *  the request's angles. out is filled (caller clears it). Unconverged points are kept,
 *  flagged. Thread safety: reentrant (allocates its own solvers).
 *  @return ASCR_OK (see the flags), or the error of the set-up. */
ASCR_EXPORT ascr_status ascr_table_curve_compute(const struct ascr_geom_section *sec,
                                                 const ascr_curve_request *rq,
                                                 ascr_curve_data *out, ascr_errbuf *err);

/** Identity of a section's shape: 16 hex digits (FNV-1a 64 of its normalised coordinates). */
ASCR_EXPORT void ascr_section_fingerprint(const struct ascr_geom_section *sec, char out[17]);

/** Cache key of a curve request for a section fingerprint: 16 hex digits; the key text it is
 *  hashed from (which the cache entry stores and compares) goes to text if not NULL. */
ASCR_EXPORT void ascr_curve_cache_key(const char *fingerprint, const ascr_curve_request *rq,
                                      char key[17], char *text, size_t text_size);

/** Write curves to a polar-table file (JSON, docs/file-formats.md, "Polar-table files"),
 *  atomically (temporary file + rename); key_text may be NULL (files made for users).
 *  @return ASCR_OK or ASCR_EIO. */
ASCR_EXPORT ascr_status ascr_table_file_write(const char *path, const char *section_name,
                                              const char *key_text, const ascr_curve_data *curves,
                                              size_t n, ascr_errbuf *err);

/** The polar-table file text of curves (as ascr_table_file_write writes it), for callers that do
 *  their own file handling; *text is allocated (free()). */
ASCR_EXPORT ascr_status ascr_table_file_format(const char *section_name, const char *key_text,
                                               const ascr_curve_data *curves, size_t n,
                                               char **text, size_t *len, ascr_errbuf *err);

/** Read a polar-table file. *curves is allocated (free each with ascr_curve_data_clear, then
 *  free()). If key_text is not NULL the file must carry exactly that key (cache use). The
 *  checksum inside the file is verified: a damaged file is refused, never trusted.
 *  @return ASCR_OK, ASCR_EIO, ASCR_EPARSE (syntax, schema, checksum; message names file and
 *          field). */
ASCR_EXPORT ascr_status ascr_table_file_read(const char *path, const char *key_text,
                                             ascr_curve_data **curves, size_t *n,
                                             ascr_errbuf *err);

/** As ascr_table_file_read from a text buffer; name labels messages (NULL: "(polar table)"). */
ASCR_EXPORT ascr_status ascr_table_file_parse(const char *text, size_t len, const char *name,
                                              const char *key_text, ascr_curve_data **curves,
                                              size_t *n, ascr_errbuf *err);

/** Build a table from computed curves (wrapper of ascr_polar_table_build). */
ASCR_EXPORT ascr_status ascr_polar_table_from_curves(const ascr_curve_data *curves, size_t n,
                                                     const ascr_table_options *opt,
                                                     ascr_polar_table **out, ascr_errbuf *err);

/** Lowest Re of a computed table curve. Below it the integral boundary layer is unvalidated
 *  and the viscous solution rarely converges; elements there use the lowest curve, flagged. */
#define ASCR_TABLE_RE_FLOOR 1e4

/** Reynolds numbers of the table ladder (four per decade: 10^(k/4)) covering re_lo..re_hi with
 *  one rung beyond each end, none below ASCR_TABLE_RE_FLOOR; returns the count (at most max
 *  written to out). Snapping to a fixed ladder lets the cache serve neighbouring ranges. */
ASCR_EXPORT size_t ascr_table_re_ladder(double re_lo, double re_hi, double *out, size_t max);

/** Free; NULL is a no-op. */
ASCR_EXPORT void ascr_polar_table_free(ascr_polar_table *t);

#ifdef __cplusplus
}
#endif
#endif /* ASCR_TABLE_H */
