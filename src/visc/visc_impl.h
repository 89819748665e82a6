/* src/visc/visc_impl.h
 * Private definitions of the viscous stage: the solver object, the station bookkeeping and
 * the residual functions of the coupled boundary-layer system.
 *
 * Notation. Stations k = 0..nst-1: the upper surface from the node next to the stagnation
 * point to the trailing edge (nu stations), the lower surface likewise (nl), then the wake
 * (nw, the first at the trailing edge). Per station three unknowns: theta (momentum
 * thickness), m = ue * dstar (mass defect) and c = N (laminar) or sqrt(Ctau) (turbulent).
 * Source panels p = 0..np-1: the n-1 surface panels, then the nw-1 wake panels.
 * ue = ue_inv + D m, D = E G: E[node][p] is the edge-velocity change at a node per unit
 * source on panel p, G maps mass defects to panel sources (sigma = dm/ds along the flow).
 */
#ifndef ASCR_VISC_IMPL_H
#define ASCR_VISC_IMPL_H

#include "airscrew/ascr_visc.h"
#include "bl/bl_impl.h"
#include "panel/panel_impl.h"

/* Saved-state slots of a solver (visc_snapshot / visc_restore). */
#define VISC_SLOTS 6

/* A converged state by node (surface nodes 0..n-1, then the wake n..n+nw-1) with its
 * condition, for the secant predictor (predictor.c). turb holds regime + 2 * (lower side). */
typedef struct visc_pred_rec {
  double *th, *mm, *cc;
  int *turb;
  size_t is;
  double alpha, re, cl;
  int valid;
} visc_pred_rec;

/* Local state of one station as the residuals see it. */
typedef struct vstate {
  double th, m, c, ue; /* unknowns and edge velocity */
  double xi;           /* arc length from the stagnation point (surfaces) or the TE (wake) */
  double kappa;        /* wall curvature, 1/chord, convex > 0 (0 in the wake) */
  int turb;            /* 1 turbulent, 0 laminar */
  int first;           /* 1 for the first station of a surface (next to the stagnation point) */
} vstate;

/* Residual kinds. */
enum { VR_STAG = 0, VR_LAM = 1, VR_TRANS = 2, VR_TURB = 3, VR_WAKE = 4, VR_MERGE = 5 };

typedef struct vctx {
  double re, mach, ncrit;
  bl_turb_fit turb_fit; /* how the turbulent fits are evaluated (v->turb_fit) */
  double xi_trip; /* forced transition xi on this side (negative for none) */
  double stag_a;  /* edge-velocity gradient at the stagnation point, d ue / d xi */
  double xi_min;  /* least distance of a first station from the stagnation point */
  int exact_tr;   /* 1: the exact rule places transition (0: placement phase of a start) */
  double hiem_h, hiem_f; /* the closure's Hiemenz layer (bl_similarity_shape, m = 1) */
} vctx;

/* Residuals R[0..2] of one station (kinds above). For VR_MERGE, a = upper TE, b = lower TE,
 * w = first wake station; otherwise a is the previous station and b the current one.
 * For VR_TRANS, f_tr[0] receives the fraction of the interval at which transition occurs,
 * f_tr[1] the amplification N that the rate at a reaches at b (infinite where a trip lies in
 * the interval) and f_tr[2] the shape parameter Hk at a. */
void visc_residual(int kind, const vctx *cx, const vstate *a, const vstate *b, const vstate *w,
                   double *R, double *f_tr);

/* A station's closure evaluations as one end of a laminar, turbulent or wake interval: at its
 * state and with each of its four variables raised by its forward-difference step (residual.c).
 * They depend on the station's state, its steps, the regime and the context only, so the
 * downstream end of one interval serves as the upstream end of the next. */
typedef struct visc_vev {
  double h, rth, me;
  bl_closure c;
  double mom, ke, lag, amp;
} visc_vev;
typedef struct visc_end_evals {
  size_t k;         /* the station (SIZE_MAX: nothing held) */
  int turb, wake;   /* the regime it was evaluated in */
  const vctx *cx;
  visc_vev e0, ep[4];
} visc_end_evals;

/* For VR_LAM, VR_TURB and VR_WAKE: R0 = the residual of a -> b, R1[q][var] the residual with
 * variable var (0 theta, 1 m, 2 the third unknown, 3 ue) of end q (0 a, 1 b) raised by
 * h[q][var], and (Rx not NULL) Rx the residual with xi of both ends raised by hx — the numbers
 * visc_residual gives for those states, at about half the closure evaluations (the Newton
 * matrix's forward differences, jacobian.c). a and b are stations ka and kb; ends (may be
 * NULL) holds the evaluations of the previous interval's downstream end: used for a when it is
 * station ka in the same regime and context, then replaced by b's. */
