/* src/design/optimize.c
 * Constrained multi-point blade design: chord and twist of a start blade optimised for the
 * weighted shaft power of several operating points, each trimmed in rpm to its thrust by the
 * BEMT (include/airscrew/ascr_design.h; docs/theory/design.md, "Multi-point design").
 *
 * Description: chord and twist at n_control radii evenly spaced over the blade's span, carried
 * to the stations by Steffen's monotone cubic (M. Steffen, Astron. Astrophys. 239, 1990,
 * 443-450; GSL's gsl_interp_steffen), which never overshoots its control values, so that a
 * chord bound kept at the control points is kept everywhere; two control points: linear.
 * Chords are bounded by the logistic transform c = c_min + (c_max - c_min)/(1 + exp(-u)).
 * The tip-Mach and thickness limits, and the share of a point's thrust that rests on flagged
 * polars (extended, bridged, Re outside the table: the rotor's low-confidence measure), enter
 * as exterior penalties, linear (exact) plus quadratic (Nocedal & Wright, Numerical
 * Optimization, 2nd ed. 2006, secs. 17.1-17.2; OPT_EXACT, OPT_PENALTY below). Minimiser: GSL's Nelder-Mead simplex (nmsimplex2;
 * Nelder & Mead, Computer J. 7, 1965), derivative-free because a trim that moves a station
 * across a kink of its polar makes the objective only piecewise smooth.
 */
#include "core/core_impl.h"
#include "airscrew/ascr_design.h"

#include <gsl/gsl_errno.h>
#include <gsl/gsl_interp.h>
#include <gsl/gsl_multimin.h>
#include <math.h>
#include <string.h>

/* objective (normalised by the start's) of a blade whose trim fails: worse than any feasible
 * blade the simplex will meet */
#define OPT_INFEASIBLE 1e3
/* exterior penalty of a relative violation v: OPT_EXACT v + OPT_PENALTY v^2. The linear term is
 * exact (a minimum of the penalised objective keeps the limit) when OPT_EXACT exceeds the
 * limit's multiplier, the relative change of the objective per relative change of the limit
 * (Nocedal & Wright, Numerical Optimization, 2nd ed. 2006, sec. 17.2, Theorem 17.3): of order
 * 1 here, so 100; the quadratic term (a 1 % violation costing the objective's own size) keeps
 * the simplex off blades far outside. The quadratic term alone left violations of 1e-3 where
 * the objective leans on a limit (the thickness of an 8-inch blade). */
#define OPT_EXACT 1e2
#define OPT_PENALTY 1e4

static double limit_cost(double v)
{
  return v > 0.0 ? OPT_EXACT * v + OPT_PENALTY * v * v : 0.0;
}
/* scale of the twist variables, deg per unit (the chords' logistic variables are O(1)) */
#define OPT_TWIST_SCALE 10.0

ascr_opt_spec ascr_opt_spec_defaults(void)
{
  ascr_opt_spec o;
  memset(&o, 0, sizeof o);
  o.n_control = 5;
  o.max_tip_mach = NAN;
  o.max_iterations = 3000;
  o.tolerance = 1e-3;
  return o;
}

typedef struct opt_ctx {
  const ascr_blade *start;
  const ascr_polar_table *const *tables;
  ascr_rotor_params p;
  const ascr_opt_spec *o;
  size_t k;                          /* control points */
  double cr[ASCR_OPT_MAX_CONTROL];   /* control radii */
  double cc[ASCR_OPT_MAX_CONTROL], ct[ASCR_OPT_MAX_CONTROL]; /* current control values */
  gsl_interp *ic, *it;
  gsl_interp_accel *acc;
  ascr_blade b;                      /* the blade being evaluated (stations in st) */
  ascr_blade_station st[ASCR_MIL_MAX_STATIONS];
  double f0;                         /* start objective, W (normaliser) */
  int evaluations;
} opt_ctx;

static double chord_of(const ascr_opt_spec *o, double u)
{
  return o->chord_min_m + (o->chord_max_m - o->chord_min_m) / (1.0 + exp(-u));
}

static double logit_of(const ascr_opt_spec *o, double c)
{
  double f = (c - o->chord_min_m) / (o->chord_max_m - o->chord_min_m);
  f = fmin(fmax(f, 0.02), 0.98); /* a start on a bound: just inside it */
  return log(f / (1.0 - f));
}

