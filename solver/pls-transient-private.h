/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pls-transient-private.h: what the time-domain files share (lumped model,
 * integrator, firing cycle, shutdown), and the entry points the tests use
 * to drive the integrator from a state of their own.
 *
 * The lumped model: every network node, the interior nodes of segmented
 * lines and one gas chamber per accumulator are model nodes with a
 * (possibly pressure-dependent) stored volume V(p); every line segment,
 * accumulator neck and every flow-carrying element is a link with an
 * inertance I (0 for the elements without one) and the element's own law
 * h(q).  The ODE is
 *   dV_i/dt = sum of the flows into node i          (free nodes)
 *   I_k dq_k/dt = P_a - P_b - h_k(q_k)               (inertial links)
 *   0 = P_a - P_b - h_k(q_k)                         (algebraic links)
 * with P = p + rho g z.  The algebraic links' flows are explicit functions
 * of the pressures (h is strictly increasing), so it is an ODE in the node
 * pressures and the inertial flows.
 */
#pragma once

#include <cholmod.h>

#include "pls-network-private.h"

typedef enum
{
  PLS__LINK_ELEMENT = 0,  /* a two-port element by its law, no inertance     */
  PLS__LINK_SEGMENT,      /* one pi-segment of a line: law x fraction, I     */
  PLS__LINK_NECK,         /* accumulator neck: pipe law of the neck, I       */
  PLS__LINK_NOZZLE,       /* applicator to atmosphere, valve opening s(t)    */
} pls__link_kind;

typedef struct
{
  /* What the Newton loop reads for every link first, in one cache line. */
  int a, b;           /* model nodes; b = -1: atmosphere at a's elevation   */
  double inertance;   /* Pa s^2/m^3; 0 for algebraic links                   */
  /* Laminar Newtonian shortcut (SEGMENT and NECK links of a Newtonian
   * fluid): below lam_qmax the law is Hagen-Poiseuille, h = lam_r q, the
   * branch pls_line_drop takes there; lam_qmax = 0: always the full law. */
  double lam_r;       /* Pa s/m^3                                           */
  double lam_qmax;    /* m^3/s                                              */
  pls__link_kind kind;
  int elem;           /* network element                                    */
  double scale;       /* segment: fraction of the line's length, else 1     */
  int app;            /* applicator index (nozzles), else -1                */
  pls_line_params neck; /* the neck as a rigid pipe (NECK links)            */
  /* Laminar power-law shortcut (SEGMENT and NECK links of a power-law
   * fluid): the closed form of pls_line_drop (its power as exp of a log),
   * with its flow-independent factors computed once; pl_on = 0: always
   * the full law. */
  int pl_on;
  double pl_h;        /* scale 2 L / R: h = pl_h tau_w, m/m                 */
  double pl_re;       /* 8 rho / A^2: Re_MR tau_w = pl_re q^2, kg/m^7       */
  double pl_s;        /* (3n+1) / (pi n R^3): gamma_w = pl_s |q|            */
  double pl_gc;       /* corner wall rate, 1/s                              */
  double pl_re_lo;    /* Ryan-Johnson onset: the full law above it          */
} pls__tlink;

typedef struct
{
  double compliance;  /* linear part dV/dp, m^3/Pa (fluid + wall)           */
  double volume;      /* liquid held, m^3                                   */
  /* Free gas (pls-pocket.c): pocket volume g / (p - PLS_CAVITATION_PRESSURE),
   * g in m^3 Pa; below pocket_floor (Pa absolute) its tangent.  g = 0 for
   * fixed nodes and gas chambers. */
  double pocket_g;
  double pocket_floor;
  double elevation;   /* m                                                  */
  int fixed;          /* 1: pressure given                                  */
  double fixed_pressure; /* Pa gauge                                        */
  int acc;            /* accumulator element whose gas chamber this is, -1  */
  int col;            /* matrix column, -1 for a fixed node                 */
} pls__tnode;

