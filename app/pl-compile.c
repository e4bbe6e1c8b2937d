/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-compile.c: document -> pls_network, and the map back.
 */

#include "config.h"

#include "pl-compile.h"

#include <glib/gi18n.h>
#include <math.h>
#include <string.h>

#include "pl-document.h"
#include "pl-part-type.h"

/* Ports joined to one node whose elevations differ by more than this get a
 * finding: a wire is an ideal junction, so a height step along it is a
 * drawing mistake, not physics (1 cm: below what a layout is drawn to). */
#define PL_COMPILE_ELEVATION_SLACK 0.01

struct _PlCompiled
{
  gint ref_count;                /* atomic */
  guint64 revision;
  pls_network *net;              /* NULL if the fluid was refused */
  pls_fluid_params fluid;
  pls_steady_options steady;
  pls_transient_options transient;
  double *delays;                /* one per element; transient.delays */
  GArray *parts;                 /* of PlCompiledPart */
  GHashTable *by_id;             /* id -> index + 1 into parts */
  GArray *element_part;          /* int per solver element: index into parts */
  GArray *node_part;             /* int per solver node: index into parts, or -1 */
  GArray *node_port;             /* int per solver node: port index, or -1 */
  GArray *findings;              /* of PlFinding */
};

/* Work state of one compile: the union-find over every port of every part. */
typedef struct
{
  PlDocument *doc;
  PlCompiled *out;
  const PlPart **doc_parts;      /* placeable parts, same order as out->parts */
  guint n_parts;
  guint *port_base;              /* first global port index of each part */
  guint n_ports;
  guint *parent;                 /* union-find over global ports */
  guint *port_part;              /* global port -> part index */
  guint *port_index;             /* global port -> port index in its type */
  int *set_node;                 /* root port -> solver node, or -1 */
  guint *set_size;               /* root port -> members */
  /* Filled once the wires are in, indexed by root port: */
  int *set_first;                /* first member in document order */
  int *set_drain;                /* first drain port among the members, or -1 */
  double *set_low, *set_high;    /* lowest and highest member elevation, m */
} PlCompileWork;

const char *
pl_severity_get_key (pls_severity severity)
{
  switch (severity)
    {
    case PLS_SEVERITY_INFO:
      return "info";
    case PLS_SEVERITY_WARNING:
      return "warning";
    case PLS_SEVERITY_ERROR:
      return "error";
    default:
      return "error";
    }
}

void
pl_finding_copy (const PlFinding *src, PlFinding *dest)
{
  *dest = *src;
  dest->code = g_strdup (src->code);
  dest->part_id = g_strdup (src->part_id);
  dest->port_key = g_strdup (src->port_key);
  dest->message = g_strdup (src->message);
}

void
pl_finding_clear (PlFinding *finding)
{
  g_clear_pointer (&finding->code, g_free);
  g_clear_pointer (&finding->part_id, g_free);
  g_clear_pointer (&finding->port_key, g_free);
  g_clear_pointer (&finding->message, g_free);
}

static void
pl_compiled_add_finding (PlCompiled *c, pls_severity severity, const char *code,
                         const char *part_id, const char *message)
{
  PlFinding f = { severity, g_strdup (code), g_strdup (part_id), NULL, g_strdup (message),
                  0.0, 0.0 };

  g_array_append_val (c->findings, f);
}

/* --- union-find (path halving, union by size) --- */

static guint
pl_compile_find (PlCompileWork *w, guint port)
{
  while (w->parent[port] != port)
    {
      w->parent[port] = w->parent[w->parent[port]];
      port = w->parent[port];
    }
  return port;
}

static void
pl_compile_union (PlCompileWork *w, guint a, guint b)
{
  guint ra = pl_compile_find (w, a), rb = pl_compile_find (w, b);

  if (ra == rb)
    return;
  if (w->set_size[ra] < w->set_size[rb])
    {
      guint t = ra;
      ra = rb;
      rb = t;
    }
  w->parent[rb] = ra;
  w->set_size[ra] += w->set_size[rb];
}

static int
pl_compile_part_index (PlCompileWork *w, const char *id)
{
  gpointer v = g_hash_table_lookup (w->out->by_id, id);

  return v == NULL ? -1 : GPOINTER_TO_INT (v) - 1;
}

