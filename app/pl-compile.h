/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-compile.h: a document turned into a solver network, and the map that
 * leads from every part's ports and elements back to the solver's indices.
 *
 * The model of each part type is the one documented in pl-part-type.h:
 *  - ports joined by wires, directly or through other ports, are one solver
 *    node (union-find over the wires); a port with no wire is a capped node
 *    of its own; a set that holds a drain's port is a fixed node at 0 Pa
 *    gauge at the drain's elevation (its free surface);
 *  - a node is created only when an element or a drain needs it, so a part
 *    the solver refused leaves no orphan node behind;
 *  - hose, pipe: a line a -> b; ball valve a -> b; dump valve in -> out
 *    (out with no wire returns to the supply drum, a fixed 0 Pa node);
 *  - tee: an internal centre node and three Hooper 2-K fittings, centre ->
 *    a, centre -> b, centre -> branch (element slots 0, 1, 2);
 *  - pump: its own supply drum (a fixed 0 Pa node at the pump's elevation)
 *    and a pump element supply -> out;
 *  - applicator: a nozzle on "in"; accumulator and gauge on "p".
 * A part whose values the document or the solver refuses becomes a finding
 * of error severity ("part-invalid", naming the part's tag) and is left
 * out; the rest still compiles.  A refused scenario ("scenario-invalid")
 * leaves the solver's defaults in place, or no network at all if the fluid
 * itself is refused.
 *
 * A PlCompiled is immutable once made and reference counted atomically, so
 * a worker thread may hold one while the main loop reads it.
 */
#pragma once

#include <glib.h>

#include "pl-types.h"
#include "pressline-solver.h"

G_BEGIN_DECLS

/* Most ports and solver elements of one part (a tee: three of each). */
#define PL_COMPILE_MAX_PORTS 3
#define PL_COMPILE_MAX_ELEMENTS 3

/* A finding mapped to the document: from the compile step, the steady
 * solves, the cycle or the shutdown.  Strings are owned by whoever holds
 * the finding (a PlCompiled or a PlResults). */
typedef struct
{
  pls_severity severity;
  char *code;        /* stable ASCII: the solver's codes (pressline-solver.h) or
                      * "part-invalid", "scenario-invalid", "elevation-mismatch",
                      * "solve-failed" */
  char *part_id;     /* the part concerned ("p3", "scenario"), or NULL */
  char *port_key;    /* the port concerned for a node finding, or NULL */
  char *message;     /* one sentence naming the part by its tag */
  double value;      /* the figure checked (SI), or 0 */
  double limit;      /* its limit (SI), or 0 */
} PlFinding;

/* "info", "warning", "error" (stable ASCII). */
const char *pl_severity_get_key (pls_severity severity);

/* One part as compiled. */
typedef struct
{
  char *id;                      /* "p3" */
  char *tag;                     /* "H3" */
  const PlPartType *type;
  gboolean compiled;             /* every element of the part is in the network */
  guint n_ports;                 /* = type->n_ports */
  int nodes[PL_COMPILE_MAX_PORTS]; /* solver node of each port in the type's
                                  * port order, or -1 */
  guint n_elements;
  int elements[PL_COMPILE_MAX_ELEMENTS]; /* solver elements, or -1 */
  int internal_node;             /* tee centre, pump or dump drum, or -1 */
} PlCompiledPart;

typedef struct _PlCompiled PlCompiled;

/* Compiles doc (read only; from the thread that owns it).  Never NULL. */
PlCompiled *pl_compile (PlDocument *doc);
PlCompiled *pl_compiled_ref (PlCompiled *compiled);
void pl_compiled_unref (PlCompiled *compiled);
G_DEFINE_AUTOPTR_CLEANUP_FUNC (PlCompiled, pl_compiled_unref)

/* The document revision this was compiled from. */
guint64 pl_compiled_get_revision (const PlCompiled *compiled);

/* The network, or NULL when the scenario's fluid was refused. */
const pls_network *pl_compiled_get_network (const PlCompiled *compiled);
const pls_fluid_params *pl_compiled_get_fluid (const PlCompiled *compiled);
/* From the scenario; applicators left for the caller to choose. */
const pls_steady_options *pl_compiled_get_steady_options (const PlCompiled *compiled);
/* From the scenario, with the firing delays of the applicators filled in
 * (pointing into the PlCompiled). */
const pls_transient_options *pl_compiled_get_transient_options (const PlCompiled *compiled);

/* Placeable parts in document order. */
guint pl_compiled_get_n_parts (const PlCompiled *compiled);
const PlCompiledPart *pl_compiled_get_part (const PlCompiled *compiled, guint index);
const PlCompiledPart *pl_compiled_find_part (const PlCompiled *compiled, const char *id);

/* The solver node of a port, or -1 (unknown part or port, or no node). */
int pl_compiled_get_port_node (const PlCompiled *compiled, const char *part_id,
                               const char *port_key);
/* The port index of port_key in the part's type, or -1. */
int pl_compiled_part_port_index (const PlCompiledPart *part, const char *port_key);

/* Who a solver index belongs to: the part (NULL if none) and, for a node,
 * the first port in document order that sits on it (NULL for an internal
 * node). */
const PlCompiledPart *pl_compiled_get_element_part (const PlCompiled *compiled, int element);
const PlCompiledPart *pl_compiled_get_node_part (const PlCompiled *compiled, int node,
                                                 const char **port_key);

/* Findings of the compile step itself. */
guint pl_compiled_get_n_findings (const PlCompiled *compiled);
const PlFinding *pl_compiled_get_finding (const PlCompiled *compiled, guint index);

/* Whether any compile finding is of error severity. */
gboolean pl_compiled_has_errors (const PlCompiled *compiled);

/* For PlResults: copies a finding (strings too) / frees its strings. */
void pl_finding_copy (const PlFinding *src, PlFinding *dest);
void pl_finding_clear (PlFinding *finding);

G_END_DECLS