/* Valve opening of the applicators as a function of time. */
typedef enum
{
  PLS__SCHED_CLOSED = 0,  /* every applicator shut                          */
  PLS__SCHED_OPEN,        /* every applicator held open                     */
  PLS__SCHED_FIRING,      /* the periodic firing schedule                   */
  PLS__SCHED_CLOSE_AT,    /* open until t_close, then the closing ramp      */
  PLS__SCHED_HELD,        /* every applicator held at the opening `held`    */
} pls__sched_kind;

typedef struct
{
  pls__sched_kind kind;
  double period;      /* s (FIRING)                                         */
  double on_time;     /* s: start of opening to start of closing            */
  double open_ramp;   /* s                                                  */
  double close_ramp;  /* s                                                  */
  double t_close;     /* s (CLOSE_AT)                                       */
  const double *delay;/* n_app delays (s), NULL for none                    */
  double held;        /* opening in [0, 1] (HELD)                           */
} pls__schedule;

typedef struct
{
  double rtol;        /* relative local error per step                      */
  double atol_p;      /* Pa                                                 */
  double atol_q;      /* m^3/s                                              */
  double h_max;       /* s, largest step                                    */
  double h_min;       /* s, smallest step before giving up                  */
  /* 1: pressures are measured against the largest pressure of the model
   * as well as their own (as flows always are against the largest flow) */
  int p_scale_global;
} pls__tolerances;

typedef struct pls__model pls__model;

/* Called after every accepted step with the model's state at the step's
 * start (m->p0, m->q0), its inner stage (m->pg, m->qg) and its end (m->p,
 * m->q); t0 and t1 bound the step, tg = t0 + gamma (t1 - t0). */
typedef pls_status (*pls__step_fn) (void *user_data, pls__model *m, double t0, double tg,
                                    double t1);

struct pls__model
{
  const pls_network *net;
  const pls_allocator *alloc;
  double rho_g;            /* rho g, Pa/m                                   */
  /* The fluid in its Carreau form (pls_fluid_carreau_form), for the laws
   * of fittings, valves and applicators: the same values without the
   * conversion (a pow for a power law) at every call.  Lines keep the
   * fluid as given: their power law has a closed form of its own. */
  pls_fluid_params fluid_c;
  size_t n_net_nodes;      /* model nodes 0..n_net_nodes-1 are the network's */
  size_t n_nodes;
  pls__tnode *nodes;       /* n_nodes                                       */
  double *head;            /* n_nodes: rho g z of each node, Pa (the loops
                              over links read it, not the node records)    */
  size_t n_links;
  pls__tlink *links;       /* n_links                                       */
  int *segments;           /* n_elements: pi-segments of each line, else 0  */
  size_t n_chambers;
  int *chamber_node;       /* n_chambers: the gas chambers' model nodes    */
  int *chamber;            /* n_elements: model node of an accumulator's gas
                              chamber, else -1                              */
  int *elem_link;          /* n_elements: first link of each element, -1    */
  size_t n_app;
  int *app_elem;           /* n_app: element of each applicator             */
  int *app_link;           /* n_app: its link                               */
  size_t nf;               /* free model nodes = matrix columns             */
  int *col_node;           /* nf                                            */
  int air_on;              /* 1: pumps run, dump valves shut                */
  double air_pressure;     /* Pa gauge                                      */
  unsigned char *active;   /* n_links: link carries flow in this air state  */
  unsigned char *algebraic; /* n_links: no inertance (a compact copy for the
                               Newton loop, which streams through links) */
  unsigned char *shut;     /* n_links: an accumulator neck whose bladder has
                              shut the port (pls-bladder.c)                 */
  unsigned char *on;       /* n_links: the link carries flow in the stage
                              being solved (pls_link_on, taken once a stage:
                              nothing inside a stage changes it)           */
  double *open;            /* n_app: valve opening s in [0, 1] now          */

