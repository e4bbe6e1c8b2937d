/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-baseline.c: a pinned snapshot compared with the current results.
 */
#include "config.h"

#include "pl-baseline.h"

#include <math.h>

/* A gauge or applicator of the pinned document. */
typedef struct
{
  char *part_id;
  char *tag;
  PlPartKind kind;
} PinnedPart;

struct _PlBaseline
{
  GObject parent_instance;

  PlResults *results;
  GArray *parts;              /* PinnedPart, document order */
};

G_DEFINE_FINAL_TYPE (PlBaseline, pl_baseline, G_TYPE_OBJECT)

static gboolean
compared_kind (PlPartKind kind)
{
  return kind == PL_PART_GAUGE || kind == PL_PART_APPLICATOR;
}

static void
pinned_part_clear (gpointer data)
{
  PinnedPart *p = data;

  g_free (p->part_id);
  g_free (p->tag);
}

static void
row_clear (gpointer data)
{
  PlBaselineRow *row = data;

  g_free (row->part_id);
  g_free (row->tag);
}

/* The figures of one part in a snapshot (NaN where unknown). */
static void
figures (PlResults *results, const char *part_id, PlPartKind kind,
         double out[PL_BASELINE_N_FIGURES])
{
  static const PlPressureKind pressures[] = {
    [PL_BASELINE_IDLE] = PL_PRESSURE_IDLE,
    [PL_BASELINE_STEADY_OPEN] = PL_PRESSURE_STEADY_OPEN,
    [PL_BASELINE_CYCLE_MIN] = PL_PRESSURE_CYCLE_MIN,
  };
  const char *port = kind == PL_PART_GAUGE ? "p" : "in";
  double mass;

  for (guint f = 0; f < PL_BASELINE_N_FIGURES; f++)
    out[f] = NAN;
  if (results == NULL)
    return;
  for (guint f = 0; f < G_N_ELEMENTS (pressures); f++)
    if (!pl_results_get_port_pressure (results, part_id, port, pressures[f], &out[f]))
      out[f] = NAN;
  if (kind == PL_PART_APPLICATOR
      && pl_results_get_shot (results, part_id, &mass, NULL, NULL) && isfinite (mass))
    out[PL_BASELINE_SHOT_MASS] = mass;
}

static void
pl_baseline_finalize (GObject *object)
{
  PlBaseline *self = PL_BASELINE (object);

  g_clear_pointer (&self->results, pl_results_unref);
  g_clear_pointer (&self->parts, g_array_unref);
  G_OBJECT_CLASS (pl_baseline_parent_class)->finalize (object);
}

static void
pl_baseline_class_init (PlBaselineClass *klass)
{
  G_OBJECT_CLASS (klass)->finalize = pl_baseline_finalize;
}

static void
pl_baseline_init (PlBaseline *self)
{
  self->parts = g_array_new (FALSE, TRUE, sizeof (PinnedPart));
  g_array_set_clear_func (self->parts, pinned_part_clear);
}

PlBaseline *
pl_baseline_new (PlDocument *doc, PlResults *results)
{
  PlBaseline *self;

  g_return_val_if_fail (PL_IS_DOCUMENT (doc), NULL);
  g_return_val_if_fail (results != NULL, NULL);
  g_return_val_if_fail (pl_results_get_revision (results) == pl_document_get_revision (doc),
                        NULL);

  self = g_object_new (PL_TYPE_BASELINE, NULL);
  self->results = pl_results_ref (results);
  for (guint i = 0; i < pl_document_get_n_parts (doc); i++)
    {
      const PlPart *part = pl_document_get_part (doc, i);
      PlPartKind kind = pl_part_get_part_type (part)->kind;
      PinnedPart p;

      if (!compared_kind (kind))
        continue;
      p.part_id = g_strdup (pl_part_get_id (part));
      p.tag = g_strdup (pl_part_get_tag (part));
      p.kind = kind;
      g_array_append_val (self->parts, p);
    }
  return self;
}

PlResults *
pl_baseline_get_results (PlBaseline *baseline)
{
  g_return_val_if_fail (PL_IS_BASELINE (baseline), NULL);
  return baseline->results;
}

static const PinnedPart *
find_pinned (PlBaseline *self, const char *part_id)
{
  for (guint i = 0; i < self->parts->len; i++)
    {
      const PinnedPart *p = &g_array_index (self->parts, PinnedPart, i);

      if (g_strcmp0 (p->part_id, part_id) == 0)
        return p;
    }
  return NULL;
}

static void
fill_difference (PlBaselineRow *row)
{
  for (guint f = 0; f < PL_BASELINE_N_FIGURES; f++)
    row->difference[f] = isfinite (row->before[f]) && isfinite (row->after[f])
                         ? row->after[f] - row->before[f] : NAN;
}

GArray *
pl_baseline_compare (PlBaseline *baseline, PlDocument *doc, PlResults *results)
{
  GArray *rows;
  PlResults *current;

  g_return_val_if_fail (PL_IS_BASELINE (baseline), NULL);
  g_return_val_if_fail (PL_IS_DOCUMENT (doc), NULL);

  current = results != NULL
            && pl_results_get_revision (results) == pl_document_get_revision (doc)
            ? results : NULL;
  rows = g_array_new (FALSE, TRUE, sizeof (PlBaselineRow));
  g_array_set_clear_func (rows, row_clear);
  for (guint i = 0; i < pl_document_get_n_parts (doc); i++)
    {
      const PlPart *part = pl_document_get_part (doc, i);
      PlPartKind kind = pl_part_get_part_type (part)->kind;
      const PinnedPart *pinned;
      PlBaselineRow row = { 0 };

      if (!compared_kind (kind))
        continue;
      pinned = find_pinned (baseline, pl_part_get_id (part));
      row.part_id = g_strdup (pl_part_get_id (part));
      row.tag = g_strdup (pl_part_get_tag (part));
      row.kind = kind;
      /* A part whose type changed under the same id cannot happen (ids are
       * never reused), so the pinned kind is the current one. */
      row.change = pinned != NULL ? PL_BASELINE_KEPT : PL_BASELINE_ADDED;
      figures (pinned != NULL ? baseline->results : NULL, row.part_id, kind, row.before);
      figures (current, row.part_id, kind, row.after);
      fill_difference (&row);
      g_array_append_val (rows, row);
    }
  for (guint i = 0; i < baseline->parts->len; i++)
    {
      const PinnedPart *p = &g_array_index (baseline->parts, PinnedPart, i);
      PlBaselineRow row = { 0 };

      if (pl_document_find_part (doc, p->part_id) != NULL)
        continue;
      row.part_id = g_strdup (p->part_id);
      row.tag = g_strdup (p->tag);
      row.kind = p->kind;
      row.change = PL_BASELINE_REMOVED;
      figures (baseline->results, p->part_id, p->kind, row.before);
      figures (NULL, p->part_id, p->kind, row.after);
      fill_difference (&row);
      g_array_append_val (rows, row);
    }
  return rows;
}

const char *
pl_baseline_figure_get_key (PlBaselineFigure figure)
{
  static const char *const keys[] = { "idle", "steady_open", "cycle_min", "shot_mass" };

  return figure < G_N_ELEMENTS (keys) ? keys[figure] : NULL;
}