/* the blade of the variables x (chord logits, then twists / OPT_TWIST_SCALE) */
static void blade_of(opt_ctx *c, const gsl_vector *x)
{
  for (size_t j = 0; j < c->k; j++) {
    c->cc[j] = chord_of(c->o, gsl_vector_get(x, j));
    c->ct[j] = OPT_TWIST_SCALE * gsl_vector_get(x, c->k + j);
  }
  gsl_interp_init(c->ic, c->cr, c->cc, c->k);
  gsl_interp_init(c->it, c->cr, c->ct, c->k);
  for (size_t i = 0; i < c->b.n_stations; i++) {
    double r = fmin(fmax(c->st[i].r_m, c->cr[0]), c->cr[c->k - 1]);
    c->st[i].chord_m = gsl_interp_eval(c->ic, c->cr, c->cc, r, c->acc);
    c->st[i].twist_deg = gsl_interp_eval(c->it, c->cr, c->ct, r, c->acc);
  }
}

/* every point trimmed; the weighted power (W) and the penalty (normalised); 0 if a trim fails */
static int points_of(opt_ctx *c, ascr_opt_point_result *pr, double *power, double *penalty)
{
  const ascr_opt_spec *o = c->o;
  double sum = 0.0, pen = 0.0;
  int ok = 1;
  for (size_t j = 0; j < o->n_points; j++) {
    const ascr_opt_point *q = &o->points[j];
    ascr_rotor_result r;
    ascr_opt_point_result *w = &pr[j];
    memset(w, 0, sizeof *w);
    w->rpm = w->thrust_N = w->power_W = w->tip_mach = NAN;
    w->efficiency = w->figure_of_merit = w->tip_mach_margin = NAN;
    ascr_status st = ascr_rotor_rpm_for_thrust(&c->b, c->tables, &c->p, ASCR_INFLOW_BEMT, NULL,
                                               q->thrust_N, q->speed_m_s, o->rpm_lo, o->rpm_hi,
                                               &r, NULL, NULL);
    if (st != ASCR_OK || !r.converged) {
      ok = 0;
      continue;
    }
    w->trimmed = 1;
    w->rpm = r.rpm;
    w->thrust_N = r.thrust_N;
    w->power_W = r.power_W;
    w->tip_mach = r.tip_mach;
    w->efficiency = r.efficiency;
    w->figure_of_merit = r.figure_of_merit;
    w->low_confidence = r.low_confidence;
    w->flagged_thrust_share = r.flagged_thrust_share;
    if (!o->allow_extended) {
      pen += limit_cost((r.flagged_thrust_share - ASCR_ROTOR_LOW_CONFIDENCE_SHARE) /
                        ASCR_ROTOR_LOW_CONFIDENCE_SHARE);
    }
    sum += q->weight * r.power_W;
    if (o->max_tip_mach > 0.0) {
      w->tip_mach_margin = o->max_tip_mach - r.tip_mach;
      pen += limit_cost(-w->tip_mach_margin / o->max_tip_mach);
    }
  }
  if (o->min_thickness_m > 0.0 && o->section_thickness != NULL) {
    for (size_t i = 0; i < c->b.n_stations; i++) {
      double t = c->st[i].chord_m * o->section_thickness[c->st[i].section];
      pen += limit_cost((o->min_thickness_m - t) / o->min_thickness_m);
    }
  }
  *power = sum;
  *penalty = pen;
  return ok;
}

static double objective(const gsl_vector *x, void *vc)
{
  opt_ctx *c = vc;
  ascr_opt_point_result pr[ASCR_OPT_MAX_POINTS];
  double power, pen;
  c->evaluations++;
  blade_of(c, x);
  if (!points_of(c, pr, &power, &pen)) return OPT_INFEASIBLE;
  return power / c->f0 + pen;
}

/* the margins of the blade in c->st with its points pr (trimmed: ok); 1 if it keeps every
 * limit within 1e-4 of the limit (the penalties leave about 1e-5) */
