/* src/design/mil.c
 * The minimum-induced-loss blade (Adkins & Liebeck 1994, after Larrabee 1979), in the
 * displacement velocity v' so that hover is the same equations; see include/airscrew/
 * ascr_design.h and docs/theory/design.md for the equations and their sources.
 */
#include "core/core_impl.h"
#include "polar/polar_impl.h"
#include "airscrew/ascr_design.h"

#include <math.h>
#include <string.h>

#define DEG (ASCR_PI / 180.0)

ascr_mil_spec ascr_mil_spec_defaults(void)
{
  ascr_mil_spec s;
  memset(&s, 0, sizeof s);
  s.n_blades = 2;
  s.n_stations = 21;
  s.cl_design = NAN;
  s.n_sections = 1;
  s.alpha_lo_deg = -4.0;
  s.alpha_hi_deg = 12.0;
  s.min_chord_m = NAN;
  return s;
}

typedef struct mil_ctx {
  const ascr_mil_spec *s;
  const ascr_polar_table *const *tables;
  ascr_rotor_params p;
  double omega, min_chord;
  double target;          /* thrust or power */
  int by_power;
  ascr_mil_station st[ASCR_MIL_MAX_STATIONS];
  double thrust, torque;
  int failed;
} mil_ctx;

static size_t section_at(const ascr_mil_spec *s, double r)
{
  size_t k = 0;
  if (s->section_from_r_m == NULL) {
    return 0;
  }
  for (size_t i = 1; i < s->n_sections; i++) {
    if (r >= s->section_from_r_m[i]) {
      k = i;
    }
  }
  return k;
}

/* The design angle at (re, mach): the best cl/cd over the computed part of the table in the
 * search range (0.1 deg grid, refined by a parabola through the best point and its
 * neighbours), or the angle of cl_design on the rising lift curve. 0 if none. */
static int design_angle(const mil_ctx *c, size_t sec, double re, double mach, double *alpha,
                        double *cl, double *cd)
{
  const ascr_polar_table *t = c->tables[sec];
  double lo = c->s->alpha_lo_deg, hi = c->s->alpha_hi_deg;
  int n = (int)lround((hi - lo) / 0.1);
  ascr_table_sample q;
  if (isnan(c->s->cl_design)) {
    double best = -HUGE_VAL, ld[3] = {0.0, 0.0, 0.0};
    int kb = -1;
    for (int k = 0; k <= n; k++) {
      polar_table_lookup(t, (lo + 0.1 * k) * DEG, re, mach, 0, &q);
      double r = q.cl > 0.0 && q.cd > 0.0 && q.region == ASCR_TABLE_COMPUTED ? q.cl / q.cd : -HUGE_VAL;
      if (r > best) {
        best = r;
        kb = k;
      }
    }
    if (kb < 0) {
      return 0;
    }
    double a = lo + 0.1 * kb;
    if (kb > 0 && kb < n) {
      for (int j = -1; j <= 1; j++) {
        polar_table_lookup(t, (a + 0.1 * j) * DEG, re, mach, 0, &q);
        ld[j + 1] = q.cl / q.cd;
      }
      double den = ld[0] - 2.0 * ld[1] + ld[2];
      if (den < 0.0) {
        double d = 0.5 * (ld[0] - ld[2]) / den;
        if (fabs(d) <= 1.0) {
          a += 0.1 * d;
        }
      }
    }
    polar_table_lookup(t, a * DEG, re, mach, 0, &q);
    *alpha = a;
    *cl = q.cl;
    *cd = q.cd;
    return q.cl > 0.0 && q.cd > 0.0;
  }
  /* the given cl: bracket on the rising curve from lo, then bisection */
  double target = c->s->cl_design, prev = NAN;
  for (int k = 0; k <= n; k++) {
    double a = lo + 0.1 * k;
    polar_table_lookup(t, a * DEG, re, mach, 0, &q);
    if (q.stalled) {
      break;
    }
    if (k > 0 && prev < target && q.cl >= target) {
      double a0 = a - 0.1, a1 = a;
      for (int it = 0; it < 50; it++) {
        double m = 0.5 * (a0 + a1);
        polar_table_lookup(t, m * DEG, re, mach, 0, &q);
        if (q.cl < target) a0 = m;
        else a1 = m;
      }
      polar_table_lookup(t, 0.5 * (a0 + a1) * DEG, re, mach, 0, &q);
      *alpha = 0.5 * (a0 + a1);
      *cl = q.cl;
      *cd = q.cd;
      return q.cd >= 0.0;
    }
    prev = q.cl;
  }
  return 0;
}

/* Prandtl's factor of the Betz wake at the station: tip (and hub) after the parameters'
 * switches, with the tip flow angle phi_t as Adkins & Liebeck write it */
