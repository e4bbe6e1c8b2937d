/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-accumulator-fit.c: the feed node of the applicators and an
 * accumulator sized for it.
 *
 * The feed node is found on a small graph: one vertex per node (ports
 * joined by wires) and one per part, a part joined to the nodes of its
 * ports.  A node dominates the applicators when the pump outlet reaches
 * none of them with that node taken out; of those, the one most hops from
 * the pump is the nearest to the applicators.
 */
#include "config.h"

#include "pl-accumulator-fit.h"
#include "pl-command.h"
#include "pl-document-private.h"
#include "pl-geometry.h"
#include "pl-part-type.h"

#include <glib/gi18n.h>
#include <math.h>
#include <string.h>

/* Gauge to absolute: the standard atmosphere, 101 325 Pa (ISO 2533). */
#define STANDARD_ATMOSPHERE 101325.0
/* The accumulator is drawn this far from the port it is wired to, on the
 * side away from the applicators (mm on the drawing; the project's
 * choice). */
#define FIT_OFFSET_MM 70.0

double
pl_accumulator_fit_gas_volume (double dv, double p0, double p1, double p2, double n)
{
  double a0, a1, a2, usable;

  if (!(dv > 0.0 && p0 > 0.0 && p1 > p0 && p2 > p1 && n >= 1.0))
    return NAN;
  a0 = p0 + STANDARD_ATMOSPHERE;
  a1 = p1 + STANDARD_ATMOSPHERE;
  a2 = p2 + STANDARD_ATMOSPHERE;
  /* dV = V0 [(p0/p1)^(1/n) - (p0/p2)^(1/n)] (PHYSICS.md, polytropic gas law). */
  usable = pow (a0 / a1, 1.0 / n) - pow (a0 / a2, 1.0 / n);
  return usable > 0.0 ? dv / usable : NAN;
}

/* --- the graph --- */

typedef struct
{
  PlDocument *doc;
  guint n_parts;
  guint *port_base;     /* per part: index of its first port */
  guint n_ports;
  guint *node_of_port;  /* port -> node (0 .. n_nodes - 1) */
  guint n_nodes;
  GPtrArray *adjacent;  /* per vertex (nodes, then parts): GArray of guint */
} Graph;

static guint
find_root (guint *parent, guint i)
{
  while (parent[i] != i)
    i = parent[i] = parent[parent[i]];
  return i;
}

static int
port_index (Graph *g, const char *part_id, const char *port_key)
{
  for (guint p = 0; p < g->n_parts; p++)
    {
      const PlPart *part = pl_document_get_part (g->doc, p);
      guint index;

      if (g_strcmp0 (pl_part_get_id (part), part_id) == 0)
        return pl_part_type_find_port (pl_part_get_part_type (part), port_key, &index) != NULL
               ? (int) (g->port_base[p] + index) : -1;
    }
  return -1;
}

static void
join (Graph *g, guint a, guint b)
{
  g_array_append_val (g_ptr_array_index (g->adjacent, a), b);
  g_array_append_val (g_ptr_array_index (g->adjacent, b), a);
}

static void
graph_init (Graph *g, PlDocument *doc)
{
  g_autofree guint *parent = NULL;
  g_autofree guint *root_node = NULL;

  g->doc = doc;
  g->n_parts = pl_document_get_n_parts (doc);
  g->port_base = g_new0 (guint, g->n_parts + 1);
  for (guint p = 0; p < g->n_parts; p++)
    g->port_base[p + 1] = g->port_base[p]
                          + pl_part_get_part_type (pl_document_get_part (doc, p))->n_ports;
  g->n_ports = g->port_base[g->n_parts];
  parent = g_new (guint, g->n_ports + 1);
  for (guint i = 0; i < g->n_ports; i++)
    parent[i] = i;
  for (guint w = 0; w < pl_document_get_n_wires (doc); w++)
    {
      const PlWire *wire = pl_document_get_wire (doc, w);
      int a = port_index (g, pl_wire_get_part_id (wire, 0), pl_wire_get_port_key (wire, 0));
      int b = port_index (g, pl_wire_get_part_id (wire, 1), pl_wire_get_port_key (wire, 1));

      if (a >= 0 && b >= 0)
        parent[find_root (parent, (guint) a)] = find_root (parent, (guint) b);
    }
  g->node_of_port = g_new (guint, g->n_ports + 1);
  root_node = g_new (guint, g->n_ports + 1);
  for (guint i = 0; i < g->n_ports; i++)
    root_node[i] = G_MAXUINT;
  g->n_nodes = 0;
  for (guint i = 0; i < g->n_ports; i++)
    {
      guint r = find_root (parent, i);

      if (root_node[r] == G_MAXUINT)
        root_node[r] = g->n_nodes++;
      g->node_of_port[i] = root_node[r];
    }
  g->adjacent = g_ptr_array_new_with_free_func ((GDestroyNotify) g_array_unref);
  for (guint v = 0; v < g->n_nodes + g->n_parts; v++)
    g_ptr_array_add (g->adjacent, g_array_new (FALSE, FALSE, sizeof (guint)));
  for (guint p = 0; p < g->n_parts; p++)
    for (guint i = g->port_base[p]; i < g->port_base[p + 1]; i++)
      join (g, g->n_nodes + p, g->node_of_port[i]);
}