/* Global port index of (part, port key), or -1. */
static int
pl_compile_global_port (PlCompileWork *w, const char *part_id, const char *port_key)
{
  int pi = pl_compile_part_index (w, part_id);
  guint index;

  if (pi < 0)
    return -1;
  if (pl_part_type_find_port (pl_part_get_part_type (w->doc_parts[pi]), port_key, &index)
      == NULL || index >= PL_COMPILE_MAX_PORTS)
    return -1;
  return (int) (w->port_base[pi] + index);
}

/* Records who a new solver node belongs to. */
static void
pl_compile_note_node (PlCompiled *c, int node, int part_index, int port_index)
{
  if (node < 0)
    return;
  if ((guint) node >= c->node_part->len)
    {
      int none = -1;
      while (c->node_part->len <= (guint) node)
        {
          g_array_append_val (c->node_part, none);
          g_array_append_val (c->node_port, none);
        }
    }
  g_array_index (c->node_part, int, node) = part_index;
  g_array_index (c->node_port, int, node) = port_index;
}

static void
pl_compile_note_element (PlCompiled *c, int element, int part_index)
{
  if (element < 0)
    return;
  while (c->element_part->len <= (guint) element)
    {
      int none = -1;
      g_array_append_val (c->element_part, none);
    }
  g_array_index (c->element_part, int, element) = part_index;
}

/* The solver node of the set that global port g belongs to, made on first
 * use.  -1 with a finding when the solver refuses it. */
static int
pl_compile_port_node (PlCompileWork *w, guint g)
{
  PlCompiled *c = w->out;
  guint root = pl_compile_find (w, g), named;
  const PlPart *part;
  const char *key;
  g_autofree char *name = NULL;
  double elevation;
  pls_error err;
  int node;

  if (w->set_node[root] >= 0 || c->net == NULL)
    return w->set_node[root];

  /* A drain's free surface sets a fixed node's height and name; a free
   * node takes the first port's. */
  named = (guint) (w->set_drain[root] >= 0 ? w->set_drain[root] : w->set_first[root]);
  part = w->doc_parts[w->port_part[named]];
  key = pl_part_get_part_type (part)->ports[w->port_index[named]].key;
  /* Names are made for every node on every compile: no printf. */
  name = g_strconcat (pl_part_get_tag (part), ".", key, NULL);
  elevation = pl_part_get_port_elevation (part, key);

  /* A drain's surface may well lie below the pipe end that pours into it;
   * elsewhere a height step along a wire is a drawing mistake. */
  if (w->set_drain[root] < 0
      && w->set_high[root] - w->set_low[root] > PL_COMPILE_ELEVATION_SLACK)
    {
      /* Translators: %s is a junction such as "H1.b" (part tag and port). */
      g_autofree char *msg = g_strdup_printf (_("The ports joined at %s sit at different "
                                                "elevations; the junction is taken at "
                                                "the height of that port."),
                                              name);
      pl_compiled_add_finding (c, PLS_SEVERITY_WARNING, "elevation-mismatch",
                               pl_part_get_id (part), msg);
    }

  if (w->set_drain[root] >= 0)
    node = pls_network_add_fixed_node (c->net, elevation, 0.0, name, &err);
  else
    node = pls_network_add_node (c->net, elevation, name, &err);
  if (node < 0)
    {
      pl_compiled_add_finding (c, PLS_SEVERITY_ERROR, "part-invalid", pl_part_get_id (part),
                               err.message);
      return -1;
    }
  w->set_node[root] = node;
  pl_compile_note_node (c, node, (int) w->port_part[named], (int) w->port_index[named]);
  return node;
}

/* An internal fixed node (pump or dump drum) at a port's elevation. */
static int
pl_compile_drum_node (PlCompileWork *w, guint part_index, const char *port_key,
                      const char *what, pls_error *err)
{
  const PlPart *part = w->doc_parts[part_index];
  g_autofree char *name = g_strconcat (pl_part_get_tag (part), " ", what, NULL);
  int node = pls_network_add_fixed_node (w->out->net,
                                         pl_part_get_port_elevation (part, port_key), 0.0,
                                         name, err);

  pl_compile_note_node (w->out, node, (int) part_index, -1);
  return node;
}

