/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pls-network-private.h: what the network, topology, steady and findings
 * files share, plus two test-only entry points (custom link law, nodal
 * demand) used to check the solver against closed-form networks.
 */
#pragma once

#include <stdarg.h>

#include "pls-laws.h"

/* ---- allocation (pls-alloc.c) ------------------------------------------ */

/* NULL a, or NULL members, fall back to libc.  Sizes of 0 allocate 1 byte so
 * a NULL return always means out of memory. */
void *pls__malloc (const pls_allocator *a, size_t size);
void *pls__calloc (const pls_allocator *a, size_t count, size_t size);
void *pls__realloc (const pls_allocator *a, void *ptr, size_t size);
void pls__free (const pls_allocator *a, void *ptr);

/* Bracket every CHOLMOD call: makes a the allocator the CHOLMOD trampolines
 * forward to on this thread (if pls_route_cholmod_allocations was called),
 * returning the previous one for pls__cholmod_leave. */
const pls_allocator *pls__cholmod_enter (const pls_allocator *a);
void pls__cholmod_leave (const pls_allocator *previous);

/* Fills err (may be NULL) and returns status. */
pls_status pls__error (pls_error *err, pls_status status, int element, int node,
                       const char *fmt, ...)
#if defined(__GNUC__)
  __attribute__ ((format (printf, 5, 6)))
#endif
  ;
void pls__error_clear (pls_error *err);

/* ---- network (pls-network.c) ------------------------------------------- */

typedef struct
{
  double s;   /* linear coefficient, Pa s/m^3                 */
  double r;   /* quadratic coefficient, Pa s^2/m^6            */
  double q0;  /* starting flow of Newton, m^3/s               */
} pls_custom_params;

typedef struct
{
  pls_element_kind kind;
  int a;           /* port 0 node                                        */
  int b;           /* port 1 node, -1 for one-port elements              */
  size_t name;     /* offset into the network's name pool                */
  union
  {
    pls_line_params line;
    pls_fitting_params fitting;
    pls_valve_params valve;
    pls_pump_params pump;
    pls_nozzle_params nozzle;
    pls_accumulator_params accumulator;
    pls_gauge_params gauge;
    pls_custom_params custom;
  } u;
} pls_element;

typedef struct
{
  double elevation;  /* m                                                 */
  double pressure;   /* fixed nodes: Pa gauge                             */
  double demand;     /* withdrawal, m^3/s (test-only, 0 otherwise)        */
  int fixed;
  size_t name;       /* offset into the name pool                         */
} pls_node;

struct pls_network
{
  pls_allocator alloc;
  pls_fluid_params fluid;     /* at its own temperature                   */
  pls_node *nodes;
  size_t n_nodes, cap_nodes;
  pls_element *elements;
  size_t n_elements, cap_elements;
  char *names;                /* pool of NUL-terminated names             */
  size_t names_len, names_cap;
  size_t n_pumps;
};

/* "hose H3", "applicator 7", "node N2": the part as the user calls it. */
void pls__element_label (const pls_network *net, int element, char *buf, size_t len);
void pls__node_label (const pls_network *net, int node, char *buf, size_t len);

/* Law of a two-port element at flow q (pumps at air_pressure, running). */
void pls__element_drop (const pls_network *net, const pls_element *e, double air_pressure,
                        double q, pls_drop *out);

/* Test-only: a link with h = s q + r q |q| from a to b (s, r >= 0, not both
 * 0), starting Newton at flow q0.  Returns the element index or -1. */
int pls_network_add_custom_link (pls_network *net, int from, int to, double s, double r,
                                 double q0, const char *name, pls_error *err);
/* Test-only: a fixed withdrawal (m^3/s) at a free node. */
pls_status pls_network_set_demand (pls_network *net, int node, double demand,
                                   pls_error *err);

/* ---- findings list (pls-findings.c) ------------------------------------ */

typedef struct
{
  pls_finding *items;
  size_t count, cap;
} pls_finding_list;