static double loss(const mil_ctx *c, double r, double sin_phit, double sin_phi)
{
  const ascr_mil_spec *s = c->s;
  double bh = 0.5 * s->n_blades, f = 1.0;
  if (c->p.tip_loss && sin_phit > 0.0) {
    f *= 2.0 / ASCR_PI * acos(exp(-bh * (s->r_tip_m - r) / (s->r_tip_m * sin_phit)));
  }
  if (c->p.hub_loss && s->r_hub_m > 0.0 && sin_phi > 0.0) {
    f *= 2.0 / ASCR_PI * acos(exp(-bh * (r - s->r_hub_m) / (s->r_hub_m * sin_phi)));
  }
  return f;
}

/* every station at displacement velocity vd; thrust and torque by the trapezoidal rule */
static void stations_at(mil_ctx *c, double vd)
{
  const ascr_mil_spec *s = c->s;
  const ascr_rotor_params *p = &c->p;
  double v = s->speed_m_s, w = c->omega;
  double tphit = (v + 0.5 * vd) / (w * s->r_tip_m);
  double sphit = tphit / sqrt(1.0 + tphit * tphit);
  double dt[ASCR_MIL_MAX_STATIONS], dq[ASCR_MIL_MAX_STATIONS];
  c->failed = 0;
  for (size_t i = 0; i < s->n_stations; i++) {
    ascr_mil_station *o = &c->st[i];
    double r = o->r_m;
    double phi = atan2(v + 0.5 * vd, w * r), sp = sin(phi), cp = cos(phi);
    double f = loss(c, r, sphit, sp);
    double gam = 2.0 * ASCR_PI * r * f * vd * sp * cp / s->n_blades;
    /* cl, cd at the station's Re: the chord sets the Re, the Re the polar */
    double chord = 0.1 * s->r_tip_m, alpha = NAN, cl = NAN, cd = NAN, wr = NAN, re = NAN, mach = NAN;
    int ok = 1;
    for (int it = 0; it < 30 && ok; it++) {
      double eps = isfinite(cd) ? cd / cl : 0.0;
      wr = (v + 0.5 * vd * cp * cp * (1.0 - eps * sp / cp)) / sp;
      re = p->density_kg_m3 * wr * fmax(chord, c->min_chord) / p->viscosity_pa_s;
      mach = wr / p->sound_speed_m_s;
      double a0 = alpha;
      ok = design_angle(c, o->section, re, mach, &alpha, &cl, &cd);
      if (!ok) break;
      eps = cd / cl;
      wr = (v + 0.5 * vd * cp * cp * (1.0 - eps * sp / cp)) / sp;
      double cn = 2.0 * gam / (wr * cl);
      int settled = fabs(cn - chord) <= 1e-9 * s->r_tip_m && a0 == alpha;
      chord = cn;
      if (settled) break;
    }
    if (!ok || !isfinite(chord)) {
      c->failed = 1;
      dt[i] = dq[i] = 0.0;
      continue;
    }
    o->phi_deg = phi / DEG;
    o->alpha_deg = alpha;
    o->twist_deg = alpha + phi / DEG;
    o->cl = cl;
    o->cd = cd;
    o->re = re;
    o->mach = mach;
    o->loss = f;
    o->circulation = gam;
    o->chord_raised = chord < c->min_chord;
    o->chord_m = fmax(chord, c->min_chord);
    double eps = cd / cl;
    dt[i] = s->n_blades * p->density_kg_m3 * wr * gam * (cp - eps * sp);
    dq[i] = s->n_blades * p->density_kg_m3 * wr * gam * r * (sp + eps * cp);
  }
  c->thrust = c->torque = 0.0;
  for (size_t i = 1; i < s->n_stations; i++) {
    double h = c->st[i].r_m - c->st[i - 1].r_m;
    c->thrust += 0.5 * h * (dt[i] + dt[i - 1]);
    c->torque += 0.5 * h * (dq[i] + dq[i - 1]);
  }
}

static double miss(double vd, void *vc)
{
  mil_ctx *c = vc;
  stations_at(c, vd);
  double got = c->by_power ? c->torque * c->omega : c->thrust;
  return c->failed ? 0.0 : got - c->target;
}

