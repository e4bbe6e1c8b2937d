/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pressline-solver.h: the one public header of Pressline's hydraulic solver.
 *
 * Pure C11 + libm + CHOLMOD.  SI units everywhere: Pa (gauge unless a name
 * says _abs), m, m^2, m^3, m^3/s, kg, s, K.  No global state: everything lives
 * in a network or result object that the caller frees.  Functions return a
 * pls_status and, where the caller passes one, fill a pls_error that names
 * the element or node that failed.  No result ever holds a NaN or an Inf.
 */
#pragma once

#include <stddef.h>

#ifdef __cplusplus
extern "C" {
#endif

/* ------------------------------------------------------------------------
 * Status, errors, allocation
 * ------------------------------------------------------------------------ */

typedef enum
{
  PLS_OK = 0,
  PLS_ERR_NOMEM,          /* an allocation failed; nothing was changed       */
  PLS_ERR_INVALID,        /* a parameter outside its domain (NaN, <= 0, ...) */
  PLS_ERR_TOPOLOGY,       /* nothing left to solve (empty, no source)        */
  PLS_ERR_NO_CONVERGENCE, /* Newton did not meet both tolerances             */
  PLS_ERR_LINALG,         /* the sparse factorisation failed                 */
} pls_status;

#define PLS_MESSAGE_MAX 256

typedef struct
{
  pls_status status;              /* same as the function's return value      */
  int element;                    /* index of the element at fault, or -1     */
  int node;                       /* index of the node at fault, or -1        */
  char message[PLS_MESSAGE_MAX];  /* one sentence naming the element by name  */
} pls_error;

/* Short English name of a status ("out of memory", ...). Never NULL. */
const char *pls_status_string (pls_status status);

/* Allocator hook: every allocation of the solver (its own and CHOLMOD's
 * workspace) goes through these.  Tests install a hook that fails the k-th
 * call to prove every failure path is clean.  The hooks are per network
 * (no global state); NULL members fall back to malloc/calloc/realloc/free. */
typedef struct
{
  void *(*malloc_fn)  (size_t size, void *user_data);
  void *(*calloc_fn)  (size_t count, size_t size, void *user_data);
  void *(*realloc_fn) (void *ptr, size_t size, void *user_data);
  void  (*free_fn)    (void *ptr, void *user_data);
  void *user_data;
} pls_allocator;

/* ------------------------------------------------------------------------
 * Fluids
 * ------------------------------------------------------------------------ */

typedef enum
{
  PLS_VISCOSITY_NEWTONIAN = 0, /* mu                                       */
  PLS_VISCOSITY_POWER_LAW,     /* Ostwald-de Waele: K, n                   */
  PLS_VISCOSITY_CARREAU,       /* mu0, mu_inf, lambda, n                   */
} pls_viscosity_law;

typedef struct
{
  double density;           /* kg/m^3, > 0                                      */
  double bulk_modulus;      /* Pa, > 0 (used by the time-domain side)           */
  pls_viscosity_law law;
  double mu;                /* Newtonian viscosity, Pa s, > 0                   */
  double consistency;       /* power law K, Pa s^n, > 0                         */
  double flow_index;        /* power law and Carreau n, > 0 (1 = Newtonian)     */
  double mu_zero;           /* Carreau zero-shear viscosity, Pa s, > 0          */
  double mu_infinity;       /* Carreau infinite-shear viscosity, Pa s, >= 0     */
  double lambda;            /* Carreau time constant, s, >= 0                   */
  /* Optional temperature shift of viscosity (Arrhenius form):
   * mu(T) = mu(Tref) exp[B (1/T - 1/Tref)], B = activation_temperature.
   * B = 0 switches the shift off. */
  double temperature;       /* fluid temperature, K, > 0                        */
  double reference_temperature; /* K at which the law's values hold, > 0        */
  double activation_temperature; /* B = E_a / R, K, >= 0                        */
} pls_fluid_params;

/* Fills sane defaults: a Newtonian 1 Pa s adhesive at 20 C, density 1100,
 * bulk modulus 1.5 GPa, no temperature shift. */
void pls_fluid_params_init (pls_fluid_params *params);

/* ------------------------------------------------------------------------
 * Part parameters (one struct per element law)
 * ------------------------------------------------------------------------ */

typedef enum
{
  PLS_LINE_HOSE = 0,   /* flexible hose: wall compliance from a datasheet   */
  PLS_LINE_PIPE,       /* rigid pipe: wall compliance from Korteweg         */
} pls_line_kind;

typedef struct
{
  pls_line_kind kind;
  double length;             /* m, > 0                                          */
  double bore;               /* inner diameter, m, > 0                          */
  double roughness;          /* absolute wall roughness, m, >= 0                */
  /* Time-domain side only (hose): volumetric expansion, m^3 per m per Pa. */
  double volumetric_expansion;
  /* Time-domain side only (pipe): wall thickness m, Young's modulus Pa. */
  double wall_thickness;
  double youngs_modulus;
  double rated_pressure;     /* maximum working pressure, Pa; 0 = not rated     */
} pls_line_params;

/* Junction or fitting loss by Hooper's 2-K method:
 * K = K1 / Re + Kinf (1 + 1 / D_inch), dp = K rho V^2 / 2. */
typedef struct
{
  double k1;                 /* Hooper K1, >= 0                                 */
  double k_infinity;         /* Hooper Kinf, >= 0                               */
  double bore;               /* m, > 0: the diameter the velocity refers to     */
  double rated_pressure;     /* Pa; 0 = not rated                               */
} pls_fitting_params;

typedef enum
{
  PLS_CD_FIXED = 0,          /* discharge coefficient as given                  */
  PLS_CD_LICHTAROWICZ,       /* Reynolds-dependent, Lichtarowicz et al. 1965     */
} pls_cd_model;

/* Applicator: valve + passage resistance + orifice to atmosphere,
 * dp = R_passage Q + rho Q |Q| / (2 Cd^2 A^2). */
typedef struct
{
  double orifice_diameter;   /* m, > 0                                          */
  double orifice_length;     /* m, >= 0 (l/d enters Lichtarowicz)               */
  pls_cd_model cd_model;
  double discharge_coefficient; /* fixed Cd, or the high-Re limit, (0, 1]       */
  double passage_resistance; /* R_passage, Pa s/m^3, >= 0 (valve + internal)    */
  double rated_pressure;     /* Pa; 0 = not rated                               */
} pls_nozzle_params;

typedef enum
{
  PLS_VALVE_BALL = 0,        /* manual, open or closed                           */
  PLS_VALVE_DUMP,            /* normally open; closed while the air is on        */
} pls_valve_kind;

/* Valve, open or closed, with a flow coefficient.  Kv in (m^3/h)/sqrt(bar)
 * as in IEC 60534: Q = Kv sqrt(dp / dp0 * rho0 / rho) with dp0 = 1 bar and
 * rho0 = 1000 kg/m^3; a laminar floor keeps the derivative finite at Q = 0. */
typedef struct
{
  pls_valve_kind kind;
  double kv;                 /* flow coefficient, (m^3/h)/sqrt(bar), > 0        */
  double bore;               /* m, > 0: sets the laminar floor                  */
  int open;                  /* ball valve: 1 open, 0 closed (dump: ignored)    */
  double rated_pressure;     /* Pa; 0 = not rated                               */
} pls_valve_params;

/* Air-driven reciprocating ratio pump with an outlet check valve.
 * stall = ratio * air_pressure - friction_offset;
 * Q = Q_free (1 - p / p_stall)^m with Q_free = cycle_rate * displacement. */
typedef struct
{
  double ratio;              /* fluid pressure per air pressure, > 0            */
  double friction_offset;    /* Pa, >= 0                                        */
  double displacement;       /* fluid volume per double stroke, m^3, > 0        */
  double max_cycle_rate;     /* double strokes per second at free flow, > 0     */
  double curve_exponent;     /* m, > 0 (1 = straight line)                      */
  double changeover_time;    /* s, >= 0: flow gap at each stroke end (cycle)    */
  double rated_pressure;     /* Pa; 0 = not rated                               */
} pls_pump_params;

/* Gas-charged bladder accumulator.  Polytropic gas p V^n = const on
 * absolute pressures. */
typedef struct
{
  double gas_volume;         /* V0, total gas volume at precharge, m^3, > 0     */
  double precharge;          /* p0, gauge, at precharge_temperature, Pa, > 0    */
  double precharge_temperature; /* K, > 0                                        */
  double gas_temperature;    /* K, > 0: precharge scales with absolute T        */
  double polytropic_exponent; /* n in [1, 1.67]                                 */
  double neck_diameter;      /* m, > 0 (time-domain side)                       */
  double neck_length;        /* m, > 0 (time-domain side)                       */
  double rated_pressure;     /* Pa; 0 = not rated                               */
} pls_accumulator_params;

typedef struct
{
  double full_scale;         /* gauge's full-scale reading, Pa, > 0             */
} pls_gauge_params;

/* ------------------------------------------------------------------------
 * Network: nodes and elements
 *
 * A network owns copies of everything given to it (parameters and names).
 * Nodes carry an elevation (m, for rho g dz) and are either free (their
 * pressure is solved) or fixed (drain, tank, atmosphere: pressure given).
 * Two-port elements (line, fitting, valve, pump) join two distinct nodes;
 * flow is positive from the first port to the second.  One-port elements
 * (applicator, accumulator, gauge) sit on one node; an applicator
 * discharges to the atmosphere at its node's elevation.
 * Every add function validates its parameters once (with the element
 * law's validator) and returns the new index (0, 1, 2, ... in order of
 * addition; nodes and elements are counted separately), or -1 with err
 * filled in naming the part ("hose H3: bore must be a positive length").
 * Names are the tags the user sees; they are copied; NULL gives a
 * generated one ("node 4", "hose 7").
 * ------------------------------------------------------------------------ */

typedef struct pls_network pls_network;

typedef enum
{
  PLS_ELEMENT_LINE = 0,    /* hose or rigid pipe (pls_line_params)          */
  PLS_ELEMENT_FITTING,     /* tee, elbow, ... (pls_fitting_params)          */
  PLS_ELEMENT_VALVE,       /* ball or dump valve (pls_valve_params)         */
  PLS_ELEMENT_PUMP,        /* ratio pump, inlet -> outlet (pls_pump_params) */
  PLS_ELEMENT_NOZZLE,      /* applicator, one port (pls_nozzle_params)      */
  PLS_ELEMENT_ACCUMULATOR, /* one port (pls_accumulator_params)             */
  PLS_ELEMENT_GAUGE,       /* one port (pls_gauge_params)                   */
  PLS_ELEMENT_CUSTOM,      /* test-only law, see pls-network-private.h      */
} pls_element_kind;

/* A new, empty network for one fluid.  fluid is checked and copied;
 * alloc (copied; NULL = libc) serves every later allocation of the network
 * and of its solves and results.  Returns NULL with err filled on failure
 * (PLS_ERR_INVALID naming the fluid field, or PLS_ERR_NOMEM).
 * err may be NULL everywhere in this API. */
pls_network *pls_network_new (const pls_fluid_params *fluid,
                              const pls_allocator *alloc, pls_error *err);
/* Frees the network (NULL is fine).  Results made from it stay valid. */
void pls_network_free (pls_network *net);

/* Free node at elevation_m (m, finite).  Returns the node index or -1. */
int pls_network_add_node (pls_network *net, double elevation_m, const char *name,
                          pls_error *err);
/* Fixed-pressure node (drain, tank, atmosphere) at elevation_m (m) holding
 * pressure (Pa gauge, finite).  Returns the node index or -1. */
int pls_network_add_fixed_node (pls_network *net, double elevation_m, double pressure,
                                const char *name, pls_error *err);

/* Two-port elements between node indices from and to (distinct, existing).
 * Return the element index or -1. */
int pls_network_add_line (pls_network *net, int from, int to,
                          const pls_line_params *params, const char *name, pls_error *err);
int pls_network_add_fitting (pls_network *net, int from, int to,
                             const pls_fitting_params *params, const char *name,
                             pls_error *err);
/* A closed ball valve is not an active element of a solve; a dump valve is
 * active (open) only while the air is off. */
int pls_network_add_valve (pls_network *net, int from, int to,
                           const pls_valve_params *params, const char *name, pls_error *err);
/* Pump from inlet to outlet; running while the air is on. */
int pls_network_add_pump (pls_network *net, int inlet, int outlet,
                          const pls_pump_params *params, const char *name, pls_error *err);

/* One-port elements on an existing node.  Return the element index or -1. */
int pls_network_add_nozzle (pls_network *net, int node, const pls_nozzle_params *params,
                            const char *name, pls_error *err);
int pls_network_add_accumulator (pls_network *net, int node,
                                 const pls_accumulator_params *params, const char *name,
                                 pls_error *err);
int pls_network_add_gauge (pls_network *net, int node, const pls_gauge_params *params,
                           const char *name, pls_error *err);

/* Read back.  Out-of-range indices give 0, -1, PLS_ELEMENT_CUSTOM or "". */
size_t pls_network_node_count (const pls_network *net);
size_t pls_network_element_count (const pls_network *net);
/* Name as given, or "" if none was given; owned by the network. */
const char *pls_network_node_name (const pls_network *net, int node);
const char *pls_network_element_name (const pls_network *net, int element);
pls_element_kind pls_network_element_kind (const pls_network *net, int element);
/* Node at port 0 (from / inlet / the one port) or port 1 (to / outlet);
 * -1 for a port the element does not have. */
int pls_network_element_node (const pls_network *net, int element, int port);
/* 1 for a fixed-pressure node, 0 otherwise. */
int pls_network_node_is_fixed (const pls_network *net, int node);

/* Process-wide and optional: points SuiteSparse_config's malloc, calloc,
 * realloc and free (global function pointers in SuiteSparse 5.x) at
 * trampolines that forward to the allocator of the network whose solve is
 * running on the calling thread (kept in a thread-local pointer that is
 * set on entry to CHOLMOD and restored on exit), and to libc otherwise.
 * This is the one piece of process state the solver can touch, so it is
 * never done behind the caller's back: call it once at program start,
 * before any thread or other CHOLMOD user starts (the tests do).  Without
 * it, CHOLMOD's workspace comes from libc and only the solver's own
 * memory goes through the network's allocator. */
void pls_route_cholmod_allocations (void);

/* ------------------------------------------------------------------------
 * Steady solve
 * ------------------------------------------------------------------------ */

typedef enum
{
  PLS_APPLICATORS_NONE = 0,  /* idle: every applicator shut, pump running   */
  PLS_APPLICATORS_ALL,       /* steady-open: every applicator held open     */
  PLS_APPLICATORS_LIST,      /* the applicators named in open_list          */
} pls_applicator_set;

typedef struct
{
  int air_on;                /* 1: pumps run, dump valves shut; 0: pumps
                                stopped (no flow), dump valves open          */
  double air_pressure;       /* Pa gauge at the pumps' air inlets, >= 0      */
  pls_applicator_set applicators;
  const int *open_list;      /* input, open_count element indices of
                                applicators to hold open (LIST only)         */
  size_t open_count;
  /* Newton stops when both hold after a step: */
  double pressure_tolerance; /* largest nodal pressure change, Pa, > 0       */
  double flow_tolerance;     /* largest flow residual, m^3/s, > 0: the larger
                                of the nodal mass imbalance and the flow
                                change each element's own law still asks for
                                (|energy residual| / (dh/dq))                */
  int max_iterations;        /* Newton steps, >= 1                           */
  /* Design checks (findings).  0 switches a demand check off. */
  double demand_pressure;    /* pressure the applicators need, Pa gauge      */
  double demand_flow;        /* total flow the applicators need, m^3/s       */
  double manifold_spread_tolerance; /* (max - min) / max of the open
                                applicators' pressures on one pump's part    */
  double velocity_limit;     /* line mean velocity, m/s                      */
  double shear_rate_limit;   /* line wall shear rate, 1/s                    */
  double gauge_low_factor;   /* full scale >= factor x highest reading       */
  double gauge_high_factor;  /* reading >= full scale / factor               */
  double precharge_low_fraction; /* precharge >= fraction x max working
                                pressure at the accumulator                  */
} pls_steady_options;

/* Defaults: air on at 6 bar, idle, pressure_tolerance 1e-3 Pa,
 * flow_tolerance 1e-12 m^3/s, max_iterations 100, demands off, manifold
 * spread 0.05, velocity 3 m/s, shear rate 2e4 1/s, gauge factors 1.5 and 3,
 * precharge fraction 0.25.  The velocity, shear and spread limits are common
 * practice, no source: adjust them for the fluid in hand. */
void pls_steady_options_init (pls_steady_options *options);

typedef struct pls_steady_result pls_steady_result;

/* Solves the steady state for the options' air state and applicator set.
 * Topology first: parts that no pressure source reaches are left out
 * (reported as findings, solved = 0); the rest is solved by the global
 * gradient algorithm with a line search, its nodal system factored by
 * CHOLMOD.  Returns PLS_OK with *out set, PLS_ERR_NO_CONVERGENCE with *out
 * set to the last iterate (finite values, converged = 0), or another
 * status with *out = NULL.  The caller frees *out. */
pls_status pls_solve_steady (const pls_network *net, const pls_steady_options *options,
                             pls_steady_result **out, pls_error *err);
void pls_steady_result_free (pls_steady_result *result);

/* A steady workspace keeps what a solve builds besides its result between
 * calls: CHOLMOD's common block, the fill-reducing ordering and symbolic
 * factor of the nodal matrix, the matrix itself and every work array.  A
 * solve with a workspace redoes the symbolic analysis only when the
 * pattern of the nodal matrix differs from the last solve's (another set of
 * active elements or solved nodes: idle and steady-open differ), so
 * re-solving after a change of parameters, pressures or elevations costs
 * the numeric work alone.  It holds no pointer to a network: any network
 * may be solved with it, and a layout compiled anew after an edit still
 * reuses the analysis when its parts and wiring are unchanged.  Keep one
 * workspace per kind of solve that is repeated (say one for idle and one
 * for steady-open).  Results are bit-for-bit those of pls_solve_steady
 * (which makes a workspace for the one call).  Not thread-safe: one solve
 * at a time per workspace.
 * alloc (copied; NULL = libc) serves the workspace and, once
 * pls_route_cholmod_allocations was called, the CHOLMOD memory it holds;
 * results and the solve's scratch still come from the network's
 * allocator.  Returns NULL with err filled (PLS_ERR_NOMEM) on failure. */
typedef struct pls_steady_workspace pls_steady_workspace;

pls_steady_workspace *pls_steady_workspace_new (const pls_allocator *alloc, pls_error *err);
/* Frees everything the workspace holds (NULL is fine). */
void pls_steady_workspace_free (pls_steady_workspace *ws);
/* Symbolic analyses done with this workspace so far (for tests and
 * benchmarks: it stays put while the pattern is reused). */
long pls_steady_workspace_analyses (const pls_steady_workspace *ws);
/* pls_solve_steady with a workspace (not NULL).  On any failure the
 * workspace stays valid; the next solve redoes the analysis if needed. */
pls_status pls_solve_steady_with (pls_steady_workspace *ws, const pls_network *net,
                                  const pls_steady_options *options,
                                  pls_steady_result **out, pls_error *err);

/* Newton summary. */
int pls_steady_result_converged (const pls_steady_result *r);
int pls_steady_result_iterations (const pls_steady_result *r);
double pls_steady_result_pressure_change (const pls_steady_result *r);  /* Pa     */
double pls_steady_result_flow_residual (const pls_steady_result *r);    /* m^3/s  */

/* Per node and element.  A part left out of the solve has solved = 0 and
 * values 0 (never NaN); out-of-range indices also give 0. */
size_t pls_steady_result_node_count (const pls_steady_result *r);
size_t pls_steady_result_element_count (const pls_steady_result *r);
int pls_steady_node_solved (const pls_steady_result *r, int node);
double pls_steady_node_pressure (const pls_steady_result *r, int node); /* Pa gauge */
int pls_steady_element_solved (const pls_steady_result *r, int element);
/* 1 if the element carried flow in this solve (open, running). */
int pls_steady_element_active (const pls_steady_result *r, int element);
/* m^3/s, port 0 -> port 1 (an applicator: node -> atmosphere). */
double pls_steady_element_flow (const pls_steady_result *r, int element);

typedef enum
{
  PLS_FLOW_LAMINAR = 0,
  PLS_FLOW_TRANSITION,
  PLS_FLOW_TURBULENT,
} pls_flow_regime;

typedef struct
{
  double flow;               /* m^3/s, signed                                */
  double velocity;           /* mean velocity, m/s, signed                   */
  double reynolds;           /* generalised (Metzner-Reed) Reynolds number   */
  double wall_shear_rate;    /* 1/s, >= 0                                    */
  double wall_shear_stress;  /* Pa, >= 0                                     */
  double darcy_friction;     /* Darcy friction factor                        */
  pls_flow_regime regime;
} pls_line_result;

typedef struct
{
  int running;               /* 1 if the air was on                          */
  double flow;               /* delivered flow, m^3/s                        */
  double inlet_pressure;     /* Pa gauge                                     */
  double outlet_pressure;    /* Pa gauge                                     */
  double stall_pressure;     /* at this air pressure, Pa                     */
  double free_flow;          /* m^3/s                                        */
} pls_pump_result;

typedef struct
{
  double pressure;           /* node pressure, Pa gauge                      */
  double precharge;          /* at the gas temperature, Pa gauge             */
  double fluid_volume;       /* stored fluid, m^3 (0 at or below precharge)  */
  double gas_energy;         /* gas energy above the precharge state, J      */
} pls_accumulator_result;

/* Fill *out for an element of the matching kind and return PLS_OK; else
 * PLS_ERR_INVALID and *out zeroed.  Unsolved elements give zeros. */
pls_status pls_steady_line (const pls_steady_result *r, int element, pls_line_result *out);
pls_status pls_steady_pump (const pls_steady_result *r, int element, pls_pump_result *out);
pls_status pls_steady_accumulator (const pls_steady_result *r, int element,
                                   pls_accumulator_result *out);

/* ------------------------------------------------------------------------
 * Findings: what the topology pass and the design checks found
 * ------------------------------------------------------------------------ */

typedef enum
{
  PLS_SEVERITY_INFO = 0,
  PLS_SEVERITY_WARNING,
  PLS_SEVERITY_ERROR,
} pls_severity;

/* Stable codes (the strings never change; compare with strcmp):
 *  "unreached"          part with no pressure source, left out (warning)
 *  "no-reference"       part with a running pump but no tank, drain or open
 *                       applicator: pressure undetermined, left out (error)
 *  "open-port"          node with one line and nothing else: capped (warning)
 *  "nozzle-unfed"       applicator with no path from a running pump (warning)
 *  "pump-stall-short"   stall pressure or free flow below the demand (error)
 *  "manifold-spread"    open applicators' pressure spread too wide (warning)
 *  "rating-exceeded"    rated pressure below what the part can see (error)
 *  "gauge-range-low"    full scale below gauge_low_factor x reading (warning)
 *  "gauge-range-high"   reading below full scale / gauge_high_factor (info)
 *  "precharge-too-high" precharge at or above the idle pressure (warning)
 *  "precharge-too-low"  precharge below precharge_low_fraction x max
 *                       working pressure (warning)
 * "Can see", the reading of a gauge and the idle or max working pressure of
 * an accumulator all mean the highest pressure the node can reach: its
 * steady pressure or, while the air is on, the stall pressure of a running
 * pump whose outlet reaches the node through open parts (less rho g dz),
 * since with every applicator shut the line settles at stall. 
 *  "velocity-high"      line velocity above velocity_limit (warning)
 *  "shear-high"         line wall shear rate above shear_rate_limit (warning)
 */
typedef struct
{
  pls_severity severity;
  const char *code;          /* static string, see the list above            */
  int element;               /* element concerned, or -1                     */
  int node;                  /* node concerned, or -1                        */
  double value;              /* the figure checked (SI), or 0                */
  double limit;              /* the limit it was checked against (SI), or 0  */
  char message[PLS_MESSAGE_MAX]; /* one sentence naming the part             */
} pls_finding;

size_t pls_steady_finding_count (const pls_steady_result *r);
/* NULL if index >= count; owned by the result. */
const pls_finding *pls_steady_finding (const pls_steady_result *r, size_t index);

/* ------------------------------------------------------------------------
 * Time domain: firing cycle and shutdown
 *
 * The network becomes a lumped R-L-C model: lines cut into pi-segments
 * (inertance rho dx / A, the line's law per segment, half the segment's
 * compliance at each end; Korteweg's wall for a rigid pipe, the hose's
 * volumetric expansion figure for a hose), accumulators as polytropic gas
 * chambers behind a neck, applicators with ramped valves.  It is
 * integrated by TR-BDF2 with local error control, steps landing on every
 * valve event, Newton in each stage on the SPD nodal form factored by
 * CHOLMOD (one symbolic analysis for the whole run).
 * ------------------------------------------------------------------------ */

typedef struct
{
  double air_pressure;       /* Pa gauge at the pumps while the air is on, >= 0 */
  /* Firing schedule. */
  double cycle_rate;         /* shots per second, > 0                           */
  double on_time;            /* s from the start of opening to the start of
                                closing, > 0 and < 1 / cycle_rate             */
  double open_ramp;          /* s, > 0 and <= on_time                           */
  double close_ramp;         /* s, > 0                                          */
  const double *delays;      /* input, delay_count entries: the firing delay of
                                each element (s, >= 0; only the applicators'
                                entries are read), or NULL: all fire at once.
                                delay + on_time + close_ramp must fit in the
                                cycle                                          */
  size_t delay_count;        /* must equal the element count when delays set  */
  /* Model. */
  double segments_per_wavelength; /* pi-segments per shortest wavelength, > 0 */
  int min_segments;          /* per line, >= 1                                  */
  int max_segments;          /* per line, >= min_segments (the cap)             */
  /* Integrator (local error per step). */
  double rtol;               /* relative, > 0                                   */
  double atol_pressure;      /* Pa, > 0                                         */
  double atol_flow;          /* m^3/s, > 0                                      */
  /* Cycle. */
  double periodic_tolerance; /* stop when the largest cycle-to-cycle change of a
                                node pressure, over the largest idle pressure,
                                falls below this, > 0                          */
  int max_cycles;            /* >= 1                                            */
  int samples;               /* time-series points over the cycle, >= 2         */
  double uniformity_tolerance; /* allowed relative deviation of a shot, > 0     */
  double recovery_fraction;  /* "recovered": back within this fraction of the
                                idle pressure, > 0                             */
  /* Shutdown. */
  double safe_pressure;      /* Pa gauge, > 0                                   */
  double shutdown_time;      /* s, > 0: how long to follow the decay at most    */
} pls_transient_options;

/* Defaults: 6 bar air; 2 shots/s, 50 ms on, 2 ms ramps, no delays; 13
 * segments per wavelength, 1 to 32 segments a line; rtol 1e-3, atol 10 Pa
 * and 1e-9 m^3/s; periodic tolerance 1e-4, 200 cycles, 200 samples,
 * uniformity 0.02, recovery 0.01; safe pressure 1 bar (common practice, no
 * source), 600 s of shutdown. */
void pls_transient_options_init (pls_transient_options *options);

/* Work done by an integration (for benchmarks and tuning). */
typedef struct
{
  long steps;                /* accepted steps                                   */
  long rejected;             /* rejected steps                                   */
  long newton_iterations;
  long factorisations;       /* numeric Cholesky factorisations                  */
  double wall_seconds;
} pls_transient_stats;

typedef struct pls_cycle_result pls_cycle_result;

/* Runs the firing cycle from the idle state (air on, applicators shut)
 * until it is periodic, then reports the last cycle.  PLS_OK with *out
 * set (also when the cycle did not become periodic within max_cycles:
 * pls_cycle_result_periodic says so, and a finding too); another status
 * with *out = NULL and err naming the part or option at fault. */
pls_status pls_solve_cycle (const pls_network *net, const pls_transient_options *options,
                            pls_cycle_result **out, pls_error *err);
void pls_cycle_result_free (pls_cycle_result *r);

int pls_cycle_result_cycles (const pls_cycle_result *r);     /* cycles run       */
int pls_cycle_result_periodic (const pls_cycle_result *r);   /* 1 if converged   */
double pls_cycle_result_change (const pls_cycle_result *r);  /* last relative
                                                                change            */
void pls_cycle_result_stats (const pls_cycle_result *r, pls_transient_stats *out);
/* Pi-segments chosen for a line element (0 for other elements). */
int pls_cycle_result_segments (const pls_cycle_result *r, int element);

/* Per node over the last cycle, Pa gauge (0 for out-of-range indices). */
double pls_cycle_node_min (const pls_cycle_result *r, int node);
double pls_cycle_node_max (const pls_cycle_result *r, int node);
double pls_cycle_node_mean (const pls_cycle_result *r, int node);
double pls_cycle_node_idle (const pls_cycle_result *r, int node);
/* Time after the end of the last shot until the node stays within the
 * recovery fraction of its idle pressure (s); -1 if it does not recover
 * before the cycle ends. */
double pls_cycle_node_recovery (const pls_cycle_result *r, int node);

/* Downsampled time series of the last cycle: sample i at time
 * i * period / (samples - 1) from the cycle's start. */
size_t pls_cycle_sample_count (const pls_cycle_result *r);
double pls_cycle_sample_time (const pls_cycle_result *r, size_t i);         /* s  */
double pls_cycle_sample_pressure (const pls_cycle_result *r, int node, size_t i); /* Pa */
/* Flow of an element at sample i (m^3/s), in the sign of the steady
 * result's flow (from its port a to port b; an applicator: out of the
 * line); a line's at its port a end.  0 for elements without flow. */
double pls_cycle_sample_flow (const pls_cycle_result *r, int element, size_t i);

/* Applicators: mass per shot (kg) in the last cycle, its relative deviation
 * from the mean of all applicators, and the mass of the first shot from
 * idle (a fully recovered line). */
double pls_cycle_shot_mass (const pls_cycle_result *r, int element);
double pls_cycle_shot_deviation (const pls_cycle_result *r, int element);
double pls_cycle_first_shot_mass (const pls_cycle_result *r, int element);

typedef struct
{
  double min_pressure, max_pressure;          /* Pa gauge over the cycle      */
  double min_fluid_volume, max_fluid_volume;  /* m^3 over the cycle           */
} pls_cycle_accumulator;

typedef struct
{
  double volume;             /* delivered over the last cycle, m^3           */
  double mean_flow, min_flow, max_flow;       /* m^3/s                        */
} pls_cycle_pump;

pls_status pls_cycle_accumulator_swing (const pls_cycle_result *r, int element,
                                        pls_cycle_accumulator *out);
pls_status pls_cycle_pump_flow (const pls_cycle_result *r, int element, pls_cycle_pump *out);

/* Volume balance of the last cycle (m^3): delivered by all pumps, shot by
 * all applicators, and the change of the volume stored in the model. */
void pls_cycle_result_volumes (const pls_cycle_result *r, double *pumped, double *shot,
                               double *stored_change);

/* Findings: "no-recovery" (a node not back within the recovery fraction
 * before the next shot, warning), "shot-uniformity" (a shot outside the
 * uniformity tolerance of the mean, warning), "not-periodic" (max_cycles
 * reached, warning), "cycle-cavitation" (the liquid parted near vacuum
 * and a cavity opened: warning, or information when the cavity stayed
 * below 1 % of the liquid at its node; element (a line) or node where the
 * largest one opened, value its volume in m^3, limit the vapour pressure
 * taken, -101 325 Pa gauge). */
size_t pls_cycle_finding_count (const pls_cycle_result *r);
const pls_finding *pls_cycle_finding (const pls_cycle_result *r, size_t index);

/* Highest cycle rate (shots/s) in [rate_low, the highest the schedule
 * allows] at which every shot stays within the uniformity tolerance of the
 * mean and of the first shot from idle, by bisection to 1 %.  *rate = 0 if
 * even rate_low fails.  stats (may be NULL) sums the work. */
pls_status pls_cycle_max_rate (const pls_network *net, const pls_transient_options *options,
                               double rate_low, double *rate, pls_transient_stats *stats,
                               pls_error *err);

typedef struct pls_shutdown_result pls_shutdown_result;

/* Shutdown from idle: at t = 0 the air goes off (pumps stop, dump valves
 * open) with every applicator shut; follows the decay for at most
 * shutdown_time.  PLS_OK with *out set; else *out = NULL. */
pls_status pls_solve_shutdown (const pls_network *net, const pls_transient_options *options,
                               pls_shutdown_result **out, pls_error *err);
void pls_shutdown_result_free (pls_shutdown_result *r);

void pls_shutdown_result_stats (const pls_shutdown_result *r, pls_transient_stats *out);
/* Time until every node not trapped is below the safe pressure (s); -1 if
 * that did not happen within shutdown_time. */
double pls_shutdown_safe_time (const pls_shutdown_result *r);
/* Per node: the time its pressure fell below the safe pressure for good
 * (s; 0 if it never was above, -1 if not within the run) and whether it is
 * trapped (no path to a drain, tank or open valve once the air is off). */
double pls_shutdown_node_safe_time (const pls_shutdown_result *r, int node);
int pls_shutdown_node_trapped (const pls_shutdown_result *r, int node);
/* Energy stored at the start (J): gas in the accumulators (above the
 * precharge state) and the compressed fluid and walls (1/2 C p^2). */
double pls_shutdown_gas_energy (const pls_shutdown_result *r);
double pls_shutdown_fluid_energy (const pls_shutdown_result *r);
/* Decay series: sample i at pls_shutdown_sample_time. */
size_t pls_shutdown_sample_count (const pls_shutdown_result *r);
double pls_shutdown_sample_time (const pls_shutdown_result *r, size_t i);
double pls_shutdown_sample_pressure (const pls_shutdown_result *r, int node, size_t i);
/* Flow of an element at sample i (m^3/s), signed as pls_cycle_sample_flow. */
double pls_shutdown_sample_flow (const pls_shutdown_result *r, int element, size_t i);
/* Findings: "trapped-pressure" (error: a volume that stays above the safe
 * pressure behind a closed valve or check valve), "shutdown-slow"
 * (warning: not safe within shutdown_time), "shutdown-cavitation" (as
 * "cycle-cavitation", over the shutdown). */
size_t pls_shutdown_finding_count (const pls_shutdown_result *r);
const pls_finding *pls_shutdown_finding (const pls_shutdown_result *r, size_t index);

#ifdef __cplusplus
}
#endif
