/* src/rotor/blade.c
 * Blade layouts: validation with field paths, properties between stations, freeing.
 * Chord and twist vary linearly between stations; the section coefficients blend linearly in
 * radius between the two stations' sections (docs/theory/rotor.md, "Blade").
 */
#include "rotor/rotor_impl.h"
#include "core/core_impl.h"
#include "polar/polar_impl.h"

#include <math.h>
#include <stdlib.h>

ascr_status ascr_blade_validate(const ascr_blade *b, ascr_errbuf *err)
{
  if (b == NULL) {
    return core_fail(err, ASCR_EINVAL, "blade: none given");
  }
  if (b->n_blades < 1 || b->n_blades > 12) {
    return core_fail(err, ASCR_EINVAL, "blade: blades = %d, must be 1 .. 12", b->n_blades);
  }
  if (!(isfinite(b->r_tip_m) && b->r_tip_m > 0.0 && b->r_tip_m <= 10.0)) {
    return core_fail(err, ASCR_EINVAL, "blade: tip radius %g m, must be in (0, 10] m", b->r_tip_m);
  }
  if (!(isfinite(b->r_hub_m) && b->r_hub_m >= 0.0 && b->r_hub_m < 0.9 * b->r_tip_m)) {
    return core_fail(err, ASCR_EGEOM, "blade: hub radius %g m must be >= 0 and below 0.9 x tip radius (%g m)",
                     b->r_hub_m, b->r_tip_m);
  }
  if (!(isfinite(b->pitch_offset_deg) && fabs(b->pitch_offset_deg) <= 90.0)) {
    return core_fail(err, ASCR_EINVAL, "blade: pitch offset %g deg, must be within +-90 deg",
                     b->pitch_offset_deg);
  }
  if (b->rotation != 1 && b->rotation != -1) {
    return core_fail(err, ASCR_EINVAL, "blade: rotation must be +1 or -1");
  }
  if (b->n_stations < 2 || b->stations == NULL) {
    return core_fail(err, ASCR_EGEOM, "blade: stations: at least 2 needed, %zu given", b->n_stations);
  }
  if (b->n_sections < 1) {
    return core_fail(err, ASCR_EINVAL, "blade: sections: none given");
  }
  double tol = 1e-9 * b->r_tip_m;
  for (size_t i = 0; i < b->n_stations; i++) {
    const ascr_blade_station *s = &b->stations[i];
    if (!isfinite(s->r_m) || s->r_m < b->r_hub_m - tol || s->r_m > b->r_tip_m + tol) {
      return core_fail(err, ASCR_EGEOM,
                       "blade: stations[%zu].r = %g m lies outside hub .. tip (%g .. %g m)", i,
                       s->r_m, b->r_hub_m, b->r_tip_m);
    }
    if (i > 0 && !(s->r_m > b->stations[i - 1].r_m + tol)) {
      return core_fail(err, ASCR_EGEOM,
                       "blade: stations[%zu].r = %g m does not increase (previous %g m)", i, s->r_m,
                       b->stations[i - 1].r_m);
    }
    if (!(isfinite(s->chord_m) && s->chord_m > 0.0 && s->chord_m <= 2.0 * b->r_tip_m)) {
      return core_fail(err, ASCR_EGEOM,
                       "blade: stations[%zu].chord = %g m, must be > 0 and at most the diameter", i,
                       s->chord_m);
    }
    if (!(isfinite(s->twist_deg) && fabs(s->twist_deg) <= 90.0)) {
      return core_fail(err, ASCR_EINVAL, "blade: stations[%zu].twist = %g deg, must be within +-90",
                       i, s->twist_deg);
    }
    if (s->section >= b->n_sections) {
      return core_fail(err, ASCR_EINVAL, "blade: stations[%zu].section: index %zu, only %zu sections",
                       i, s->section, b->n_sections);
    }
  }
  if (b->stations[b->n_stations - 1].r_m - b->stations[0].r_m < 0.05 * b->r_tip_m) {
    return core_fail(err, ASCR_EGEOM, "blade: stations span less than 5 %% of the tip radius");
  }
  return ASCR_OK;
}