void visc_residual_plain_fd(int kind, const vctx *cx, const vstate *a, const vstate *b,
                            const double h[2][4], double hx, double R0[3], double R1[2][4][3],
                            double Rx[3], size_t ka, size_t kb, visc_end_evals *ends);

/* sqrt(Ctau) at the start of turbulent flow for the (laminar) state s: bl_ctau_initial at the
 * shape parameter of s. */
double visc_sqrt_ctau_start(const vctx *cx, const vstate *s);

/* The wall curvature at the nodes, v->kappa_node (stations.c): zero where p.wall_curvature is 0. */
void visc_wall_curvature(ascr_visc_solver *v);

/* Cold-start march of one surface (coldstart.c): n stations at xi[0..n-1] with driving edge
 * velocities ue[0..n-1] and wall curvatures kappa[0..n-1]; first = the state of station 0
 * (stagnation); fills th, m, c, turb for the n stations. Returns 1, or 0 if some station was
 * only approximated. */
int visc_cold_march(const vctx *cx, size_t n, const double *xi, const double *ue,
                    const double *kappa, const vstate *first, double *th, double *m, double *c,
                    int *turb);

/* Station with the stagnation similarity start: theta of the closure's Hiemenz layer for the
 * context's stagnation-flow gradient (its H is cx->hiem_h). */
double visc_hiemenz_theta(const vctx *cx);

/* The run under way (driver.c): one start's Newton iteration. */
enum {
  VISC_RUN_NONE = 0,   /* no run started (or the start failed) */
  VISC_RUN_GOING,
  VISC_RUN_CONVERGED,
  VISC_RUN_LIMIT,      /* iteration limit */
  VISC_RUN_STALLED,    /* steps in a row without descent */
  VISC_RUN_LOST,       /* the stagnation point was lost */
  VISC_RUN_NONFINITE,  /* converged to a state whose forces are not finite */
  VISC_RUN_SINGULAR    /* singular Newton system */
};
typedef struct visc_run {
  double alpha;        /* angle of the run, rad */
  int kind;            /* ascr_visc_start actually used */
  int warm;            /* 1: started from the previous converged state */
  int state;           /* VISC_RUN_* */
  int it;              /* Newton steps taken */
  int exact;           /* 1 once the exact rule places transition */
  int it_exact;        /* step at which it took over after a placement phase (0: from the start) */
  int n_moves;         /* moves of the placement phase */
  int since_best;      /* steps since the residual last fell below 0.7 of its best */
  int n_uphill;        /* steps in a row without descent */
  double rel, rbest;   /* largest relative update of the last step; best residual */
  double rel_full;     /* that of the step before, where both it and its iterate's intervals
                          were kept whole (INFINITY otherwise): the contraction estimate */
  double err;          /* error left after the last step: rel, or the contraction estimate */
  ascr_visc_result res; /* results, filled when the run ends */
} visc_run;

