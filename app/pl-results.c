/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-results.c: immutable result snapshots.
 *
 * A snapshot is a thin, reference-counted handle on two shared halves: the
 * steady half (compiled network, idle and steady-open solutions, their
 * findings) and the transient half (cycle, shutdown, their findings).  The
 * worker's full snapshot shares the steady half of the fast one instead of
 * solving it again, and a retagged snapshot shares both.
 */

#include "config.h"

#include "pl-results.h"

#include <glib/gi18n.h>
#include <math.h>
#include <string.h>

#include "pl-part-type.h"

typedef struct
{
  gint ref_count;                        /* atomic */
  PlCompiled *compiled;
  pls_steady_result *steady[PL_N_CASES]; /* NULL if not solved */
  pls_status status[PL_N_CASES];
  GArray *findings;                      /* of PlFinding: compile + steady */
} PlSteadyHalf;

typedef struct
{
  gint ref_count;                        /* atomic */
  pls_cycle_result *cycle;               /* NULL if it failed */
  pls_shutdown_result *shutdown;         /* NULL if it failed */
  GArray *findings;                      /* of PlFinding */
} PlTransientHalf;

struct _PlResults
{
  gint ref_count;                        /* atomic */
  guint64 revision;
  PlTransientState state;
  PlSteadyHalf *steady;                  /* never NULL */
  PlTransientHalf *transient;            /* NULL unless DONE */
};

G_DEFINE_BOXED_TYPE (PlResults, pl_results, pl_results_ref, pl_results_unref)

static void
pl_results_finding_clear (gpointer data)
{
  pl_finding_clear (data);
}

static GArray *
pl_results_new_findings (void)
{
  GArray *a = g_array_new (FALSE, TRUE, sizeof (PlFinding));

  g_array_set_clear_func (a, pl_results_finding_clear);
  return a;
}

static void
pl_steady_half_unref (PlSteadyHalf *h)
{
  if (h == NULL || !g_atomic_int_dec_and_test (&h->ref_count))
    return;
  for (guint c = 0; c < PL_N_CASES; c++)
    pls_steady_result_free (h->steady[c]);
  pl_compiled_unref (h->compiled);
  g_array_unref (h->findings);
  g_free (h);
}

static void
pl_transient_half_unref (PlTransientHalf *h)
{
  if (h == NULL || !g_atomic_int_dec_and_test (&h->ref_count))
    return;
  pls_cycle_result_free (h->cycle);
  pls_shutdown_result_free (h->shutdown);
  g_array_unref (h->findings);
  g_free (h);
}

/* A solver finding mapped to the part that owns its element or node; a
 * finding already present with the same code and indices is folded (the
 * idle and steady-open solves often report the same rating or range). */
static void
pl_results_map_finding (GArray *findings, GHashTable *seen, PlCompiled *compiled,
                        const pls_finding *f)
{
  const PlCompiledPart *part = NULL;
  const char *port_key = NULL;
  PlFinding out = { 0 };

  /* g_hash_table_add takes the key and says whether it was new. */
  if (!g_hash_table_add (seen, g_strdup_printf ("%s/%d/%d", f->code, f->element, f->node)))
    return;

  if (f->element >= 0)
    part = pl_compiled_get_element_part (compiled, f->element);
  if (part == NULL && f->node >= 0)
    part = pl_compiled_get_node_part (compiled, f->node, &port_key);
  out.severity = f->severity;
  out.code = g_strdup (f->code);
  out.part_id = part != NULL ? g_strdup (part->id) : NULL;
  out.port_key = g_strdup (port_key);
  out.message = g_strdup (f->message);
  out.value = isfinite (f->value) ? f->value : 0.0;
  out.limit = isfinite (f->limit) ? f->limit : 0.0;
  g_array_append_val (findings, out);
}

static void
pl_results_add_failure (GArray *findings, const char *what, const pls_error *err,
                        PlCompiled *compiled)
{
  const PlCompiledPart *part = NULL;
  PlFinding out = { 0 };

  if (err->element >= 0)
    part = pl_compiled_get_element_part (compiled, err->element);
  if (part == NULL && err->node >= 0)
    part = pl_compiled_get_node_part (compiled, err->node, NULL);
  out.severity = PLS_SEVERITY_ERROR;
  out.code = g_strdup ("solve-failed");
  out.part_id = part != NULL ? g_strdup (part->id) : NULL;
  /* what is a whole translated sentence; the solver's own sentence (in
   * English, naming the part) follows it. */
  out.message = g_strdup_printf ("%s %s", what,
                                 err->message[0] != '\0' ? err->message
                                 : pls_status_string (err->status));
  /* The solver's sentence may start in lower case ("the time-domain ..."):
   * after a full stop it starts a sentence of its own. */
  {
    char *second = out.message + strlen (what) + 1;
    *second = g_ascii_toupper (*second);
  }
  g_array_append_val (findings, out);
}