pls_status pls__finding_add (pls_finding_list *list, const pls_allocator *a,
                             pls_severity severity, const char *code, int element,
                             int node, double value, double limit, const char *fmt, ...)
#if defined(__GNUC__)
  __attribute__ ((format (printf, 9, 10)))
#endif
  ;

/* A liquid cannot be pulled below its vapour pressure: there the column
 * separates (cavitation; the time-domain model follows it, pls-pocket.c).
 * The vapour pressure is taken as absolute zero in gauge terms at one
 * standard atmosphere (ISO 2533: 101 325 Pa); that of adhesives and
 * coatings at room temperature is a few kPa at most (from memory). */
#define PLS_CAVITATION_PRESSURE (-101325.0)

/* ---- steady result (pls-steady.c) -------------------------------------- */

typedef union
{
  pls_line_result line;
  pls_pump_result pump;
  pls_accumulator_result accumulator;
} pls_element_detail;

struct pls_steady_result
{
  pls_allocator alloc;
  size_t n_nodes, n_elements;
  double *pressure;            /* n_nodes, Pa gauge                        */
  unsigned char *node_solved;  /* n_nodes                                  */
  double *flow;                /* n_elements                               */
  unsigned char *elem_solved;  /* n_elements                               */
  unsigned char *elem_active;  /* n_elements                               */
  pls_element_detail *detail;  /* n_elements                               */
  unsigned char *kind;         /* n_elements: pls_element_kind of each     */
  int converged, iterations;
  double pressure_change, flow_residual;
  pls_finding_list findings;
  double t_analyse;            /* s: CHOLMOD set-up and symbolic analysis  */
  double t_total;              /* s: the whole pls_solve_steady call       */
};

/* ---- topology (pls-topology.c) ----------------------------------------- */

/* Which elements carry flow in a solve: two-ports that are open/running and
 * open applicators.  active: n_elements, output.  Fails with PLS_ERR_INVALID
 * for a bad open_list entry. */
pls_status pls__active_elements (const pls_network *net, const pls_steady_options *o,
                                 unsigned char *active, pls_error *err);

/* Components of the free nodes joined by active two-ports.  Marks
 * node_solved (n_nodes, output: fixed nodes 1, free nodes 1 if their part
 * touches a pressure reference) and writes topology findings
 * (unreached, no-reference, open-port, nozzle-unfed).  comp (n_nodes,
 * output) is a component id per free node, -1 for fixed nodes; pumped
 * (n_nodes, output) is 1 for components holding a running pump. */
pls_status pls__topology (const pls_network *net, const pls_steady_options *o,
                          const unsigned char *active, unsigned char *node_solved,
                          int *comp, unsigned char *pumped, pls_finding_list *findings);

/* ---- design checks (pls-findings.c) ------------------------------------ */

/* Appends the design-check findings of a solved result. */
pls_status pls__design_checks (const pls_network *net, const pls_steady_options *o,
                               pls_steady_result *r, const int *comp);

/* ---- Newton core (pls-newton.c) ---------------------------------------- */

typedef struct
{
  int elem;
  int ca, cb;        /* matrix column of each end, -1 for a fixed end      */
  double fa, fb;     /* piezometric pressure of a fixed end, Pa            */
  long pa, pb, pab;  /* places in A->x: diagonal of ca, of cb, off-diagonal */
} pls_link;

typedef struct
{
  const pls_network *net;
  const pls_allocator *alloc;
  double air;
  size_t m, nf;
  pls_link *links;    /* m                                               */
  int *col_node;      /* nf: node of each matrix column                  */
  double *demand;     /* nf                                              */
  double *q, *qt;     /* m: flows, trial flows                           */
  double *h, *d;      /* m: drops and slopes at q                        */
  double *ht, *dt;    /* m: at qt                                        */
  double *dq;         /* m                                               */
  double *p, *pt;     /* nf: piezometric pressures, trial                */
  double *dp;         /* nf                                              */
  double *res;        /* nf: mass imbalance                              */
  int *ap, *ai;       /* pattern of the upper triangle, CSC              */
  size_t nnz;
} pls_work;