struct ascr_visc_solver {
  size_t n, nw, np;          /* nodes, wake nodes, source panels */
  size_t nst;                /* stations = n + nw */
  const ascr_panel_solver *ps; /* borrowed */
  ascr_visc_params p;
  int is_set, have_solution;
  int exact_phase;           /* 1 while the exact rule places transition (residual forms) */
  visc_run run;              /* the run under way (driver.c) */
  double alpha;              /* angle of the prepared wake */
  double *snode;             /* arc length at the nodes, n */
  double *kappa_node;        /* wall curvature at the nodes, smoothed, n (0 without the option) */
  double *xw, *yw, *sw;      /* wake nodes and arc length from the TE, nw */
  double *E;                 /* (n + nw) x np, row-major: d ue(node) / d sigma_p, surface rows
                                give d gamma_i / d sigma_p */
  double *gam_inv;           /* inviscid gamma at the nodes, n */
  double *qw_inv;            /* inviscid tangential speed at the wake nodes, nw */
  double *plen;              /* source panel lengths, np */
  /* scratch for the preparation */
  double *work;              /* (n+1) x max(n-1, nw-1) */
  double *cu, *cv;           /* n */
  double *qmid;              /* (nw-1) x np */
  double *qmid_g;            /* (nw-1) x n */
  double *qmid_inv;          /* nw-1 */
  double *wtx, *wty;         /* unit tangents of the wake panels, nw-1 */
  /* stations */
  size_t is;                 /* stagnation between node is (upper) and is+1 (lower) */
  double s_stag;
  size_t nu, nl;
  size_t *node;              /* node index (surface) or wake index (wake), nst */
  int *side;                 /* 0 upper, 1 lower, 2 wake */
  double *sgn;               /* +1 upper and wake, -1 lower */
  double *xi;                /* nst: distance from the stagnation point (surfaces), from the TE (wake) */
  double *dfirst;            /* nst: distance from the side's first node (surfaces) */
  double *kappa_st;          /* nst: wall curvature of the station (kappa_node; 0 in the wake) */
  double dsp;                /* length of the panel holding the stagnation point */
  double hiem_h, hiem_f;   /* the Hiemenz layer's H and Re_theta Cf/2, once (vctx) */
  bl_turb_fit turb_fit;    /* how the turbulent fits are evaluated: as published
                              * (bl_turb_fit_published), changed only inside a start (solver.c) */
  double *D;                 /* nst x nst row-major */
  double *ue_inv;            /* nst */
  size_t *pa, *pb;           /* stations at the ends of each source panel, np */
  double *ga, *gb;           /* sigma_p = ga m[pa] + gb m[pb] */
  /* unknowns */
  double *th, *mm, *cc;
  int *turb;
  double *ue;
  double f_tr[2];            /* transition fraction in the transition interval, per side */
  size_t itr[2];             /* first turbulent station index within the side (n_side if none) */
  int forced[2];
  /* Newton */
  double *J, *R, *dx;
  lapack_int *ipiv;
  /* the Newton matrix in structured form, J = L + U D Q (solver.c, "structured solve"):
   * L local (block lower triangular in station order), U the residuals' dependence on the edge
   * velocities, D the mass-defect influence, Q the m columns */
  int dense_jac;             /* 1: assemble writes the dense J instead (fallback) */
  size_t *lst;               /* nst x 3: stations of each row-station's blocks (SIZE_MAX: none) */
  double *lblk;              /* nst x 3 x 9: blocks, [e * 3 + var] */
  size_t *uidx;              /* 3 nst x UMAX: D rows */
  double *ucoef;             /* 3 nst x UMAX */
  int *ucnt;                 /* 3 nst */
  double *zm;                /* nst x nst, row-major: m rows of L^-1 U */
  double *mmat;              /* nst x nst, row-major: I + D zm */
  double *wv, *yv, *chk;     /* 3 nst, nst, 3 nst */
  lapack_int *ipiv2;         /* nst */
  double *dinv;              /* nst x 9: inverses of the diagonal blocks of L */
  int *iscratch;              /* 2 nst, for carrying flags over a restage */
  double *cp;                /* surface Cp, n */
  double *sig;               /* np: panel source strengths (visc_relocate_stagnation) */
  double *march_s, *march_ue; /* n: one side's arc lengths and velocities (coupled-march start) */
  ascr_bl_station *march_out; /* n: its marched stations */
  /* saved converged states (visc_snapshot / visc_restore): slots 0, 2 and 3 for callers
   * (sweeps), slots 1, 4 and 5 for the solver's own use (solver.c) */
  double *sv_th[VISC_SLOTS], *sv_mm[VISC_SLOTS], *sv_cc[VISC_SLOTS];
  int *sv_turb[VISC_SLOTS];
  size_t sv_is[VISC_SLOTS];
  double sv_s_stag[VISC_SLOTS];
  int sv_have[VISC_SLOTS];
  /* secant predictor (predictor.c): the angle of the live converged state, the converged state
   * it was continued from, and the start of the solve under way; snapshots keep both */
  double cur_alpha, cur_re, cur_cl;
  int pred_off, pred_used;   /* visc_solve: predictor not to be used / used by the last solve */
  int branch_ended;          /* visc_solve: 1 where its continuation step left the secant's line
                                and the halves did not follow (the branch ended; the state is
                                the direct step's or a fresh start's) */
  visc_pred_rec pred_prev, pred_start;
  double sv_alpha[VISC_SLOTS], sv_re[VISC_SLOTS], sv_cl[VISC_SLOTS];
  visc_pred_rec sv_prev[VISC_SLOTS];
  ascr_visc_trace_fn trace;
  void *trace_ctx;
};

/* driver.c: the run of one start (warm: from the previous converged state if there is one,
 * otherwise the fresh start kind, an ascr_visc_start), its steps, its state (the status of
 * ascr_visc_solver_test) and, for a run that ended unconverged, its message in err. */
ascr_status visc_run_start(ascr_visc_solver *v, double alpha_rad, int warm, int kind,
                           ascr_errbuf *err);
ascr_status visc_run_iterate(ascr_visc_solver *v, ascr_visc_step *step, ascr_errbuf *err);
ascr_status visc_run_test(const ascr_visc_solver *v);
ascr_status visc_run_message(const ascr_visc_solver *v, ascr_errbuf *err);

/* ascr_visc_solver_solve with the fresh starts that follow a failed warm start allowed
 * (cold_ok = 1, the public behaviour) or not (cold_ok = 0: continuation only). A fresh start
 * depends only on the condition, so a caller that has already tried it at this angle (a sweep
 * retrying a point, a second walk) passes 0 and is spared repeating it. */