ascr_status ascr_mil_design(const ascr_mil_spec *s, const ascr_polar_table *const *tables,
                            const ascr_rotor_params *pin, ascr_mil_result *out, ascr_errbuf *err)
{
  if (s == NULL || tables == NULL || out == NULL || s->n_blades < 1 || s->n_blades > 12 ||
      !(s->r_tip_m > 0.0) || !(s->r_hub_m >= 0.0 && s->r_hub_m < 0.9 * s->r_tip_m) ||
      !(s->rpm > 0.0 && isfinite(s->rpm)) || !(s->speed_m_s >= 0.0 && isfinite(s->speed_m_s)) ||
      !(s->thrust_N > 0.0 || s->power_W > 0.0) || s->n_stations < 3 ||
      s->n_stations > ASCR_MIL_MAX_STATIONS || s->n_sections < 1 ||
      !(s->alpha_hi_deg > s->alpha_lo_deg) ||
      (s->n_sections > 1 && s->section_from_r_m == NULL)) {
    return core_fail(err, ASCR_EINVAL, "design: the specification is incomplete or out of range "
                     "(blades 1..12, 0 <= hub < 0.9 tip, rpm > 0, speed >= 0, thrust or power > 0, "
                     "3..%d stations)", ASCR_MIL_MAX_STATIONS);
  }
  for (size_t i = 0; i < s->n_sections; i++) {
    if (tables[i] == NULL) {
      return core_fail(err, ASCR_EINVAL, "design: no table for section %zu", i);
    }
  }
  memset(out, 0, sizeof *out);
  static mil_ctx zero;
  mil_ctx c = zero;
  c.s = s;
  c.tables = tables;
  c.p = pin != NULL ? *pin : ascr_rotor_params_defaults();
  c.omega = s->rpm * 2.0 * ASCR_PI / 60.0;
  c.min_chord = s->min_chord_m > 0.0 ? s->min_chord_m : 0.02 * s->r_tip_m;
  c.by_power = !(s->thrust_N > 0.0);
  c.target = c.by_power ? s->power_W : s->thrust_N;
  for (size_t i = 0; i < s->n_stations; i++) {
    double x = 0.5 * (1.0 - cos(ASCR_PI * (double)i / (double)(s->n_stations - 1)));
    c.st[i].r_m = s->r_hub_m + (s->r_tip_m - s->r_hub_m) * x;
    c.st[i].section = section_at(s, c.st[i].r_m);
  }
  /* bracket v': a light wake gives too little, one as fast as the blade tip too much */
  double lo = 1e-6 * c.omega * s->r_tip_m, hi = 0.05 * c.omega * s->r_tip_m + s->speed_m_s;
  double flo = miss(lo, &c);
  if (c.failed) {
    return core_fail(err, ASCR_EDOM, "design: no design angle at some station (the section's "
                     "table gives no positive cl/cd, or not the lift coefficient asked)");
  }
  double fhi = miss(hi, &c);
  for (int k = 0; k < 40 && !c.failed && fhi < 0.0; k++) {
    lo = hi;
    flo = fhi;
    hi *= 1.5;
    fhi = miss(hi, &c);
  }
  if (c.failed || !(flo < 0.0 && fhi >= 0.0)) {
    return core_fail(err, ASCR_EDOM, "design: %g %s is not reached at %g rpm and %g m/s",
                     c.target, c.by_power ? "W" : "N", s->rpm, s->speed_m_s);
  }
  double vd;
  int stop = 0;
  if (core_brent(miss, &c, &stop, lo, hi, 0.0, 1e-10, 200, &vd) != ASCR_OK) {
    return core_fail(err, ASCR_EMAXITER, "design: the displacement velocity did not converge");
  }
  stations_at(&c, vd);
  if (c.failed) {
    return core_fail(err, ASCR_EMAXITER, "design: a station failed at the solution");
  }
  out->v_displacement_m_s = vd;
  out->thrust_N = c.thrust;
  out->power_W = c.torque * c.omega;
  out->efficiency = s->speed_m_s > 0.0 ? c.thrust * s->speed_m_s / out->power_W : NAN;
  out->n = s->n_stations;
  memcpy(out->st, c.st, s->n_stations * sizeof *c.st);
  /* the designed blade analysed by the BEMT at the design point */
  ascr_blade_station bst[ASCR_MIL_MAX_STATIONS];
  ascr_blade b;
  ascr_mil_blade(s, out, bst, &b);
  ascr_status st = ascr_rotor_bemt(&b, tables, &c.p, s->rpm, s->speed_m_s, &out->analysis, NULL, err);
  if (st != ASCR_OK) {
    return st;
  }
  out->converged = out->analysis.converged;
  return ASCR_OK;
}

void ascr_mil_blade(const ascr_mil_spec *s, const ascr_mil_result *res, ascr_blade_station *st,
                    ascr_blade *b)
{
  memset(b, 0, sizeof *b);
  b->n_blades = s->n_blades;
  b->r_tip_m = s->r_tip_m;
  b->r_hub_m = s->r_hub_m;
  b->rotation = 1;
  b->n_sections = s->n_sections;
  b->n_stations = res->n;
  b->stations = st;
  b->envelope_rpm[0] = b->envelope_rpm[1] = NAN;
  for (size_t i = 0; i < res->n; i++) {
    st[i].r_m = res->st[i].r_m;
    st[i].chord_m = res->st[i].chord_m;
    st[i].twist_deg = res->st[i].twist_deg;
    st[i].section = res->st[i].section;
  }
}