/* Seconds on a monotone-enough clock (C11 timespec_get). */
double pls__now (void);
void pls__work_free (pls_work *w);
/* Pattern of the upper triangle of the nodal matrix from w->links. */
pls_status pls__pattern (pls_work *w);
/* Newton iterations on the prepared work; fills r's summary fields and
 * *t_analyse (seconds spent in CHOLMOD set-up and analysis). */
pls_status pls__newton (pls_work *w, const pls_steady_options *o, double pscale,
                        double fscale, pls_steady_result *r, double *t_analyse,
                        pls_error *err);

/* ---- reusable steady workspace (pls-workspace.c, pls-newton.c) --------- */

/* CHOLMOD's structs by tag, so this header needs no <cholmod.h>. */
struct cholmod_common_struct;
struct cholmod_sparse_struct;
struct cholmod_factor_struct;
struct cholmod_dense_struct;

/* One link of the workspace's Newton core: 32 bytes, so a pass over 3e5
 * links streams less memory than pls_link does. */
typedef struct
{
  int elem;          /* element index                                       */
  int ca, cb;        /* matrix column of each end, -1 for a fixed end      */
  int pa, pb, pab;   /* places in A->x: diagonal of ca, of cb, off-diagonal */
  double fixed;      /* piezometric pressure of the fixed ends, as
                        (fixed a) - (fixed b), Pa; 0 if both ends are free */
} pls__wlink;

/* Everything a steady solve needs between calls.  The matrix columns are
 * the topology's columns renumbered by the fill-reducing (AMD, postordered)
 * permutation, so CHOLMOD's factor is in its natural order and
 * cholmod_factorize uses the stored upper triangle as it is (no transposed
 * copies per factorisation).  The analysis is kept while the key (column
 * count and both end columns of every link, in the topology's numbering)
 * is unchanged. */
struct pls_steady_workspace
{
  pls_allocator alloc;
  long analyses;               /* symbolic analyses done                  */
  int valid;                   /* the key, map, links and factor match    */
  size_t m, nf;                /* links and columns of the current solve  */
  size_t cap_m, cap_nf, cap_nodes, cap_elems;
  /* Key of the analysis (cap_m) and the renumbering (cap_nf): matrix
   * column of each topology column. */
  size_t key_m, key_nf;
  int *key_ca, *key_cb;
  int *colmap;
  /* Links and Newton state. */
  pls__wlink *links;           /* cap_m                                   */
  double *q, *qt, *d, *dq, *e;   /* cap_m                              */
  int *col_node;               /* cap_nf: node of each matrix column      */
  double *demand, *p, *pt, *dp, *res;              /* cap_nf              */
  /* Per-call scratch of the driver (cap_nodes, cap_elems). */
  unsigned char *active, *pumped;
  int *comp, *col;
  /* CHOLMOD, started on first use. */
  struct cholmod_common_struct *c;
  struct cholmod_sparse_struct *A;
  struct cholmod_factor_struct *L;
  struct cholmod_dense_struct *B, *X, *Y, *E;
};

/* Makes room for m links, nf columns, n nodes, ne elements (contents of
 * grown arrays are lost; a grown key invalidates the analysis).  m = 0:
 * only the nodes' and elements' scratch. */
pls_status pls__ws_reserve (pls_steady_workspace *ws, size_t m, size_t nf, size_t n,
                            size_t ne);
/* Called after ws->links[0..m) hold elem, fixed and the topology's columns
 * in ca, cb (ws->m, ws->nf set): compares with the key, redoes the
 * analysis if it differs, and leaves ca, cb, pa, pb, pab in matrix terms.
 * *t_analyse: seconds spent (0 when reused). */
pls_status pls__ws_prepare (pls_steady_workspace *ws, double *t_analyse, pls_error *err);
/* Newton iterations on a prepared workspace (q, p hold the start). */
pls_status pls__newton_ws (pls_steady_workspace *ws, const pls_network *net, double air,
                           const pls_steady_options *o, double pscale, double fscale,
                           pls_steady_result *r, pls_error *err);