static int
pl_compile_node_of (PlCompileWork *w, guint part_index, const char *port_key)
{
  guint index = 0;

  pl_part_type_find_port (pl_part_get_part_type (w->doc_parts[part_index]), port_key,
                          &index);
  return pl_compile_port_node (w, w->port_base[part_index] + index);
}

/* Adds the elements of one part.  FALSE with *error (a document refusal) or
 * err (a solver refusal) filled when the part cannot be compiled. */
static gboolean
pl_compile_part (PlCompileWork *w, guint pi, PlCompiledPart *cp, GError **error,
                 pls_error *err)
{
  const PlPart *part = w->doc_parts[pi];
  pls_network *net = w->out->net;
  const char *tag = pl_part_get_tag (part);
  int e = -1, n0, n1;

  err->message[0] = '\0';
  switch (cp->type->kind)
    {
    case PL_PART_HOSE:
    case PL_PART_PIPE:
      {
        pls_line_params p;
        if (!pl_part_get_line_params (part, &p, error))
          return FALSE;
        if ((n0 = pl_compile_node_of (w, pi, "a")) < 0
            || (n1 = pl_compile_node_of (w, pi, "b")) < 0)
          return FALSE;
        e = pls_network_add_line (net, n0, n1, &p, tag, err);
        break;
      }
    case PL_PART_TEE:
      {
        static const char *const legs[3] = { "a", "b", "branch" };
        pls_fitting_params p[3];
        g_autofree char *centre_name = g_strconcat (tag, " centre", NULL);
        if (!pl_part_get_tee_legs (part, p, error))
          return FALSE;
        /* The centre sits at the tee's elevation (that of its ports). */
        cp->internal_node = pls_network_add_node (net,
                                                  pl_part_get_port_elevation (part, "a"),
                                                  centre_name, err);
        if (cp->internal_node < 0)
          return FALSE;
        pl_compile_note_node (w->out, cp->internal_node, (int) pi, -1);
        for (guint k = 0; k < 3; k++)
          {
            g_autofree char *leg_name = g_strconcat (tag, ".", legs[k], NULL);
            if ((n1 = pl_compile_node_of (w, pi, legs[k])) < 0)
              return FALSE;
            e = pls_network_add_fitting (net, cp->internal_node, n1, &p[k], leg_name, err);
            if (e < 0)
              return FALSE;
            pl_compile_note_element (w->out, e, (int) pi);
            cp->elements[cp->n_elements++] = e;
          }
        return TRUE;
      }
    case PL_PART_BALL_VALVE:
    case PL_PART_DUMP_VALVE:
      {
        gboolean dump = cp->type->kind == PL_PART_DUMP_VALVE;
        const char *in = dump ? "in" : "a", *out = dump ? "out" : "b";
        guint out_index = 0;
        pls_valve_params p;
        if (!pl_part_get_valve_params (part, &p, error))
          return FALSE;
        if ((n0 = pl_compile_node_of (w, pi, in)) < 0)
          return FALSE;
        pl_part_type_find_port (cp->type, out, &out_index);
        if (dump && w->set_size[pl_compile_find (w, w->port_base[pi] + out_index)] == 1)
          {
            /* No wire on the return: it goes back to the supply drum. */
            cp->internal_node = pl_compile_drum_node (w, pi, out, "drum", err);
            n1 = cp->internal_node;
          }
        else
          n1 = pl_compile_node_of (w, pi, out);
        if (n1 < 0)
          return FALSE;
        e = pls_network_add_valve (net, n0, n1, &p, tag, err);
        break;
      }
    case PL_PART_PUMP:
      {
        pls_pump_params p;
        if (!pl_part_get_pump_params (part, &p, error))
          return FALSE;
        cp->internal_node = pl_compile_drum_node (w, pi, "out", "supply", err);
        if (cp->internal_node < 0 || (n1 = pl_compile_node_of (w, pi, "out")) < 0)
          return FALSE;
        e = pls_network_add_pump (net, cp->internal_node, n1, &p, tag, err);
        break;
      }
    case PL_PART_APPLICATOR:
      {
        pls_nozzle_params p;
        if (!pl_part_get_nozzle_params (part, &p, error))
          return FALSE;
        if ((n0 = pl_compile_node_of (w, pi, "in")) < 0)
          return FALSE;
        e = pls_network_add_nozzle (net, n0, &p, tag, err);
        break;
      }
    case PL_PART_ACCUMULATOR:
      {
        pls_accumulator_params p;
        if (!pl_part_get_accumulator_params (part, &p, error))
          return FALSE;
        if ((n0 = pl_compile_node_of (w, pi, "p")) < 0)
          return FALSE;
        e = pls_network_add_accumulator (net, n0, &p, tag, err);
        break;
      }
    case PL_PART_GAUGE:
      {
        pls_gauge_params p;
        if (!pl_part_get_gauge_params (part, &p, error))
          return FALSE;
        if ((n0 = pl_compile_node_of (w, pi, "p")) < 0)
          return FALSE;
        e = pls_network_add_gauge (net, n0, &p, tag, err);
        break;
      }
    case PL_PART_DRAIN:
      /* A fixed node and nothing else; made here so a lone drain still
       * appears (its port reads 0 Pa). */
      return pl_compile_node_of (w, pi, "p") >= 0;
    case PL_PART_SCENARIO:
    case PL_PART_TITLE:
    case PL_N_PART_KINDS:
    default:
      return TRUE;
    }
  if (e < 0)
    return FALSE;
  pl_compile_note_element (w->out, e, (int) pi);
  cp->elements[cp->n_elements++] = e;
  return TRUE;
}

