/* src/panel/panel_impl.h
 * Private helpers of the inviscid panel stage.
 */
#ifndef ASCR_PANEL_IMPL_H
#define ASCR_PANEL_IMPL_H

#include "airscrew/ascr_panel.h"

/* Influence integrals of a straight panel from (ax,ay) to (bx,by) at field point (px,py):
 * p0 = int ln r, p1 = int xi ln r, q = int theta (source angle, downstream branch cut);
 * see linvort.c. Any output pointer may be NULL. */
void panel_integrals(double ax, double ay, double bx, double by, double px, double py,
                     double *p0, double *p1, double *q);

/* Pressure coefficient at which the local Mach number is 1, free-stream Mach mach > 0,
 * ratio of specific heats 1.4 (isentropic relations; NACA Report 1135, eq. 45 with M = 1). */
double panel_cp_critical(double mach);

#endif
