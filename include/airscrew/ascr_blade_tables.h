/* include/airscrew/ascr_blade_tables.h
 * The section tables of a blade, from its file to the tables the rotor models read: for every
 * section, the curves of the Reynolds-number ladder its operating range needs
 * (ascr_table_re_ladder), read from the on-disk cache or computed by the viscous solver (the
 * curves are independent jobs, run in parallel with OpenMP where the library was built with
 * it) and stored, or read from a polar-table file named for that section.
 *
 * One condition, one answer. The ladder is fixed (four rungs a decade) and a table lookup
 * depends only on the two curves around its Re (ascr_table.h), so an operating point gives the
 * same numbers whatever else the request holds. A curve at an end of the ladder that cannot
 * enter the table (too few converged points) would break that: the point next to it would use
 * the nearest curve in one request and a farther rung in a wider one. Such an end is therefore
 * extended by further rungs (at most ASCR_BLADE_TABLES_MAX_EXTRA a side, never below
 * ASCR_TABLE_RE_FLOOR) until a usable curve closes it.
 *
 * docs/theory/rotor.md ("Section tables"); bench/bench_rotor and tests/rotor/ use this API.
 * Thread safety: reentrant; the callbacks are called from the calling thread only, except
 * progress, which is called under a lock from the worker threads.
 */
#ifndef ASCR_BLADE_TABLES_H
#define ASCR_BLADE_TABLES_H

#include <stddef.h>
#include "airscrew/ascr_errno.h"
#include "airscrew/ascr_table.h"
#include "airscrew/ascr_rotor.h"

#ifdef __cplusplus
extern "C" {
#endif

/** Most curves a section's table takes (ladder and extension rungs together). */
#define ASCR_BLADE_TABLES_MAX_CURVES 32
/** Most rungs added beyond an end of the ladder whose end curve is not usable. */
#define ASCR_BLADE_TABLES_MAX_EXTRA 3

typedef struct ascr_blade_tables_options {
  const char *cache_dir;       /* cache folder (created if missing); NULL: no cache */
  ascr_curve_request curve;    /* settings of every computed curve but its Re (N_crit, trips,
                                  angles, panels); default ascr_curve_request_defaults() */
  size_t n_files;              /* polar-table files given for sections, by section name */
  const char *const *file_section;
  const char *const *file_path;
  /* progress of the computed curves (done of todo); NULL: none */
  void (*progress)(size_t done, size_t todo, void *ctx);
  /* a temporary file of the cache exists at path while an entry is stored (path NULL: none
   * any more), so that a caller that handles interrupts can remove it; NULL: not told */
  void (*temp_file)(const char *path, void *ctx);
  void *ctx;
} ascr_blade_tables_options;

/** Defaults: no cache, ascr_curve_request_defaults(1e5), no files, no callbacks. */
ASCR_EXPORT ascr_blade_tables_options ascr_blade_tables_options_defaults(void);

/** What a section's table was made of. */
typedef struct ascr_section_table_info {
  char fingerprint[17];        /* of the section's shape ("" for a polar-table file) */
  double re_lo, re_hi;         /* Re range the operating points need */
  size_t n_curves;             /* curves of the table's ladder, extension rungs included */
  double re[ASCR_BLADE_TABLES_MAX_CURVES];
  size_t converged[ASCR_BLADE_TABLES_MAX_CURVES], points[ASCR_BLADE_TABLES_MAX_CURVES];
  size_t n_extra;              /* extension rungs among them */
  size_t from_cache, computed; /* curves read from the cache, computed */
  size_t n_used;               /* curves the table uses (ascr_polar_table_curves) */
  const char *user_file;       /* the polar-table file used (borrowed), NULL if computed */
  ascr_curve_data *curve;      /* the curves, ascending Re (owned) */
  size_t n_curve;
} ascr_section_table_info;

/** Where a preparation failed (for callers that map failures to their own codes). */
typedef enum ascr_blade_tables_stage {
  ASCR_TABLES_OK = 0,
  ASCR_TABLES_ARGUMENTS,       /* options that do not fit the blade (unknown section name, a
                                  range needing too many curves) */
  ASCR_TABLES_SECTION,         /* a section's shape could not be read */
  ASCR_TABLES_CURVE,           /* a curve's computation could not be set up */
  ASCR_TABLES_FILE,            /* a polar-table file could not be read */
  ASCR_TABLES_TABLE            /* a table could not be built (no usable curve: ASCR_EDOM) */
} ascr_blade_tables_stage;

typedef struct ascr_blade_tables {
  size_t n;                       /* = the blade's sections */
  ascr_polar_table **tables;      /* one per section, for the rotor models */
  ascr_section_table_info *info;  /* one per section */
  size_t n_notes;
  char **notes;                   /* what the user should be told (a cache entry refused, a
                                     folder that cannot be written, curves left out) */
  ascr_blade_tables_stage failed; /* stage of a failure (ASCR_TABLES_OK on success) */
} ascr_blade_tables;

/** Prepare one table per section of blade b for shaft speeds rpm_lo..rpm_hi and axial speeds
 *  v_lo..v_hi (m/s), with the elements and air of p (NULL: defaults). out is filled (free it
 *  with ascr_blade_tables_free, also after a failure: its notes and stage are kept).
 *  @return ASCR_OK; ASCR_EINVAL (arguments; an unknown section name; a range needing more than
 *          ASCR_BLADE_TABLES_MAX_CURVES curves); the status of a section read, a curve set-up or
 *          a polar-table file; ASCR_EDOM (a section with no usable curve: the message names it
 *          and what to change); ASCR_ENOMEM. */
ASCR_EXPORT ascr_status ascr_blade_tables_prepare(const ascr_blade *b, const ascr_rotor_params *p,
                                                  double rpm_lo, double rpm_hi, double v_lo,
                                                  double v_hi, const ascr_blade_tables_options *o,
                                                  ascr_blade_tables *out, ascr_errbuf *err);

/** Free what ascr_blade_tables_prepare filled; NULL or an empty struct is a no-op. */
ASCR_EXPORT void ascr_blade_tables_free(ascr_blade_tables *t);

#ifdef __cplusplus
}
#endif

#endif
