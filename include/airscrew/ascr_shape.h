/* include/airscrew/ascr_shape.h
 * The printable shape of a blade or a propeller: a closed triangle mesh lofted through the
 * stations' sections, and its STL form.
 *
 * Method (docs/theory/structure.md, "The printable shape"): at n_span radii from the root station
 * to the tip each section is sampled at the same cosine-spaced chord fractions on its upper and
 * lower surface (sections blended as the rotor blends them), scaled by the chord, placed with
 * the pitch axis at a chord fraction and turned by the twist; neighbouring rings are joined by
 * quadrilaterals split in two, and the ends closed by strips between the upper and lower
 * surfaces. The leading edge moves ahead in the sense of rotation, the suction side faces
 * forward (+z, towards the incoming air). Lengths in the mesh are metres.
 *
 * Thread safety: reentrant.
 */
#ifndef ASCR_SHAPE_H
#define ASCR_SHAPE_H

#include <stddef.h>
#include <stdint.h>
#include "airscrew/ascr_errno.h"
#include "airscrew/ascr_geom.h"
#include "airscrew/ascr_rotor.h"

#ifdef __cplusplus
extern "C" {
#endif

typedef struct ascr_mesh {
  size_t n_vertices, n_triangles;
  double *v;       /* 3 n_vertices coordinates, m */
  size_t *t;       /* 3 n_triangles vertex indices, counter-clockwise seen from outside */
  size_t n_shells; /* closed shells (a blade, the hub) */
} ascr_mesh;

typedef struct ascr_shape_params {
  size_t n_chord;        /* chord fractions sampled on each surface, LE and TE included (default 41) */
  size_t n_span;         /* rings from the root station to the tip (default 61) */
  double pitch_axis;     /* chord fraction of the axis the twist turns about (default 0.25) */
  int blade_only;        /* 1: one blade; 0 (default): all blades around the hub */
  double hub_radius_m;   /* hub cylinder (default: the blade's hub radius, at least 1.2 x the
                            root station's half chord... see ascr_shape_params_defaults) */
  double hub_height_m;   /* its height along the axis (0: the root chord's axial extent x 1.2) */
  size_t hub_segments;   /* facets around the hub (default 48) */
  double root_thickening; /* the blended root (propeller only): between the root station and
                            the hub the root section thickens smoothly about its mean line to
                            this factor at the hub surface, and keeps it inside the hub
                            (default 2, a choice of ours; 1: the root section carried in
                            unchanged; 1 .. 5) */
} ascr_shape_params;

/** Defaults as documented (hub radius and height 0: chosen from the blade). */
ASCR_EXPORT ascr_shape_params ascr_shape_params_defaults(void);

/** Loft blade b (sections[i]: the contour of section i). out is filled (ascr_mesh_free).
 *  @return ASCR_OK, ASCR_EINVAL, ASCR_EGEOM (a section whose surfaces are not single-valued
 *          in x), ASCR_ENOMEM. */
ASCR_EXPORT ascr_status ascr_blade_mesh(const ascr_blade *b, const ascr_geom_section *const *sections,
                                        const ascr_shape_params *p, ascr_mesh *out,
                                        ascr_errbuf *err);
ASCR_EXPORT void ascr_mesh_free(ascr_mesh *m);

/** The section of the blade at radius r_m (on the blade) as placed in the mesh: 2 n_chord - 1
 *  points (x, y, z in m, upper trailing edge round the leading edge to the lower one) into xyz
 *  (3 (2 n_chord - 1) entries), their count in *n. For CAD. @return ASCR_OK, ASCR_EINVAL,
 *  ASCR_EGEOM, ASCR_ENOMEM. */
ASCR_EXPORT ascr_status ascr_blade_section_points(const ascr_blade *b,
                                                  const ascr_geom_section *const *sections,
                                                  const ascr_shape_params *p, double r_m,
                                                  double *xyz, size_t *n, ascr_errbuf *err);

/** Closed-mesh checks: every edge shared by exactly two triangles in opposite directions
 *  (watertight, consistently oriented), and no triangle of zero area; returns the number of
 *  offending edges plus degenerate triangles (0: a valid closed mesh). */
ASCR_EXPORT size_t ascr_mesh_defects(const ascr_mesh *m);

/** Enclosed volume by the divergence theorem (sum of signed tetrahedra), m^3. */
ASCR_EXPORT double ascr_mesh_volume(const ascr_mesh *m);

/** The mesh as binary STL in millimetres (80-byte header, count, 50 bytes a triangle); *buf
 *  allocated (free()). @return ASCR_OK or ASCR_ENOMEM. */
ASCR_EXPORT ascr_status ascr_mesh_stl(const ascr_mesh *m, const char *header, unsigned char **buf,
                                      size_t *len, ascr_errbuf *err);

#ifdef __cplusplus
}
#endif
#endif /* ASCR_SHAPE_H */
