/* src/structure/blade_loads.c
 * The blade under centrifugal and air loads: mass, stiffnesses, forces, moments, stresses and
 * the static tip deflection (include/airscrew/ascr_structure.h; docs/theory/structure.md).
 */
#include "core/core_impl.h"
#include "rotor/rotor_impl.h"
#include "airscrew/ascr_structure.h"

#include <math.h>
#include <string.h>

#define DEG (ASCR_PI / 180.0)

/* the section's properties blended as the rotor blends its sections (weight w towards s1) */
static ascr_status props_at(const ascr_geom_section *const *sec, size_t s0, size_t s1, double w,
                            double chord, ascr_section_props *p, ascr_errbuf *err)
{
  ascr_status st = ascr_section_props_of(sec[s0], chord, p, err);
  if (st != ASCR_OK || s1 == s0 || !(w > 0.0)) return st;
  ascr_section_props q;
  st = ascr_section_props_of(sec[s1], chord, &q, err);
  if (st != ASCR_OK) return st;
  /* every field is a double (checked at compile time): blended one by one */
  _Static_assert(sizeof(ascr_section_props) == 10 * sizeof(double), "section props: doubles only");
  double *a = &p->area, *b = &q.area;
  for (size_t k = 0; k < sizeof *p / sizeof(double); k++) a[k] = (1.0 - w) * a[k] + w * b[k];
  return ASCR_OK;
}

/* centrifugal twisting moment per length at a station (positive nose-up) */
static double twist_load(const ascr_structure_station *o, double rho, double om)
{
  double th = o->twist_deg * DEG;
  return -rho * om * om * (o->props.i_yy - o->props.i_xx) * sin(th) * cos(th);
}

/* the largest |bending stress| over the contour of section s at chord c for the moment (mx, my)
 * about the section's centroidal axes (flexure formula for unsymmetric sections) */
static double bending_max(const ascr_geom_section *s, double c, const ascr_section_props *p,
                          double mx, double my)
{
  double det = p->i_xx * p->i_yy - p->i_xy * p->i_xy;
  if (!(det > 0.0)) return 0.0;
  double ky = (mx * p->i_yy + my * p->i_xy) / det, kx = (my * p->i_xx + mx * p->i_xy) / det;
  const double *x = ascr_geom_section_x(s), *y = ascr_geom_section_y(s);
  double m = 0.0;
  for (size_t i = 0; i < ascr_geom_section_size(s); i++) {
    double dx = c * x[i] - p->x_c, dy = c * y[i] - p->y_c;
    m = fmax(m, fabs(ky * dy - kx * dx));
  }
  return m;
}

/* int_r^R q (r' - r) dr' of the elements' load per length q (constant over each element) */
static double moment_of(const ascr_rotor_element *el, size_t n_el, int flap, double r, int nb)
{
  double m = 0.0;
  for (size_t i = 0; i < n_el; i++) {
    if (!el[i].converged) continue;
    double a = el[i].r_m - 0.5 * el[i].dr_m, b = el[i].r_m + 0.5 * el[i].dr_m;
    if (b <= r) continue;
    a = fmax(a, r);
    /* per blade: thrust per length, or the in-plane force per length dQ/dr / r */
    double q = (flap ? el[i].dT_dr_N_m : el[i].dQ_dr_Nm_m / el[i].r_m) / nb;
    m += q * 0.5 * ((b - r) * (b - r) - (a - r) * (a - r));
  }
  return m;
}

/* int_r^R of the elements' pitching moment per length (one blade; constant over each element) */
static double air_twist_moment(const ascr_rotor_element *el, size_t n_el, double r)
{
  double m = 0.0;
  for (size_t i = 0; i < n_el; i++) {
    if (!el[i].converged || !isfinite(el[i].dM_dr_Nm_m)) continue;
    double a = el[i].r_m - 0.5 * el[i].dr_m, b = el[i].r_m + 0.5 * el[i].dr_m;
    if (b <= r) continue;
    m += el[i].dM_dr_Nm_m * (b - fmax(a, r));
  }
  return m;
}