static PlResults *
pl_results_new (guint64 revision, PlTransientState state, PlSteadyHalf *steady,
                PlTransientHalf *transient)
{
  PlResults *r = g_new0 (PlResults, 1);

  r->ref_count = 1;
  r->revision = revision;
  r->state = state;
  r->steady = steady;
  r->transient = transient;
  return r;
}

PlResults *
pl_results_solve_fast (PlCompiled *compiled)
{
  pls_steady_workspace *const none[PL_N_CASES] = { NULL, NULL };

  return pl_results_solve_fast_with (compiled, none);
}

PlResults *
pl_results_solve_fast_with (PlCompiled *compiled,
                            pls_steady_workspace *const workspaces[PL_N_CASES])
{
  PlSteadyHalf *h;
  const pls_network *net;
  g_autoptr (GHashTable) seen = g_hash_table_new_full (g_str_hash, g_str_equal, g_free, NULL);
  gboolean any = FALSE;

  g_return_val_if_fail (compiled != NULL, NULL);

  h = g_new0 (PlSteadyHalf, 1);
  h->ref_count = 1;
  h->compiled = pl_compiled_ref (compiled);
  h->findings = pl_results_new_findings ();
  for (guint i = 0; i < pl_compiled_get_n_findings (compiled); i++)
    {
      PlFinding copy;
      pl_finding_copy (pl_compiled_get_finding (compiled, i), &copy);
      g_array_append_val (h->findings, copy);
    }

  net = pl_compiled_get_network (compiled);
  for (guint c = 0; c < PL_N_CASES && net != NULL; c++)
    {
      pls_steady_options options = *pl_compiled_get_steady_options (compiled);
      pls_error err = { 0 };

      options.applicators = c == PL_CASE_IDLE ? PLS_APPLICATORS_NONE : PLS_APPLICATORS_ALL;
      options.open_list = NULL;
      options.open_count = 0;
      if (pls_network_element_count (net) == 0)
        {
          h->status[c] = PLS_ERR_TOPOLOGY;
          if (c == PL_CASE_IDLE)
            {
              PlFinding f = { PLS_SEVERITY_INFO, g_strdup ("empty-layout"), NULL, NULL,
                              g_strdup (_("The layout has no parts to solve.")), 0.0, 0.0 };
              g_array_append_val (h->findings, f);
            }
          continue;
        }
      if (workspaces != NULL && workspaces[c] != NULL)
        h->status[c] = pls_solve_steady_with (workspaces[c], net, &options, &h->steady[c],
                                              &err);
      else
        h->status[c] = pls_solve_steady (net, &options, &h->steady[c], &err);
      if (h->steady[c] == NULL)
        {
          pl_results_add_failure (h->findings,
                                  c == PL_CASE_IDLE ? _("The idle solve failed.")
                                  : _("The steady-open solve failed."), &err, compiled);
          continue;
        }
      if (h->status[c] != PLS_OK)
        pl_results_add_failure (h->findings,
                                c == PL_CASE_IDLE ? _("The idle solve did not converge.")
                                : _("The steady-open solve did not converge."),
                                &err, compiled);
      any = TRUE;
      for (size_t i = 0; i < pls_steady_finding_count (h->steady[c]); i++)
        pl_results_map_finding (h->findings, seen, compiled,
                                pls_steady_finding (h->steady[c], i));
    }

  return pl_results_new (pl_compiled_get_revision (compiled),
                         any ? PL_TRANSIENT_PENDING : PL_TRANSIENT_SKIPPED, h, NULL);
}