  /* State: pressures of every model node (fixed ones hold theirs) and
   * flows of every link; the step's start and inner stage. */
  double *p, *q, *p0, *q0, *pg, *qg;
  /* Work arrays */
  double *hist_v, *hist_q;       /* n_nodes, n_links: stage history        */
  double *fv0, *fq0, *fvg, *fqg, *fv1, *fq1; /* f at the three points       */
  double *g, *rl, *rn, *dp, *dq, *ev, *eq; /* n_links / nf / n_links ...   */
  double *h, *dh;                /* n_links: law at q                      */
  double *xs;                    /* n_nodes: |x| of each node at the stage's
                                    start, the scale of its Newton updates
                                    (pls__node_measure)                    */
  double *qint;                  /* n_links: integral of q over the run    */
  double *stroke;                /* n_links: pumps' volume in this stroke  */
  double *gap_end;               /* n_links: end of a pump's changeover gap
                                    (s), 0 when the pump is running       */
  /* The last accepted step's start and inner stage (its end is m->p, m->q)
   * at times pred_t[0], pred_t[1] (end pred_t[2]): the predictor of the
   * next step's first stage; pred_valid = 0 after a restart. */
  double *pred_p0, *pred_pg;     /* n_nodes                                */
  double *pred_q0, *pred_qg;     /* n_links                                */
  double pred_t[3];
  int pred_valid;
  int has_changeover;            /* 1: some pump has a changeover gap       */

  /* Nodal matrix: pattern from pls__pattern, values each Newton step. */
  pls_work w;                    /* pattern only (links, ap, ai, nnz)       */
  cholmod_common c;
  int c_started;
  cholmod_sparse *A;
  cholmod_factor *L;
  cholmod_dense *B, *X, *Y, *E;
  const pls_allocator *c_prev;

  /* Integrator */
  pls__tolerances tol;
  double h_next;                 /* suggested next step, s                 */

  int stop;                      /* set by a step callback: end the run    */
  int fact_valid;                /* the factor in L matches g, ev, kappa   */
  double newton_rate;            /* contraction rate measured by the last
                                    stage that took two updates or more in
                                    this run (pls_stage), 0: none yet      */
  double fact_kappa;             /* kappa of that factor                   */

  /* Statistics */
  long steps, rejected, newton_iterations, factorisations;
  long worst;                    /* component that set the last step's error:
                                    node i >= 0, link -1 - k (diagnostics) */
};

/* Defaults of the model and integration settings are in pls-lumped.c. */
typedef struct
{
  double t_event;          /* fastest event (valve ramp), s, > 0            */
  double per_wavelength;   /* segments per shortest wavelength              */
  int min_segments, max_segments;
  int air_on;
  double air_pressure;
} pls__model_options;

/* Wave speed (m/s) and compliance per length (m^3/(Pa m)) of a line:
 * Korteweg for a rigid pipe, 1/K_eff = 1/K + D/(E e); a hose by its
 * volumetric expansion figure, C' = A/K + expansion. */
void pls__line_wave (const pls_fluid_params *f, const pls_line_params *l, double *speed,
                     double *compliance_per_length);

/* Accumulator fluid volume dVf/dp at a gauge pressure (m^3/Pa) while the
 * port is open: the polytropic law above precharge, its tangent below. */
double pls__accumulator_slope (const pls_accumulator_params *p, double pressure);

/* ---- the bladder port (pls-bladder.c) ------------------------------------ */

/* Fluid volume of an open chamber at a gauge pressure (m^3) and its slope
 * (m^3/Pa): exact above precharge, the tangent at precharge below. */
double pls__bladder_volume (const pls_accumulator_params *p, double pressure, double *slope);
/* After a step from (m->p0, m->q0) to (m->p, m->q): 0 if no port switches,
 * 1 if one switches at the step's end (within the event tolerance), -1 if
 * one switched inside the step: *frac is the secant estimate of the
 * crossing as a fraction of the step. */
int pls__bladder_scan (const pls__model *m, double *frac);
/* Switches the ports whose event the state in m->p, m->q has reached;
 * at_rest = 1 for a starting state (a shut chamber is set to its
 * precharge).  Returns 1 if any port changed. */