ascr_status ascr_blade_structure(const ascr_blade *b, const ascr_geom_section *const *sec,
                                 const ascr_material *mat, double rpm,
                                 const ascr_rotor_element *el, size_t n_el, size_t n,
                                 ascr_structure_station *st, ascr_structure_summary *sum,
                                 ascr_errbuf *err)
{
  if (b == NULL || sec == NULL || mat == NULL || st == NULL || sum == NULL || n < 3 ||
      n > ASCR_STRUCTURE_MAX_STATIONS || !(rpm >= 0.0 && isfinite(rpm)) || (el == NULL && n_el > 0)) {
    return core_fail(err, ASCR_EINVAL, "structure: bad arguments (3 .. %d stations, rpm >= 0)",
                     ASCR_STRUCTURE_MAX_STATIONS);
  }
  ascr_status s = ascr_blade_validate(b, err);
  if (s != ASCR_OK) return s;
  for (size_t i = 0; i < b->n_sections; i++) {
    if (sec[i] == NULL) return core_fail(err, ASCR_EINVAL, "structure: no contour for section %zu", i);
  }
  double r0 = b->stations[0].r_m, r1 = b->r_tip_m, om = rpm * 2.0 * ASCR_PI / 60.0;
  double rho = mat->density_kg_m3.value, e = mat->elastic_modulus_pa.value;
  double g = mat->shear_modulus_pa.value;
  size_t near[ASCR_STRUCTURE_MAX_STATIONS];
  memset(sum, 0, sizeof *sum);
  for (size_t i = 0; i < n; i++) {
    ascr_structure_station *o = &st[i];
    memset(o, 0, sizeof *o);
    o->r_m = r0 + (r1 - r0) * (double)i / (double)(n - 1);
    size_t s0, s1;
    double w;
    rotor_blade_at(b, o->r_m, &o->chord_m, &o->twist_deg, &s0, &s1, &w);
    near[i] = w > 0.5 ? s1 : s0;
    s = props_at(sec, s0, s1, w, o->chord_m, &o->props, err);
    if (s != ASCR_OK) return s;
    const ascr_section_props *p = &o->props;
    double th = o->twist_deg * DEG, c = cos(th), sn = sin(th);
    o->mass_per_length_kg_m = rho * p->area;
    /* chord at th from the plane of rotation: flap axis t = cos th x - sin th y, rotor axis
     * z = sin th x + cos th y; I about t = int (x sin th + y cos th)^2 dA */
    o->ei_flap_nm2 = e * (c * c * p->i_xx + sn * sn * p->i_yy + 2.0 * sn * c * p->i_xy);
    o->ei_lag_nm2 = e * (sn * sn * p->i_xx + c * c * p->i_yy - 2.0 * sn * c * p->i_xy);
    o->gj_nm2 = g * p->j_torsion;
    o->moment_flap_Nm = el != NULL ? moment_of(el, n_el, 1, o->r_m, b->n_blades) : 0.0;
    o->moment_lag_Nm = el != NULL ? moment_of(el, n_el, 0, o->r_m, b->n_blades) : 0.0;
  }
  /* centrifugal force and mass by the trapezoidal rule, from the tip inwards */
  double h = (r1 - r0) / (double)(n - 1), mr = 0.0;
  st[n - 1].centrifugal_force_N = 0.0;
  for (size_t i = n - 1; i-- > 0;) {
    double fa = st[i].mass_per_length_kg_m * st[i].r_m, fb = st[i + 1].mass_per_length_kg_m * st[i + 1].r_m;
    st[i].centrifugal_force_N = st[i + 1].centrifugal_force_N + 0.5 * h * om * om * (fa + fb);
    sum->mass_kg += 0.5 * h * (st[i].mass_per_length_kg_m + st[i + 1].mass_per_length_kg_m);
    sum->volume_m3 += 0.5 * h * (st[i].props.area + st[i + 1].props.area);
    mr += 0.5 * h * (fa + fb);
  }
  sum->cg_r_m = sum->mass_kg > 0.0 ? mr / sum->mass_kg : NAN;
  sum->root_centrifugal_N = st[0].centrifugal_force_N;
  /* stresses: the moment vector (M_flap t + M_lag z) in the section's axes */
  sum->max_stress_pa = -1.0;
  for (size_t i = 0; i < n; i++) {
    ascr_structure_station *o = &st[i];
    double th = o->twist_deg * DEG, c = cos(th), sn = sin(th);
    double mx = o->moment_flap_Nm * c + o->moment_lag_Nm * sn;
    double my = -o->moment_flap_Nm * sn + o->moment_lag_Nm * c;
    o->stress_pa = o->centrifugal_force_N / o->props.area +
                   bending_max(sec[near[i]], o->chord_m, &o->props, mx, my);
    if (o->stress_pa > sum->max_stress_pa) {
      sum->max_stress_pa = o->stress_pa;
      sum->max_stress_r_m = o->r_m;
    }
  }
  sum->safety_factor = sum->max_stress_pa > 0.0 ? mat->tensile_strength_pa.value / sum->max_stress_pa : HUGE_VAL;
  sum->fatigue_factor = isfinite(mat->fatigue_limit_pa.value) && sum->max_stress_pa > 0.0
                            ? mat->fatigue_limit_pa.value / sum->max_stress_pa
                            : NAN;
  /* flap deflection: w'' = M / EI from the clamped root (w = w' = 0), trapezoidal twice */
  double slope = 0.0, defl = 0.0, kprev = st[0].moment_flap_Nm / st[0].ei_flap_nm2;
  for (size_t i = 1; i < n; i++) {
    double k = st[i].moment_flap_Nm / st[i].ei_flap_nm2;
    double s_new = slope + 0.5 * h * (kprev + k);
    defl += 0.5 * h * (slope + s_new);
    slope = s_new;
    kprev = k;
  }
  sum->tip_deflection_m = defl;
  /* the centrifugal twisting moment (the "propeller moment": the centrifugal forces on a section
   * turned by theta pull it towards the plane of rotation; per length
   * -rho Omega^2 (I_yy - I_xx) sin theta cos theta, Bielawa 1992 ch. 5, from memory), carried
   * inwards from the tip, with the air's pitching moment below; the elastic twist theta_e' =
   * M / GJ from the clamped root */
  double tprev = 0.0;
  st[n - 1].moment_twist_Nm = 0.0;
  for (size_t i = n - 1; i-- > 0;) {
    double qa = twist_load(&st[i], rho, om), qb = twist_load(&st[i + 1], rho, om);
    st[i].moment_twist_Nm = st[i + 1].moment_twist_Nm + 0.5 * h * (qa + qb);
  }
  /* the air's pitching moment about the quarter chord, taken as the twist axis (the lift acts
   * there: no arm), carried inwards from the tip; its share of the twist integrated apart */
  double tw = 0.0, tw_air = 0.0, aprev = 0.0;
  for (size_t i = 0; i < n; i++) {
    st[i].moment_twist_air_Nm = el != NULL ? air_twist_moment(el, n_el, st[i].r_m) : 0.0;
    st[i].moment_twist_Nm += st[i].moment_twist_air_Nm;
  }
  tprev = st[0].moment_twist_Nm / st[0].gj_nm2;
  aprev = st[0].moment_twist_air_Nm / st[0].gj_nm2;
  for (size_t i = 1; i < n; i++) {
    double k = st[i].moment_twist_Nm / st[i].gj_nm2, ka = st[i].moment_twist_air_Nm / st[i].gj_nm2;
    tw += 0.5 * h * (tprev + k);
    tw_air += 0.5 * h * (aprev + ka);
    tprev = k;
    aprev = ka;
  }
  sum->tip_pitch_change_deg = tw / DEG;
  sum->tip_pitch_change_air_deg = tw_air / DEG;
  return ASCR_OK;
}
