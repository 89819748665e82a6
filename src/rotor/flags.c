/* src/rotor/flags.c
 * Flags of the blade elements of one operating point and the share of the thrust that rests on
 * flagged ones (rotor_impl.h), shared by the BEMT and the vortex model.
 */
#include "rotor/rotor_impl.h"

#include <math.h>

void rotor_flags_add(rotor_flags *f, const ascr_table_sample *q, double dt_dr, double dr)
{
  f->n_stalled += (size_t)q->stalled;
  f->n_extended += (size_t)(q->region == ASCR_TABLE_EXTENDED);
  f->n_bridged += (size_t)(q->region == ASCR_TABLE_BRIDGED);
  f->n_re_outside += (size_t)q->re_outside;
  double t = fabs(dt_dr * dr);
  if (isfinite(t)) {
    f->t_all += t;
    if (q->region != ASCR_TABLE_COMPUTED || q->re_outside) f->t_flagged += t;
  }
}

void rotor_flags_finish(const rotor_flags *f, ascr_rotor_result *res)
{
  res->n_stalled = f->n_stalled;
  res->n_extended = f->n_extended;
  res->n_bridged = f->n_bridged;
  res->n_re_outside = f->n_re_outside;
  res->flagged_thrust_share = f->t_all > 0.0 ? f->t_flagged / f->t_all : 0.0;
  res->low_confidence = res->flagged_thrust_share > ASCR_ROTOR_LOW_CONFIDENCE_SHARE;
}