int pls__bladder_switch (pls__model *m, int at_rest);

pls_status pls__model_new (const pls_network *net, const pls__model_options *o,
                           pls__model **out, pls_error *err);
void pls__model_free (pls__model *m);
/* Changes the air state (pumps and dump valves) of the model. */
void pls__model_set_air (pls__model *m, int air_on, double air_pressure);
/* Stored volume of an accumulator's chamber node at pressure p (m^3, from
 * p = 0) and its slope dV/dp. */
double pls__chamber_volume (const pls__model *m, const pls__tnode *nd, double p,
                            double *slope);

/* ---- the free gas of a liquid node (pls-pocket.c) ------------------------- */

/* Sets a liquid node's free gas from its volume. */
void pls__pocket_init (pls__tnode *nd);
/* Growth of the gas pocket of a node at gauge pressure p over its size at
 * one atmosphere (m^3), and its slope dVg/dp (<= 0, m^3/Pa).  Isothermal,
 * g / p_abs, less the tangent at one atmosphere:
 *   Vg = g (p_atm - p_abs)^2 / (p_abs p_atm^2)   below one atmosphere,
 * 0 above, so that a line working above atmospheric pressure costs one
 * comparison per node and sees no gas at all (the tangent takes off
 * g / p_atm, 1e-7 of the node's volume, from a pocket of any size that
 * matters).  Below the floor, the tangent there, so that a trial point of
 * Newton's beyond vacuum has a finite volume. */
static inline double
pls__pocket_volume (const pls__tnode *nd, double p, double *slope)
{
  const double t = PLS_ATMOSPHERE, g = nd->pocket_g;
  double pa = p - PLS_CAVITATION_PRESSURE, f = nd->pocket_floor, v, d;

  if (pa >= t)
    {
      *slope = 0.0;
      return 0.0;
    }
  if (pa > f)
    {
      d = t - pa;
      *slope = -g * (t + pa) * d / (t * t * pa * pa);
      return g * d * d / (pa * t * t);
    }
  d = t - f;
  v = g * d * d / (f * t * t);
  *slope = -g * (t + f) * d / (t * t * f * f);
  return v - *slope * (f - pa);
}
/* Absolute pressure, as a share of an atmosphere, below which a node's gas
 * pocket is taken into account in its Newton update and error measure:
 * above it the gas's slope is at most 15 % of the liquid's (alpha 1e-7,
 * K 1.5 GPa: alpha V / (0.01 p_atm) against V / K), mild enough for a
 * plain update and measure in p. */
#define PLS_POCKET_NEAR 0.1
/* The pressure at which a node with a gas pocket holds the stored volume
 * v (the inverse of pls__node_volume). */
double pls__pocket_pressure (const pls__tnode *nd, double v);
/* The update dp of node i at pressure p, computed on a nodal matrix with
 * the node's slope dV/dp = slope, as the change of its stored volume over
 * its liquid compliance, and in *x its stored volume over that compliance:
 * the coordinates in which a pocket is measured by its volume (dp and p
 * themselves while the pocket is negligible).  For the error measures. */
static inline double
pls__node_measure (const pls__model *m, size_t i, double p, double dp, double slope, double *x)
{
  const pls__tnode *nd = &m->nodes[i];

  *x = p;
  if (nd->pocket_g > 0.0 && p - PLS_CAVITATION_PRESSURE < PLS_POCKET_NEAR * PLS_ATMOSPHERE)
    {
      double sg;

      *x = p - pls__pocket_volume (nd, p, &sg) / nd->compliance;
      return dp * slope / nd->compliance;
    }
  return dp;
}

/* Lowers p_low (n_nodes, Pa) to the pressures of the step just taken (its
 * inner stage and end); for a run's step callback. */
void pls__pocket_track (const pls__model *m, double *p_low);
/* Adds a warning with code when the liquid parted at some node (p_low:
 * its lowest pressures), naming the part with the largest cavity; run
 * names the run in the message ("firing cycle", "shutdown").  The
 * finding's value is that cavity's volume (m^3), its limit the vapour
 * pressure taken (Pa gauge). */