/* The scenario: fluid, steady and transient options.  A refusal keeps the
 * solver's defaults for that group and becomes a finding; only a refused
 * fluid leaves no network. */
static void
pl_compile_scenario (PlCompileWork *w)
{
  PlCompiled *c = w->out;
  const PlPart *scenario = pl_document_get_scenario (w->doc);
  g_autoptr (GError) error = NULL;
  pls_error err;

  pls_fluid_params_init (&c->fluid);
  pls_steady_options_init (&c->steady);
  pls_transient_options_init (&c->transient);
  if (scenario == NULL)
    return;

  if (!pl_scenario_get_fluid_params (scenario, &c->fluid, &error))
    {
      pl_compiled_add_finding (c, PLS_SEVERITY_ERROR, "scenario-invalid", "scenario",
                               error->message);
      g_clear_error (&error);
      return;
    }
  c->net = pls_network_new (&c->fluid, NULL, &err);
  if (c->net == NULL)
    pl_compiled_add_finding (c, PLS_SEVERITY_ERROR, "scenario-invalid", "scenario",
                             err.message);
  if (!pl_scenario_get_steady_options (scenario, &c->steady, &error))
    {
      pls_steady_options_init (&c->steady);
      pl_compiled_add_finding (c, PLS_SEVERITY_ERROR, "scenario-invalid", "scenario",
                               error->message);
      g_clear_error (&error);
    }
  if (!pl_scenario_get_transient_options (scenario, &c->transient, &error))
    {
      pls_transient_options_init (&c->transient);
      pl_compiled_add_finding (c, PLS_SEVERITY_ERROR, "scenario-invalid", "scenario",
                               error->message);
      g_clear_error (&error);
    }
}

static void
pl_compiled_part_clear (gpointer data)
{
  PlCompiledPart *p = data;

  g_free (p->id);
  g_free (p->tag);
}

static void
pl_compiled_finding_clear (gpointer data)
{
  pl_finding_clear (data);
}