static void
graph_clear (Graph *g)
{
  g_clear_pointer (&g->port_base, g_free);
  g_clear_pointer (&g->node_of_port, g_free);
  g_clear_pointer (&g->adjacent, g_ptr_array_unref);
}

/* Hops from source to every vertex without passing removed (G_MAXUINT:
 * none taken out); G_MAXUINT where not reached. */
static guint *
hops_from (Graph *g, guint source, guint removed)
{
  guint n = g->n_nodes + g->n_parts;
  guint *hops = g_new (guint, n);
  g_autofree guint *queue = g_new (guint, n);
  guint head = 0, tail = 0;

  for (guint v = 0; v < n; v++)
    hops[v] = G_MAXUINT;
  if (source == removed)
    return hops;
  hops[source] = 0;
  queue[tail++] = source;
  while (head < tail)
    {
      guint v = queue[head++];
      GArray *next = g_ptr_array_index (g->adjacent, v);

      for (guint k = 0; k < next->len; k++)
        {
          guint u = g_array_index (next, guint, k);

          if (u != removed && hops[u] == G_MAXUINT)
            {
              hops[u] = hops[v] + 1;
              queue[tail++] = u;
            }
        }
    }
  return hops;
}

gboolean
pl_accumulator_fit_find_feed (PlDocument *doc, const char **part_id, const char **port_key,
                              GError **error)
{
  Graph g = { 0 };
  g_autofree guint *hops = NULL;
  g_autoptr (GArray) targets = g_array_new (FALSE, FALSE, sizeof (guint));
  int source = -1;
  guint best = G_MAXUINT, best_hops = 0;

  g_return_val_if_fail (PL_IS_DOCUMENT (doc), FALSE);
  graph_init (&g, doc);
  for (guint p = 0; p < g.n_parts && source < 0; p++)
    {
      const PlPart *part = pl_document_get_part (doc, p);

      if (pl_part_get_part_type (part)->kind == PL_PART_PUMP)
        source = port_index (&g, pl_part_get_id (part), "out");
    }
  if (source < 0)
    {
      graph_clear (&g);
      g_set_error_literal (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INCONSISTENT,
                           _("There is no pump to feed an accumulator."));
      return FALSE;
    }
  source = (int) g.node_of_port[source];
  hops = hops_from (&g, (guint) source, G_MAXUINT);
  for (guint p = 0; p < g.n_parts; p++)
    if (pl_part_get_part_type (pl_document_get_part (doc, p))->kind == PL_PART_APPLICATOR
        && hops[g.n_nodes + p] != G_MAXUINT)
      for (guint i = g.port_base[p]; i < g.port_base[p + 1]; i++)
        g_array_append_val (targets, g.node_of_port[i]);
  if (targets->len == 0)
    {
      graph_clear (&g);
      g_set_error_literal (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INCONSISTENT,
                           _("No applicator is connected to the pump."));
      return FALSE;
    }
  for (guint v = 0; v < g.n_nodes; v++)
    {
      g_autofree guint *cut = NULL;
      gboolean dominates = TRUE;

      if (hops[v] == G_MAXUINT || (best != G_MAXUINT && hops[v] <= best_hops))
        continue;
      cut = hops_from (&g, (guint) source, v);
      for (guint k = 0; k < targets->len && dominates; k++)
        dominates = cut[g_array_index (targets, guint, k)] == G_MAXUINT;
      if (dominates)
        {
          best = v;
          best_hops = hops[v];
        }
    }
  /* The pump outlet always dominates, so best is set.  The first port of
   * the node names it. */
  for (guint p = 0; p < g.n_parts; p++)
    for (guint i = g.port_base[p]; i < g.port_base[p + 1]; i++)
      if (g.node_of_port[i] == best)
        {
          const PlPart *part = pl_document_get_part (doc, p);

          *part_id = pl_part_get_id (part);
          *port_key = pl_part_get_part_type (part)->ports[i - g.port_base[p]].key;
          graph_clear (&g);
          return TRUE;
        }
  graph_clear (&g);
  g_return_val_if_reached (FALSE);
}