pls_status pls__pocket_finding (pls_finding_list *list, const pls_allocator *a,
                                const pls__model *m, const double *p_low, const char *code,
                                const char *run);

/* Stored volume of model node i at pressure p (m^3, from p = 0) and its
 * slope dV/dp: the liquid's compression less its gas pocket's growth, and
 * the chambers' gas law (inline: the Newton loop calls it for every
 * node). */
static inline double
pls__node_volume (const pls__model *m, size_t i, double p, double *slope)
{
  const pls__tnode *nd = &m->nodes[i];
  double v = nd->compliance * p, s = nd->compliance;

  if (nd->acc >= 0)
    return pls__chamber_volume (m, nd, p, slope);
  if (nd->pocket_g > 0.0)
    {
      double sg;

      v -= pls__pocket_volume (nd, p, &sg);
      s -= sg;
    }
  if (slope != NULL)
    *slope = s;
  return v;
}
/* Sets the valve openings for time t from a schedule. */
void pls__schedule_apply (pls__model *m, const pls__schedule *s, double t);
/* Earliest schedule event strictly after t (INFINITY if none). */
double pls__schedule_next_event (const pls__model *m, const pls__schedule *s, double t);

/* Integrates from t0 to t1 (steps land on t1 and every schedule event),
 * calling fn (may be NULL) after each accepted step. */
pls_status pls__integrate (pls__model *m, const pls__schedule *s, double t0, double t1,
                           pls__step_fn fn, void *user_data, pls_error *err);
/* Brings the model to the steady state of its air state and the schedule
 * at time t (valves frozen) by implicit Euler steps of growing length,
 * starting from the state in m->p, m->q. */
pls_status pls__settle (pls__model *m, const pls__schedule *s, double t, pls_error *err);
/* Right side of the ODE at state (p, q) in the free-node pressures and the
 * inertial flows; the algebraic flows are solved from their laws (into
 * m->q).  ydot: dp/dt of each free model node (C(p)^-1 times the inflow),
 * then dq/dt of each inertial link, in model order.  For the tests' check
 * against an independent integrator. */
size_t pls__ode_size (const pls__model *m);
void pls__ode_pack (const pls__model *m, double *y);
void pls__ode_unpack (pls__model *m, const double *y);
pls_status pls__ode_rhs (pls__model *m, double t, const pls__schedule *s, const double *y,
                         double *ydot);

/* Fills the model state from a steady result (node pressures, element
 * flows; interior line nodes interpolated, chambers at their node). */
void pls__model_from_steady (pls__model *m, const pls_steady_result *r);
/* Law of link k at flow q as the integrator evaluates it (shortcuts
 * included); for the tests' check against the element laws. */
void pls__link_law (const pls__model *m, size_t k, double q, pls_drop *d);

/* ---- shared by the cycle and the shutdown (pls-cycle.c) ----------------- */

/* The options a run uses: the caller's, or the defaults (written into
 * *defaults) when options is NULL, set in *o; checked against the network
 * (cycle = 1: the firing schedule too).  err names the option or part at
 * fault; a NULL network is refused. */
pls_status pls__transient_options (const pls_network *net,
                                   const pls_transient_options *options,
                                   pls_transient_options *defaults, int cycle,
                                   const pls_transient_options **o, pls_error *err);
/* Builds the model for the options and brings it to the idle state (air
 * on, every applicator shut): seeded by the steady solve where it has a
 * result, then settled on the lumped model itself. */
pls_status pls__transient_start (const pls_network *net, const pls_transient_options *o,
                                 pls__model **out, pls_error *err);
/* Total volume stored in the free model nodes (m^3). */
double pls__stored_volume (const pls__model *m);
/* Copies the model's work counters into a stats record (adds to it). */
void pls__stats_add (const pls__model *m, pls_transient_stats *s);