static int margins(const opt_ctx *c, const ascr_opt_point_result *pr, int ok, double *chord_m,
                   double *thick_m)
{
  const ascr_opt_spec *o = c->o;
  double cm = HUGE_VAL, tm = HUGE_VAL;
  for (size_t i = 0; i < c->b.n_stations; i++) {
    double ch = c->st[i].chord_m;
    cm = fmin(cm, fmin(ch - o->chord_min_m, o->chord_max_m - ch));
    if (o->min_thickness_m > 0.0 && o->section_thickness != NULL) {
      tm = fmin(tm, ch * o->section_thickness[c->st[i].section] - o->min_thickness_m);
    }
  }
  *chord_m = cm;
  *thick_m = isfinite(tm) ? tm : NAN;
  int feasible = ok && cm >= -1e-12 && !(*thick_m < -1e-4 * o->min_thickness_m);
  for (size_t j = 0; j < o->n_points; j++) {
    if (pr[j].tip_mach_margin < -1e-4 * o->max_tip_mach) feasible = 0;
    if (!o->allow_extended && pr[j].flagged_thrust_share > ASCR_ROTOR_LOW_CONFIDENCE_SHARE + 1e-4) {
      feasible = 0;
    }
  }
  return feasible;
}

/* the result's blade, points and margins at x */
static void fill(opt_ctx *c, const gsl_vector *x, ascr_opt_result *out)
{
  double power, pen;
  blade_of(c, x);
  int ok = points_of(c, out->points, &power, &pen);
  out->objective_W = ok ? power : NAN;
  out->n = c->b.n_stations;
  memcpy(out->st, c->st, out->n * sizeof *out->st);
  out->n_control = c->k;
  memcpy(out->control_r_m, c->cr, c->k * sizeof *c->cr);
  memcpy(out->control_chord_m, c->cc, c->k * sizeof *c->cc);
  memcpy(out->control_twist_deg, c->ct, c->k * sizeof *c->ct);
  out->feasible = margins(c, out->points, ok, &out->chord_margin_m, &out->thickness_margin_m);
}

static ascr_status check(const ascr_blade *b, const ascr_opt_spec *o, ascr_errbuf *err)
{
  if (o->n_points < 1 || o->n_points > ASCR_OPT_MAX_POINTS) {
    return core_fail(err, ASCR_EINVAL, "optimise: 1 .. %d operating points", ASCR_OPT_MAX_POINTS);
  }
  for (size_t j = 0; j < o->n_points; j++) {
    const ascr_opt_point *q = &o->points[j];
    if (!(q->speed_m_s >= 0.0 && isfinite(q->speed_m_s)) || !(q->thrust_N > 0.0 && isfinite(q->thrust_N)) ||
        !(q->weight > 0.0 && isfinite(q->weight))) {
      return core_fail(err, ASCR_EINVAL, "optimise: point %zu: speed >= 0, thrust > 0 and "
                       "weight > 0 required", j + 1);
    }
  }
  if (o->n_control < 2 || o->n_control > ASCR_OPT_MAX_CONTROL) {
    return core_fail(err, ASCR_EINVAL, "optimise: 2 .. %d control points", ASCR_OPT_MAX_CONTROL);
  }
  if (!(o->chord_min_m > 0.0) || !(o->chord_max_m > o->chord_min_m) || !isfinite(o->chord_max_m)) {
    return core_fail(err, ASCR_EINVAL, "optimise: chord bounds 0 < min < max required");
  }
  if (!(o->rpm_lo > 0.0) || !(o->rpm_hi > o->rpm_lo) || !isfinite(o->rpm_hi)) {
    return core_fail(err, ASCR_EINVAL, "optimise: rpm range 0 < low < high required");
  }
  if (o->max_iterations < 1 || !(o->tolerance > 0.0) || o->min_thickness_m < 0.0 ||
      !(o->max_tip_mach >= 0.0 || isnan(o->max_tip_mach))) {
    return core_fail(err, ASCR_EINVAL, "optimise: iterations >= 1, tolerance > 0, thickness and "
                     "tip Mach limits >= 0 required");
  }
  if (b->n_stations < 3 || b->n_stations > ASCR_MIL_MAX_STATIONS) {
    return core_fail(err, ASCR_EINVAL, "optimise: the start blade needs 3 .. %d stations",
                     ASCR_MIL_MAX_STATIONS);
  }
  return ascr_blade_validate(b, err);
}