PlCompiled *
pl_compile (PlDocument *doc)
{
  PlCompiled *c;
  PlCompileWork w = { 0 };
  guint n_all;

  g_return_val_if_fail (PL_IS_DOCUMENT (doc), NULL);

  c = g_new0 (PlCompiled, 1);
  c->ref_count = 1;
  c->revision = pl_document_get_revision (doc);
  c->parts = g_array_new (FALSE, TRUE, sizeof (PlCompiledPart));
  g_array_set_clear_func (c->parts, pl_compiled_part_clear);
  c->by_id = g_hash_table_new (g_str_hash, g_str_equal);
  c->element_part = g_array_new (FALSE, FALSE, sizeof (int));
  c->node_part = g_array_new (FALSE, FALSE, sizeof (int));
  c->node_port = g_array_new (FALSE, FALSE, sizeof (int));
  c->findings = g_array_new (FALSE, TRUE, sizeof (PlFinding));
  g_array_set_clear_func (c->findings, pl_compiled_finding_clear);

  w.doc = doc;
  w.out = c;
  pl_compile_scenario (&w);

  /* The placeable parts and their ports. */
  n_all = pl_document_get_n_parts (doc);
  w.doc_parts = g_new0 (const PlPart *, n_all + 1);
  w.port_base = g_new0 (guint, n_all + 1);
  for (guint i = 0; i < n_all; i++)
    {
      const PlPart *part = pl_document_get_part (doc, i);
      const PlPartType *type = pl_part_get_part_type (part);
      PlCompiledPart cp = { 0 };

      if (type == NULL || !type->placeable)
        continue;
      cp.id = g_strdup (pl_part_get_id (part));
      cp.tag = g_strdup (pl_part_get_tag (part));
      cp.type = type;
      cp.n_ports = MIN (type->n_ports, PL_COMPILE_MAX_PORTS);
      for (guint k = 0; k < PL_COMPILE_MAX_PORTS; k++)
        cp.nodes[k] = -1;
      for (guint k = 0; k < PL_COMPILE_MAX_ELEMENTS; k++)
        cp.elements[k] = -1;
      cp.internal_node = -1;
      g_array_append_val (c->parts, cp);
      g_hash_table_insert (c->by_id, cp.id, GINT_TO_POINTER (w.n_parts + 1));
      w.doc_parts[w.n_parts] = part;
      w.port_base[w.n_parts] = w.n_ports;
      w.n_ports += cp.n_ports;
      w.n_parts++;
    }

  w.parent = g_new (guint, w.n_ports + 1);
  w.set_size = g_new (guint, w.n_ports + 1);
  w.set_node = g_new (int, w.n_ports + 1);
  w.port_part = g_new (guint, w.n_ports + 1);
  w.port_index = g_new (guint, w.n_ports + 1);
  w.set_first = g_new (int, w.n_ports + 1);
  w.set_drain = g_new (int, w.n_ports + 1);
  w.set_low = g_new (double, w.n_ports + 1);
  w.set_high = g_new (double, w.n_ports + 1);
  for (guint pi = 0; pi < w.n_parts; pi++)
    for (guint k = 0; k < pl_part_get_part_type (w.doc_parts[pi])->n_ports
                      && k < PL_COMPILE_MAX_PORTS; k++)
      {
        w.port_part[w.port_base[pi] + k] = pi;
        w.port_index[w.port_base[pi] + k] = k;
      }
  for (guint g = 0; g < w.n_ports; g++)
    {
      w.parent[g] = g;
      w.set_size[g] = 1;
      w.set_node[g] = -1;
      w.set_first[g] = -1;
      w.set_drain[g] = -1;
    }

  /* Wires join ports into nodes. */
  for (guint i = 0; i < pl_document_get_n_wires (doc); i++)
    {
      const PlWire *wire = pl_document_get_wire (doc, i);
      int a = pl_compile_global_port (&w, pl_wire_get_part_id (wire, 0),
                                      pl_wire_get_port_key (wire, 0));
      int b = pl_compile_global_port (&w, pl_wire_get_part_id (wire, 1),
                                      pl_wire_get_port_key (wire, 1));
      if (a >= 0 && b >= 0)
        pl_compile_union (&w, (guint) a, (guint) b);
    }
  /* One pass in document order: each set's first member, first drain and
   * elevation span. */
  for (guint g = 0; g < w.n_ports; g++)
    {
      guint root = pl_compile_find (&w, g);
      const PlPart *part = w.doc_parts[w.port_part[g]];
      const PlPartType *type = pl_part_get_part_type (part);
      double e = pl_part_get_port_elevation (part, type->ports[w.port_index[g]].key);

      if (w.set_first[root] < 0)
        {
          w.set_first[root] = (int) g;
          w.set_low[root] = w.set_high[root] = e;
        }
      w.set_low[root] = MIN (w.set_low[root], e);
      w.set_high[root] = MAX (w.set_high[root], e);
      if (type->kind == PL_PART_DRAIN && w.set_drain[root] < 0)
        w.set_drain[root] = (int) g;
    }

  /* Elements, part by part; a refusal leaves that part out. */
  for (guint pi = 0; pi < w.n_parts && c->net != NULL; pi++)
    {
      PlCompiledPart *cp = &g_array_index (c->parts, PlCompiledPart, pi);
      g_autoptr (GError) error = NULL;
      pls_error err;

      cp->compiled = pl_compile_part (&w, pi, cp, &error, &err);
      if (!cp->compiled)
        {
          const char *msg = error != NULL ? error->message : err.message;
          g_autofree char *fallback = NULL;

          if (msg[0] == '\0')
            {
              /* Translators: %s is a part's tag such as "H3". */
              fallback = g_strdup_printf (_("%s could not be added to the network."),
                                          cp->tag);
              msg = fallback;
            }
          pl_compiled_add_finding (c, PLS_SEVERITY_ERROR, "part-invalid", cp->id, msg);
        }
    }

  /* Port -> node map, for every port whose set has a node. */
  for (guint pi = 0; pi < w.n_parts; pi++)
    {
      PlCompiledPart *cp = &g_array_index (c->parts, PlCompiledPart, pi);
      for (guint k = 0; k < cp->n_ports; k++)
        cp->nodes[k] = w.set_node[pl_compile_find (&w, w.port_base[pi] + k)];
      /* An unwired dump valve return is the drum it pours into. */
      if (cp->type->kind == PL_PART_DUMP_VALVE && cp->internal_node >= 0)
        {
          int k = pl_compiled_part_port_index (cp, "out");
          if (k >= 0)
            cp->nodes[k] = cp->internal_node;
        }
    }

  /* Firing delays, indexed by element as pls_transient_options asks. */
  if (c->net != NULL && pls_network_element_count (c->net) > 0)
    {
      size_t n = pls_network_element_count (c->net);

      c->delays = g_new0 (double, n);
      for (guint pi = 0; pi < w.n_parts; pi++)
        {
          PlCompiledPart *cp = &g_array_index (c->parts, PlCompiledPart, pi);
          if (cp->type->kind == PL_PART_APPLICATOR && cp->n_elements == 1)
            c->delays[cp->elements[0]] = pl_part_get_firing_delay (w.doc_parts[pi]);
        }
      c->transient.delays = c->delays;
      c->transient.delay_count = n;
    }
  else
    {
      c->transient.delays = NULL;
      c->transient.delay_count = 0;
    }

  g_free (w.doc_parts);
  g_free (w.port_base);
  g_free (w.parent);
  g_free (w.set_size);
  g_free (w.set_node);
  g_free (w.port_part);
  g_free (w.port_index);
  g_free (w.set_first);
  g_free (w.set_drain);
  g_free (w.set_low);
  g_free (w.set_high);
  return c;
}