PlResults *
pl_results_solve_full (PlResults *fast, GCancellable *cancellable, GError **error)
{
  PlCompiled *compiled;
  const pls_network *net;
  const pls_transient_options *options;
  PlTransientHalf *t;
  g_autoptr (GHashTable) seen = g_hash_table_new_full (g_str_hash, g_str_equal, g_free, NULL);
  pls_error err = { 0 };

  g_return_val_if_fail (fast != NULL, NULL);
  if (fast->state != PL_TRANSIENT_PENDING)
    return pl_results_ref (fast);
  if (g_cancellable_set_error_if_cancelled (cancellable, error))
    return NULL;

  compiled = fast->steady->compiled;
  net = pl_compiled_get_network (compiled);
  options = pl_compiled_get_transient_options (compiled);
  t = g_new0 (PlTransientHalf, 1);
  t->ref_count = 1;
  t->findings = pl_results_new_findings ();

  if (pls_solve_cycle (net, options, &t->cycle, &err) != PLS_OK || t->cycle == NULL)
    pl_results_add_failure (t->findings, _("The firing cycle failed."), &err,
                            compiled);
  else
    for (size_t i = 0; i < pls_cycle_finding_count (t->cycle); i++)
      pl_results_map_finding (t->findings, seen, compiled,
                              pls_cycle_finding (t->cycle, i));

  if (g_cancellable_set_error_if_cancelled (cancellable, error))
    {
      pl_transient_half_unref (t);
      return NULL;
    }

  memset (&err, 0, sizeof err);
  if (pls_solve_shutdown (net, options, &t->shutdown, &err) != PLS_OK || t->shutdown == NULL)
    pl_results_add_failure (t->findings, _("The shutdown failed."), &err,
                            compiled);
  else
    for (size_t i = 0; i < pls_shutdown_finding_count (t->shutdown); i++)
      pl_results_map_finding (t->findings, seen, compiled,
                              pls_shutdown_finding (t->shutdown, i));

  if (g_cancellable_set_error_if_cancelled (cancellable, error))
    {
      pl_transient_half_unref (t);
      return NULL;
    }

  g_atomic_int_inc (&fast->steady->ref_count);
  return pl_results_new (fast->revision, PL_TRANSIENT_DONE, fast->steady, t);
}

PlResults *
pl_results_retag (PlResults *results, guint64 revision)
{
  g_return_val_if_fail (results != NULL, NULL);
  g_atomic_int_inc (&results->steady->ref_count);
  if (results->transient != NULL)
    g_atomic_int_inc (&results->transient->ref_count);
  return pl_results_new (revision, results->state, results->steady, results->transient);
}

PlResults *
pl_results_ref (PlResults *results)
{
  g_return_val_if_fail (results != NULL, NULL);
  g_atomic_int_inc (&results->ref_count);
  return results;
}

void
pl_results_unref (PlResults *results)
{
  if (results == NULL || !g_atomic_int_dec_and_test (&results->ref_count))
    return;
  pl_steady_half_unref (results->steady);
  pl_transient_half_unref (results->transient);
  g_free (results);
}

/* --- keys --- */

const char *
pl_steady_case_get_key (PlSteadyCase c)
{
  static const char *const keys[PL_N_CASES] = { "idle", "steady_open" };

  return (guint) c < PL_N_CASES ? keys[c] : NULL;
}

const char *
pl_pressure_kind_get_key (PlPressureKind kind)
{
  static const char *const keys[PL_N_PRESSURES] = {
    "idle", "steady_open", "cycle_min", "cycle_max", "cycle_mean",
  };

  return (guint) kind < PL_N_PRESSURES ? keys[kind] : NULL;
}

const char *
pl_transient_state_get_key (PlTransientState state)
{
  switch (state)
    {
    case PL_TRANSIENT_PENDING:
      return "pending";
    case PL_TRANSIENT_DONE:
      return "done";
    case PL_TRANSIENT_SKIPPED:
      return "skipped";
    default:
      return NULL;
    }
}

/* --- what the snapshot is --- */

guint64
pl_results_get_revision (const PlResults *results)
{
  g_return_val_if_fail (results != NULL, 0);
  return results->revision;
}

PlCompiled *
pl_results_get_compiled (const PlResults *results)
{
  g_return_val_if_fail (results != NULL, NULL);
  return results->steady->compiled;
}

PlTransientState
pl_results_get_transient_state (const PlResults *results)
{
  g_return_val_if_fail (results != NULL, PL_TRANSIENT_SKIPPED);
  return results->state;
}

gboolean
pl_results_get_converged (const PlResults *results, PlSteadyCase c)
{
  g_return_val_if_fail (results != NULL, FALSE);
  if ((guint) c >= PL_N_CASES || results->steady->steady[c] == NULL)
    return FALSE;
  return results->steady->status[c] == PLS_OK
         && pls_steady_result_converged (results->steady->steady[c]);
}

const pls_steady_result *
pl_results_get_steady (const PlResults *results, PlSteadyCase c)
{
  g_return_val_if_fail (results != NULL, NULL);
  return (guint) c < PL_N_CASES ? results->steady->steady[c] : NULL;
}