ascr_status ascr_design_optimize(const ascr_blade *start, const ascr_polar_table *const *tables,
                                 const ascr_rotor_params *pin, const ascr_opt_spec *o,
                                 ascr_opt_result *out, ascr_errbuf *err)
{
  if (start == NULL || tables == NULL || o == NULL || out == NULL) {
    return core_fail(err, ASCR_EINVAL, "optimise: NULL argument");
  }
  ascr_status st = check(start, o, err);
  if (st != ASCR_OK) return st;
  memset(out, 0, sizeof *out);
  opt_ctx c;
  memset(&c, 0, sizeof c);
  c.start = start;
  c.tables = tables;
  c.p = pin != NULL ? *pin : ascr_rotor_params_defaults();
  c.o = o;
  c.k = o->n_control;
  c.b = *start;
  c.b.stations = c.st;
  c.b.pitch_offset_deg = 0.0; /* folded into the twists */
  memcpy(c.st, start->stations, start->n_stations * sizeof *c.st);
  size_t n = start->n_stations;
  double r0 = start->stations[0].r_m, r1 = start->stations[n - 1].r_m;
  const gsl_interp_type *type = c.k >= 3 ? gsl_interp_steffen : gsl_interp_linear;
  c.ic = gsl_interp_alloc(type, c.k);
  c.it = gsl_interp_alloc(type, c.k);
  c.acc = gsl_interp_accel_alloc();
  gsl_vector *x = gsl_vector_alloc(2 * c.k), *step = gsl_vector_alloc(2 * c.k);
  gsl_multimin_fminimizer *m = gsl_multimin_fminimizer_alloc(gsl_multimin_fminimizer_nmsimplex2,
                                                             2 * c.k);
  if (c.ic == NULL || c.it == NULL || c.acc == NULL || x == NULL || step == NULL || m == NULL) {
    st = core_fail(err, ASCR_ENOMEM, "optimise: out of memory");
    goto done;
  }
  /* start: the start blade at the control radii (linear between its stations) */
  for (size_t j = 0; j < c.k; j++) {
    double r = r0 + (r1 - r0) * (double)j / (double)(c.k - 1);
    size_t i = 0;
    while (i + 2 < n && start->stations[i + 1].r_m < r) i++;
    const ascr_blade_station *a = &start->stations[i], *b = &start->stations[i + 1];
    double f = (r - a->r_m) / (b->r_m - a->r_m);
    c.cr[j] = r;
    double ch = a->chord_m + f * (b->chord_m - a->chord_m);
    if (o->min_thickness_m > 0.0 && o->section_thickness != NULL) {
      /* a start that breaks the thickness limit (the MIL blade's narrow tip) starts the
       * simplex far inside the penalty, where it stalls: the control chord is raised to 2 %
       * above the limit of the nearer station's section */
      const ascr_blade_station *near = f < 0.5 ? a : b;
      ch = fmax(ch, 1.02 * o->min_thickness_m / o->section_thickness[near->section]);
    }
    gsl_vector_set(x, j, logit_of(o, ch));
    gsl_vector_set(x, c.k + j, (start->pitch_offset_deg + a->twist_deg +
                                f * (b->twist_deg - a->twist_deg)) / OPT_TWIST_SCALE);
    gsl_vector_set(step, j, 0.4);
    gsl_vector_set(step, c.k + j, 1.5 / OPT_TWIST_SCALE);
  }
  double power, pen;
  blade_of(&c, x);
  if (!points_of(&c, out->start_points, &power, &pen) || !(power > 0.0)) {
    st = core_fail(err, ASCR_EDOM, "optimise: the start blade (on %zu control points) does not "
                   "reach the thrust of every point between %g and %g rpm", c.k, o->rpm_lo,
                   o->rpm_hi);
    goto done;
  }
  c.f0 = power;
  out->start_objective_W = power;
  {
    double cm, tm;
    out->start_feasible = margins(&c, out->start_points, 1, &cm, &tm);
  }
  gsl_multimin_function fn = {objective, 2 * c.k, &c};
  gsl_multimin_fminimizer_set(m, &fn, x, step);
  int it = 0, conv = 0;
  double size = NAN;
  while (it < o->max_iterations) {
    it++;
    if (gsl_multimin_fminimizer_iterate(m) != GSL_SUCCESS) break;
    size = gsl_multimin_fminimizer_size(m);
    if (gsl_multimin_test_size(size, o->tolerance) == GSL_SUCCESS) {
      conv = 1;
      break;
    }
  }
  fill(&c, gsl_multimin_fminimizer_x(m), out);
  out->iterations = it;
  out->evaluations = c.evaluations;
  out->simplex_size = size;
  out->converged = conv;
  st = ASCR_OK;
done:
  gsl_multimin_fminimizer_free(m);
  gsl_vector_free(x);
  gsl_vector_free(step);
  gsl_interp_accel_free(c.acc);
  gsl_interp_free(c.ic);
  gsl_interp_free(c.it);
  return st;
}