PlCompiled *
pl_compiled_ref (PlCompiled *compiled)
{
  g_return_val_if_fail (compiled != NULL, NULL);
  g_atomic_int_inc (&compiled->ref_count);
  return compiled;
}

void
pl_compiled_unref (PlCompiled *compiled)
{
  if (compiled == NULL || !g_atomic_int_dec_and_test (&compiled->ref_count))
    return;
  pls_network_free (compiled->net);
  g_free (compiled->delays);
  g_hash_table_unref (compiled->by_id);
  g_array_unref (compiled->parts);
  g_array_unref (compiled->element_part);
  g_array_unref (compiled->node_part);
  g_array_unref (compiled->node_port);
  g_array_unref (compiled->findings);
  g_free (compiled);
}

guint64
pl_compiled_get_revision (const PlCompiled *compiled)
{
  g_return_val_if_fail (compiled != NULL, 0);
  return compiled->revision;
}

const pls_network *
pl_compiled_get_network (const PlCompiled *compiled)
{
  g_return_val_if_fail (compiled != NULL, NULL);
  return compiled->net;
}

const pls_fluid_params *
pl_compiled_get_fluid (const PlCompiled *compiled)
{
  g_return_val_if_fail (compiled != NULL, NULL);
  return &compiled->fluid;
}