/* --- sizing --- */

gboolean
pl_accumulator_fit_plan (PlDocument *doc, PlResults *fast, double precharge,
                         PlAccumulatorFit *out, GError **error)
{
  const PlPart *scenario = pl_document_get_scenario (doc);
  const PlPartType *acc_type = pl_part_type_lookup ("accumulator");
  const PlParamSpec *volume_spec = pl_part_type_find_param (acc_type, "gas-volume", NULL);
  const PlParamSpec *exponent_spec = pl_part_type_find_param (acc_type, "polytropic-exponent",
                                                              NULL);
  double open_flow = 0.0, p1;
  const PlPart *feed;
  PlPoint port;

  g_return_val_if_fail (PL_IS_DOCUMENT (doc), FALSE);
  g_return_val_if_fail (out != NULL, FALSE);
  memset (out, 0, sizeof *out);
  if (!pl_accumulator_fit_find_feed (doc, &out->part_id, &out->port_key, error))
    return FALSE;
  if (fast == NULL || pl_results_get_revision (fast) != pl_document_get_revision (doc)
      || !pl_results_get_port_pressure (fast, out->part_id, out->port_key, PL_PRESSURE_IDLE,
                                        &out->idle_pressure)
      || !(out->idle_pressure > 0.0))
    {
      g_set_error_literal (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INCONSISTENT,
                           _("The accumulator is sized from the idle pressure, which is not "
                             "solved yet."));
      return FALSE;
    }
  for (guint p = 0; p < pl_document_get_n_parts (doc); p++)
    {
      const PlPart *part = pl_document_get_part (doc, p);
      double q;

      if (pl_part_get_part_type (part)->kind == PL_PART_APPLICATOR
          && pl_results_get_flow (fast, pl_part_get_id (part), 0, PL_CASE_STEADY_OPEN, &q)
          && q > 0.0)
        open_flow += q;
    }
  open_flow = MAX (open_flow, pl_part_get_number (scenario, "demand-flow"));
  out->shot_volume = open_flow * pl_part_get_number (scenario, "on-time");
  out->precharge = isfinite (precharge) ? precharge : 0.5 * out->idle_pressure;
  p1 = PL_ACCUMULATOR_FIT_DROOP * out->idle_pressure;
  out->gas_volume = pl_accumulator_fit_gas_volume (out->shot_volume, out->precharge, p1,
                                                   out->idle_pressure,
                                                   exponent_spec->default_number);
  if (!isfinite (out->gas_volume)
      || !pl_param_spec_check_number (volume_spec, out->gas_volume, NULL, NULL))
    {
      g_autofree char *shown = pl_unit_format (out->precharge, PL_QUANTITY_PRESSURE, NULL, 3,
                                               PL_UNIT_DECIMAL_FROM_LOCALE);

      g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INCONSISTENT,
                   /* Translators: %s is a pressure, "30 bar". */
                   _("No accumulator with a precharge of %s can give a shot here: the "
                     "precharge must stay below 90 %% of the idle pressure."), shown);
      return FALSE;
    }
  feed = pl_document_find_part (doc, out->part_id);
  pl_part_get_port_position (feed, out->port_key, &port);
  /* Above the port (the accumulator's own port is at its bottom). */
  out->position.x = port.x;
  out->position.y = port.y - FIT_OFFSET_MM;
  return TRUE;
}

PlCommand *
pl_accumulator_fit_command (PlDocument *doc, const PlAccumulatorFit *fit)
{
  g_autofree char *id = NULL;
  PlCommand *cmds[4];
  PlCommand *seq;

  /* An id no item has, found without advancing the document's counter:
   * the command claims it when applied. */
  for (guint n = pl_document_get_n_parts (doc) + 1; id == NULL; n++)
    {
      g_autofree char *candidate = g_strdup_printf ("p%u", n);

      if (pl_document_check_id (doc, 'p', candidate, NULL))
        id = g_steal_pointer (&candidate);
    }

  cmds[0] = pl_command_new_add_part_full ("accumulator", id, NULL, fit->position.x,
                                          fit->position.y, 0, FALSE);
  cmds[1] = pl_command_new_set_number (id, "gas-volume", fit->gas_volume);
  cmds[2] = pl_command_new_set_number (id, "precharge", fit->precharge);
  cmds[3] = pl_command_new_add_wire (NULL, id, "p", fit->part_id, fit->port_key, NULL, 0);
  seq = pl_command_new_sequence (_("Fit Accumulator"), cmds, G_N_ELEMENTS (cmds));
  for (guint i = 0; i < G_N_ELEMENTS (cmds); i++)
    pl_command_unref (cmds[i]);
  return seq;
}