const pls_cycle_result *
pl_results_get_cycle (const PlResults *results)
{
  g_return_val_if_fail (results != NULL, NULL);
  return results->transient != NULL ? results->transient->cycle : NULL;
}

const pls_shutdown_result *
pl_results_get_shutdown (const PlResults *results)
{
  g_return_val_if_fail (results != NULL, NULL);
  return results->transient != NULL ? results->transient->shutdown : NULL;
}

/* --- lookups --- */

static const PlCompiledPart *
pl_results_part (const PlResults *results, const char *part_id)
{
  if (results == NULL || part_id == NULL)
    return NULL;
  return pl_compiled_find_part (results->steady->compiled, part_id);
}

/* The element in slot of a compiled part, or -1. */
static int
pl_results_element (const PlResults *results, const char *part_id, guint slot)
{
  const PlCompiledPart *part = pl_results_part (results, part_id);

  if (part == NULL || !part->compiled || slot >= part->n_elements)
    return -1;
  return part->elements[slot];
}

gboolean
pl_results_get_port_pressure (const PlResults *results, const char *part_id,
                              const char *port_key, PlPressureKind kind, double *out)
{
  int node;
  const pls_steady_result *s;
  const pls_cycle_result *cy;
  double v;

  g_return_val_if_fail (results != NULL && out != NULL, FALSE);
  node = pl_compiled_get_port_node (results->steady->compiled, part_id, port_key);
  if (node < 0)
    return FALSE;
  switch (kind)
    {
    case PL_PRESSURE_IDLE:
    case PL_PRESSURE_STEADY_OPEN:
      s = results->steady->steady[kind == PL_PRESSURE_IDLE ? PL_CASE_IDLE
                                                           : PL_CASE_STEADY_OPEN];
      if (s == NULL || !pls_steady_node_solved (s, node))
        return FALSE;
      v = pls_steady_node_pressure (s, node);
      break;
    case PL_PRESSURE_CYCLE_MIN:
    case PL_PRESSURE_CYCLE_MAX:
    case PL_PRESSURE_CYCLE_MEAN:
      cy = pl_results_get_cycle (results);
      if (cy == NULL)
        return FALSE;
      /* The cycle leaves out what the steady idle solve left out. */
      s = results->steady->steady[PL_CASE_IDLE];
      if (s != NULL && !pls_steady_node_solved (s, node))
        return FALSE;
      v = kind == PL_PRESSURE_CYCLE_MIN ? pls_cycle_node_min (cy, node)
          : kind == PL_PRESSURE_CYCLE_MAX ? pls_cycle_node_max (cy, node)
          : pls_cycle_node_mean (cy, node);
      break;
    case PL_N_PRESSURES:
    default:
      return FALSE;
    }
  if (!isfinite (v))
    return FALSE;
  *out = v;
  return TRUE;
}

gboolean
pl_results_get_port_recovery (const PlResults *results, const char *part_id,
                              const char *port_key, double *out)
{
  const pls_cycle_result *cy;
  int node;

  g_return_val_if_fail (results != NULL && out != NULL, FALSE);
  cy = pl_results_get_cycle (results);
  node = pl_compiled_get_port_node (results->steady->compiled, part_id, port_key);
  if (cy == NULL || node < 0)
    return FALSE;
  *out = pls_cycle_node_recovery (cy, node);
  return isfinite (*out);
}

gboolean
pl_results_get_flow (const PlResults *results, const char *part_id, guint slot,
                     PlSteadyCase c, double *out)
{
  int e;
  const pls_steady_result *s;

  g_return_val_if_fail (results != NULL && out != NULL, FALSE);
  e = pl_results_element (results, part_id, slot);
  s = (guint) c < PL_N_CASES ? results->steady->steady[c] : NULL;
  if (e < 0 || s == NULL || !pls_steady_element_solved (s, e))
    return FALSE;
  *out = pls_steady_element_flow (s, e);
  return isfinite (*out);
}

gboolean
pl_results_get_line (const PlResults *results, const char *part_id, PlSteadyCase c,
                     pls_line_result *out)
{
  int e;
  const pls_steady_result *s;

  g_return_val_if_fail (results != NULL && out != NULL, FALSE);
  e = pl_results_element (results, part_id, 0);
  s = (guint) c < PL_N_CASES ? results->steady->steady[c] : NULL;
  if (e < 0 || s == NULL || !pls_steady_element_solved (s, e))
    return FALSE;
  return pls_steady_line (s, e, out) == PLS_OK;
}