const pls_steady_options *
pl_compiled_get_steady_options (const PlCompiled *compiled)
{
  g_return_val_if_fail (compiled != NULL, NULL);
  return &compiled->steady;
}

const pls_transient_options *
pl_compiled_get_transient_options (const PlCompiled *compiled)
{
  g_return_val_if_fail (compiled != NULL, NULL);
  return &compiled->transient;
}

guint
pl_compiled_get_n_parts (const PlCompiled *compiled)
{
  g_return_val_if_fail (compiled != NULL, 0);
  return compiled->parts->len;
}

const PlCompiledPart *
pl_compiled_get_part (const PlCompiled *compiled, guint index)
{
  g_return_val_if_fail (compiled != NULL, NULL);
  if (index >= compiled->parts->len)
    return NULL;
  return &g_array_index (compiled->parts, PlCompiledPart, index);
}

const PlCompiledPart *
pl_compiled_find_part (const PlCompiled *compiled, const char *id)
{
  gpointer v;

  g_return_val_if_fail (compiled != NULL, NULL);
  if (id == NULL)
    return NULL;
  v = g_hash_table_lookup (compiled->by_id, id);
  if (v == NULL)
    return NULL;
  return &g_array_index (compiled->parts, PlCompiledPart, GPOINTER_TO_INT (v) - 1);
}

int
pl_compiled_part_port_index (const PlCompiledPart *part, const char *port_key)
{
  guint index;

  if (part == NULL || port_key == NULL
      || pl_part_type_find_port (part->type, port_key, &index) == NULL
      || index >= part->n_ports)
    return -1;
  return (int) index;
}

int
pl_compiled_get_port_node (const PlCompiled *compiled, const char *part_id,
                           const char *port_key)
{
  const PlCompiledPart *part = pl_compiled_find_part (compiled, part_id);
  int k = pl_compiled_part_port_index (part, port_key);

  return k < 0 ? -1 : part->nodes[k];
}

const PlCompiledPart *
pl_compiled_get_element_part (const PlCompiled *compiled, int element)
{
  int pi;

  g_return_val_if_fail (compiled != NULL, NULL);
  if (element < 0 || (guint) element >= compiled->element_part->len)
    return NULL;
  pi = g_array_index (compiled->element_part, int, element);
  return pi < 0 ? NULL : pl_compiled_get_part (compiled, (guint) pi);
}

const PlCompiledPart *
pl_compiled_get_node_part (const PlCompiled *compiled, int node, const char **port_key)
{
  const PlCompiledPart *part;
  int pi, k;

  g_return_val_if_fail (compiled != NULL, NULL);
  if (port_key != NULL)
    *port_key = NULL;
  if (node < 0 || (guint) node >= compiled->node_part->len)
    return NULL;
  pi = g_array_index (compiled->node_part, int, node);
  k = g_array_index (compiled->node_port, int, node);
  part = pi < 0 ? NULL : pl_compiled_get_part (compiled, (guint) pi);
  if (part != NULL && k >= 0 && port_key != NULL)
    *port_key = part->type->ports[k].key;
  return part;
}

guint
pl_compiled_get_n_findings (const PlCompiled *compiled)
{
  g_return_val_if_fail (compiled != NULL, 0);
  return compiled->findings->len;
}

const PlFinding *
pl_compiled_get_finding (const PlCompiled *compiled, guint index)
{
  g_return_val_if_fail (compiled != NULL, NULL);
  if (index >= compiled->findings->len)
    return NULL;
  return &g_array_index (compiled->findings, PlFinding, index);
}

gboolean
pl_compiled_has_errors (const PlCompiled *compiled)
{
  g_return_val_if_fail (compiled != NULL, FALSE);
  for (guint i = 0; i < compiled->findings->len; i++)
    if (g_array_index (compiled->findings, PlFinding, i).severity == PLS_SEVERITY_ERROR)
      return TRUE;
  return FALSE;
}