ascr_status visc_solve(ascr_visc_solver *v, double alpha_rad, int warm, int cold_ok,
                       ascr_visc_result *r, ascr_errbuf *err);

/* The first group of fresh starts alone (the marches and the start through a provisional trip;
 * not the continuations from a higher Re or a lower floor): a cheap look for a state the
 * sweeps may not reach (src/polar/sweep.c, ascr_polar_check_fresh). */
ascr_status visc_solve_fresh_first(ascr_visc_solver *v, double alpha_rad, ascr_visc_result *r);

/* Save the current converged state / bring it back (for continuation after a failed point). */
void visc_snapshot(ascr_visc_solver *v, int slot);
void visc_restore(ascr_visc_solver *v, int slot);

/* most edge-velocity terms in one residual row: three stations' ue, and the two stagnation
 * terms with two D rows each (jacobian.c, linsolve.c, workspace.c) */
#define UMAX 8

/* ---- the steps of a solve, one file each (see solver.c for the method) ---- */

/* influence.c: wake geometry and the alpha-dependent parts of E for angle alpha (rad). */
ascr_status visc_prepare_alpha(ascr_visc_solver *v, double alpha, ascr_errbuf *err);

/* stations.c */
void visc_restage(ascr_visc_solver *v, size_t is, double s_stag); /* stations, D, ue_inv */
int visc_find_stagnation(const ascr_visc_solver *v, const double *gam, size_t *is,
                         double *s_stag);                      /* 0, or -1 if none */
void visc_update_ue(ascr_visc_solver *v);                      /* ue = ue_inv + D m */
/* y = y0 + D x[0::stride] (y0 NULL: 0), the terms of each row summed in order (stations.c). */
void visc_d_times(const ascr_visc_solver *v, const double *y0, const double *x, size_t stride,
                  double *y);
void visc_set_xi(ascr_visc_solver *v);                         /* xi from the stagnation offsets */
vstate visc_get_state(const ascr_visc_solver *v, size_t k);
int visc_station_kind(const ascr_visc_solver *v, size_t k, size_t *a, size_t *b, size_t *w);
double visc_stag_span(const ascr_visc_solver *v);
vctx visc_context(const ascr_visc_solver *v, int side);        /* side 0, 1, 2 (wake) */
int visc_relocate_stagnation(ascr_visc_solver *v);             /* 1 moved, 0 not, -1 none */

/* residual.c: residual norm^2 at the current state; jacobian.c: R and the Newton matrix
 * (largest |R|). */
double visc_residual_norm2(ascr_visc_solver *v, const vctx cxs[3]);
double visc_assemble(ascr_visc_solver *v, const vctx cxs[3]);

/* linsolve.c: J dx = -R in structured form; 1 on success. */
int visc_solve_structured(ascr_visc_solver *v);

/* transition_rules.c */
size_t visc_first_turbulent(const ascr_visc_solver *v, size_t k0, size_t k1);
/* look-ahead placement (the coupled-march start's first phase) and the exact rule */
int visc_update_transition(ascr_visc_solver *v, const vctx cxs[3], double hyst);
int visc_transition_exact(ascr_visc_solver *v, const vctx cxs[3]);
size_t visc_transition_place(ascr_visc_solver *v, const vctx *cx, int side, size_t kt_new,
                             int to_place);

/* coldstart.c: the two fresh starts (ASCR_VISC_START_MARCH, ASCR_VISC_START_COUPLED_MARCH). */
void visc_initial_state_exact(ascr_visc_solver *v);
ascr_status visc_initial_state(ascr_visc_solver *v, const vctx cxs[3], ascr_errbuf *err);

/* predictor.c: capture the live state as a record at angle alpha; copy a record; apply the
 * secant predictor from prev (angle prev->alpha) through the live state (angle alpha1) to
 * alpha, returning 1 if it was applied. */
void visc_pred_capture(const ascr_visc_solver *v, visc_pred_rec *rec, double alpha);
void visc_pred_copy(const ascr_visc_solver *v, visc_pred_rec *dst, const visc_pred_rec *src);
int visc_pred_apply(ascr_visc_solver *v, const visc_pred_rec *prev, double alpha1, double alpha);
/* After visc_pred_apply (edge velocities and xi updated): the transition interval of each side
 * placed at the transition point extrapolated from prev and cur (the live state's record). */
void visc_pred_transition(ascr_visc_solver *v, const visc_pred_rec *prev, double alpha1,
                          double alpha, const visc_pred_rec *cur);

/* forces.c: results of the current state; x/c of a side's transition crossing (NaN if none). */
void visc_results(ascr_visc_solver *v, const vctx cxs[3], ascr_visc_result *r);
double visc_x_transition(const ascr_visc_solver *v, int side);

#endif