void rotor_blade_at(const ascr_blade *b, double r, double *chord, double *twist_deg, size_t *s0,
                    size_t *s1, double *w)
{
  size_t n = b->n_stations;
  size_t k = 0;
  while (k + 2 < n && b->stations[k + 1].r_m <= r) {
    k++;
  }
  const ascr_blade_station *a = &b->stations[k], *c = &b->stations[k + 1];
  double t = (r - a->r_m) / (c->r_m - a->r_m);
  t = t < 0.0 ? 0.0 : (t > 1.0 ? 1.0 : t);
  *chord = a->chord_m + t * (c->chord_m - a->chord_m);
  *twist_deg = a->twist_deg + t * (c->twist_deg - a->twist_deg) + b->pitch_offset_deg;
  *s0 = a->section;
  *s1 = c->section;
  *w = t;
}

void ascr_blade_free(ascr_blade *b)
{
  if (b == NULL) {
    return;
  }
  for (size_t i = 0; i < b->n_sections; i++) {
    if (b->section_source != NULL) {
      free(b->section_source[i]);
    }
    if (b->section_name != NULL) {
      free(b->section_name[i]);
    }
  }
  free(b->section_source);
  free(b->section_name);
  free(b->stations);
  free(b->name);
  free(b);
}

double rotor_edge(double r0, double r1, size_t i, size_t n)
{
  return r0 + (r1 - r0) * sin(0.5 * 3.14159265358979323846 * (double)i / (double)n);
}

double rotor_sample_cm(const ascr_polar_table *const *tables, size_t s0, size_t s1, double w,
                       double alpha, double re, double mach)
{
  ascr_table_sample q;
  polar_table_lookup(tables[s0], alpha, re, mach, 1, &q);
  double cm = q.cm;
  if (s1 != s0 && w > 0.0) {
    polar_table_lookup(tables[s1], alpha, re, mach, 1, &q);
    cm = (1.0 - w) * cm + w * q.cm;
  }
  return cm;
}

double rotor_stall_delay_factor(const ascr_rotor_params *p, double chord, double r)
{
  if (p->stall_delay != ASCR_STALL_DELAY_SNEL || !(r > 0.0)) return 0.0;
  double f = 3.0 * (chord / r) * (chord / r);
  return f < 1.0 ? f : 1.0;
}

/* Snel's correction (ascr_rotor.h) on a blended sample: where the lift lies below the
 * attached-flow line on the positive side, a share sd of the gap is added, faded out linearly
 * between 25 and 45 deg above the zero-lift angle; continuous in alpha (no jump at stall). */
static void stall_delay(double sd, double mach, ascr_table_sample *s)
{
  double m = mach > 0.8 ? 0.8 : (mach > 0.0 ? mach : 0.0);
  double da = s->cl_lin * sqrt(1.0 - m * m) / (2.0 * ASCR_PI) * (180.0 / ASCR_PI); /* deg above alpha0 */
  double gap = s->cl_lin - s->cl;
  if (!(da > 0.0) || !(gap > 0.0)) return;
  double fade = da <= 25.0 ? 1.0 : (da >= 45.0 ? 0.0 : (45.0 - da) / 20.0);
  s->cl += sd * fade * gap;
}

void rotor_sample(const ascr_polar_table *const *tables, size_t s0, size_t s1, double w,
                  double alpha, double re, double mach, double sd, ascr_table_sample *out)
{
  polar_table_lookup(tables[s0], alpha, re, mach, 0, out);
  if (s1 != s0 && w > 0.0) {
    ascr_table_sample q;
    polar_table_lookup(tables[s1], alpha, re, mach, 0, &q);
    out->cl = (1.0 - w) * out->cl + w * q.cl;
    out->cl_lin = (1.0 - w) * out->cl_lin + w * q.cl_lin;
    out->cd = (1.0 - w) * out->cd + w * q.cd;
    out->region = q.region > out->region ? q.region : out->region;
    out->stalled |= q.stalled;
    out->re_outside |= q.re_outside;
    out->trip_unbound |= q.trip_unbound;
  }
  if (sd > 0.0) stall_delay(sd, mach, out);
}

static double prandtl(double b_half, double dist, double rref, double sphi)
{
  double s = fabs(sphi);
  if (s < 1e-12) {
    return 1.0;
  }
  double f = b_half * dist / (rref * s);
  return 2.0 / ASCR_PI * acos(exp(-f));
}

double rotor_loss(const ascr_blade *b, const ascr_rotor_params *p, double r, double sin_phi)
{
  double bh = 0.5 * b->n_blades, f = 1.0;
  if (p->tip_loss) {
    f *= prandtl(bh, b->r_tip_m - r, r, sin_phi);
  }
  if (p->hub_loss && b->r_hub_m > 0.0) {
    f *= prandtl(bh, r - b->r_hub_m, b->r_hub_m, sin_phi);
  }
  return f < 1e-8 ? 1e-8 : f;
}