gboolean
pl_results_get_pump (const PlResults *results, const char *part_id, PlSteadyCase c,
                     pls_pump_result *out)
{
  int e;
  const pls_steady_result *s;

  g_return_val_if_fail (results != NULL && out != NULL, FALSE);
  e = pl_results_element (results, part_id, 0);
  s = (guint) c < PL_N_CASES ? results->steady->steady[c] : NULL;
  if (e < 0 || s == NULL || !pls_steady_element_solved (s, e))
    return FALSE;
  return pls_steady_pump (s, e, out) == PLS_OK;
}

gboolean
pl_results_get_accumulator (const PlResults *results, const char *part_id, PlSteadyCase c,
                            pls_accumulator_result *out)
{
  int e;
  const pls_steady_result *s;

  g_return_val_if_fail (results != NULL && out != NULL, FALSE);
  e = pl_results_element (results, part_id, 0);
  s = (guint) c < PL_N_CASES ? results->steady->steady[c] : NULL;
  if (e < 0 || s == NULL || !pls_steady_element_solved (s, e))
    return FALSE;
  return pls_steady_accumulator (s, e, out) == PLS_OK;
}

gboolean
pl_results_get_accumulator_swing (const PlResults *results, const char *part_id,
                                  pls_cycle_accumulator *out)
{
  const pls_cycle_result *cy;
  int e;

  g_return_val_if_fail (results != NULL && out != NULL, FALSE);
  cy = pl_results_get_cycle (results);
  e = pl_results_element (results, part_id, 0);
  if (cy == NULL || e < 0)
    return FALSE;
  return pls_cycle_accumulator_swing (cy, e, out) == PLS_OK;
}

gboolean
pl_results_get_pump_cycle (const PlResults *results, const char *part_id,
                           pls_cycle_pump *out)
{
  const pls_cycle_result *cy;
  int e;

  g_return_val_if_fail (results != NULL && out != NULL, FALSE);
  cy = pl_results_get_cycle (results);
  e = pl_results_element (results, part_id, 0);
  if (cy == NULL || e < 0)
    return FALSE;
  return pls_cycle_pump_flow (cy, e, out) == PLS_OK;
}

gboolean
pl_results_get_shot (const PlResults *results, const char *part_id, double *mass,
                     double *deviation, double *first_mass)
{
  const pls_cycle_result *cy;
  const PlCompiledPart *part;
  int e;

  g_return_val_if_fail (results != NULL, FALSE);
  cy = pl_results_get_cycle (results);
  part = pl_results_part (results, part_id);
  e = pl_results_element (results, part_id, 0);
  if (cy == NULL || e < 0 || part->type->kind != PL_PART_APPLICATOR)
    return FALSE;
  if (mass != NULL)
    *mass = pls_cycle_shot_mass (cy, e);
  if (deviation != NULL)
    *deviation = pls_cycle_shot_deviation (cy, e);
  if (first_mass != NULL)
    *first_mass = pls_cycle_first_shot_mass (cy, e);
  return TRUE;
}

gboolean
pl_results_get_shutdown_safe_time (const PlResults *results, double *out)
{
  const pls_shutdown_result *sd;

  g_return_val_if_fail (results != NULL && out != NULL, FALSE);
  sd = pl_results_get_shutdown (results);
  if (sd == NULL)
    return FALSE;
  *out = pls_shutdown_safe_time (sd);
  return isfinite (*out);
}

/* --- findings --- */

guint
pl_results_get_n_findings (const PlResults *results)
{
  g_return_val_if_fail (results != NULL, 0);
  return results->steady->findings->len
         + (results->transient != NULL ? results->transient->findings->len : 0);
}

const PlFinding *
pl_results_get_finding (const PlResults *results, guint index)
{
  GArray *steady;

  g_return_val_if_fail (results != NULL, NULL);
  steady = results->steady->findings;
  if (index < steady->len)
    return &g_array_index (steady, PlFinding, index);
  index -= steady->len;
  if (results->transient == NULL || index >= results->transient->findings->len)
    return NULL;
  return &g_array_index (results->transient->findings, PlFinding, index);
}

guint
pl_results_count_findings (const PlResults *results, pls_severity at_least)
{
  guint n = 0;

  g_return_val_if_fail (results != NULL, 0);
  for (guint i = 0; i < pl_results_get_n_findings (results); i++)
    if (pl_results_get_finding (results, i)->severity >= at_least)
      n++;
  return n;
}
