/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-baseline-table.c: before, after and the change, part by part.
 */
#include "config.h"

#include "pl-baseline-table.h"

#include <glib/gi18n.h>
#include <math.h>

static const struct
{
  const char *title;
  PlQuantity quantity;
} figures[PL_BASELINE_N_FIGURES] = {
  [PL_BASELINE_IDLE] = { N_("Idle"), PL_QUANTITY_PRESSURE },
  [PL_BASELINE_STEADY_OPEN] = { N_("All open"), PL_QUANTITY_PRESSURE },
  [PL_BASELINE_CYCLE_MIN] = { N_("Lowest in cycle"), PL_QUANTITY_PRESSURE },
  [PL_BASELINE_SHOT_MASS] = { N_("Shot"), PL_QUANTITY_MASS },
};

struct _PlBaselineTable
{
  GtkWidget parent_instance;

  GtkWidget *grid;
  GArray *rows;
  /* part id -> GtkLabel * of its change cells, figure-major */
  GHashTable *change_cells;
};

G_DEFINE_FINAL_TYPE (PlBaselineTable, pl_baseline_table, GTK_TYPE_WIDGET)

static GtkWidget *
cell (GtkGrid *grid, const char *text, int col, int row, const char *css)
{
  GtkWidget *label = gtk_label_new (text);

  gtk_label_set_xalign (GTK_LABEL (label), col == 0 ? 0.0 : 1.0);
  if (css != NULL)
    gtk_widget_add_css_class (label, css);
  gtk_grid_attach (grid, label, col, row, 1, 1);
  return label;
}

/* "▲ +2.1 bar", "▼ −0.3 g", "= 0 bar" (no change at the figures shown),
 * "–" when one side is missing. */
static char *
change_text (double d, double before, PlQuantity q, const PlUnitPrefs *units, int *sign)
{
  g_autofree char *mag = NULL;

  *sign = 0;
  if (!isfinite (d))
    return g_strdup ("–");
  /* Below the last of three significant digits of the value: no change. */
  if (fabs (d) < 5e-4 * fabs (before) || d == 0.0)
    {
      g_autofree char *zero = pl_unit_format (0.0, q, units, 3, PL_UNIT_DECIMAL_FROM_LOCALE);

      /* Translators: no change in a before/after table, "= 0 bar". */
      return g_strdup_printf (_("= %s"), zero);
    }
  *sign = d > 0 ? 1 : -1;
  mag = pl_unit_format (fabs (d), q, units, 3, PL_UNIT_DECIMAL_FROM_LOCALE);
  /* Translators: a rise and a fall in a before/after table: the arrow and
   * the sign say it in black and white too. */
  return d > 0 ? g_strdup_printf (_("▲ +%s"), mag) : g_strdup_printf (_("▼ −%s"), mag);
}

static char *
pair_text (const PlBaselineRow *r, guint f, const PlUnitPrefs *units)
{
  g_autofree char *b = pl_unit_format_number (r->before[f], figures[f].quantity, units, 3,
                                              PL_UNIT_DECIMAL_FROM_LOCALE);
  g_autofree char *a = pl_unit_format (r->after[f], figures[f].quantity, units, 3,
                                       PL_UNIT_DECIMAL_FROM_LOCALE);

  /* Translators: before and after in a table cell, "152 → 160 bar". */
  return g_strdup_printf (_("%s → %s"), b, a);
}

static void
clear_grid (PlBaselineTable *self)
{
  GtkWidget *child;

  while ((child = gtk_widget_get_first_child (self->grid)) != NULL)
    gtk_grid_remove (GTK_GRID (self->grid), child);
  g_hash_table_remove_all (self->change_cells);
}

static void
pl_baseline_table_dispose (GObject *object)
{
  PlBaselineTable *self = PL_BASELINE_TABLE (object);

  g_clear_pointer (&self->rows, g_array_unref);
  g_clear_pointer (&self->change_cells, g_hash_table_unref);
  g_clear_pointer (&self->grid, gtk_widget_unparent);
  G_OBJECT_CLASS (pl_baseline_table_parent_class)->dispose (object);
}

static void
pl_baseline_table_class_init (PlBaselineTableClass *klass)
{
  G_OBJECT_CLASS (klass)->dispose = pl_baseline_table_dispose;
  gtk_widget_class_set_layout_manager_type (GTK_WIDGET_CLASS (klass), GTK_TYPE_BIN_LAYOUT);
  gtk_widget_class_set_css_name (GTK_WIDGET_CLASS (klass), "pl-baseline-table");
}

static void
pl_baseline_table_init (PlBaselineTable *self)
{
  self->grid = gtk_grid_new ();
  gtk_grid_set_column_spacing (GTK_GRID (self->grid), 10);
  gtk_grid_set_row_spacing (GTK_GRID (self->grid), 4);
  gtk_widget_set_parent (self->grid, GTK_WIDGET (self));
  self->change_cells = g_hash_table_new_full (g_str_hash, g_str_equal, g_free, g_free);
}

GtkWidget *
pl_baseline_table_new (void)
{
  return g_object_new (PL_TYPE_BASELINE_TABLE, NULL);
}

void
pl_baseline_table_set_rows (PlBaselineTable *self, GArray *rows, const PlUnitPrefs *units)
{
  GtkGrid *grid;

  g_return_if_fail (PL_IS_BASELINE_TABLE (self));
  if (rows != NULL)
    g_array_ref (rows);
  g_clear_pointer (&self->rows, g_array_unref);
  self->rows = rows;
  clear_grid (self);
  if (rows == NULL)
    return;
  grid = GTK_GRID (self->grid);
  cell (grid, _("Part"), 0, 0, "heading");
  for (guint f = 0; f < PL_BASELINE_N_FIGURES; f++)
    {
      GtkWidget *h = gtk_label_new (_(figures[f].title));

      gtk_widget_add_css_class (h, "heading");
      gtk_grid_attach (grid, h, 1 + 2 * (int) f, 0, 2, 1);
      cell (grid, _("Before → after"), 1 + 2 * (int) f, 1, "dim-label");
      cell (grid, _("Change"), 2 + 2 * (int) f, 1, "dim-label");
    }
  for (guint i = 0; i < rows->len; i++)
    {
      const PlBaselineRow *r = &g_array_index (rows, PlBaselineRow, i);
      GtkWidget **cells = g_new0 (GtkWidget *, PL_BASELINE_N_FIGURES);
      g_autofree char *name = NULL;
      int row = 2 + (int) i;

      /* Translators: a part that was added or removed since the baseline. */
      name = r->change == PL_BASELINE_ADDED ? g_strdup_printf (_("%s (new)"), r->tag)
             : r->change == PL_BASELINE_REMOVED ? g_strdup_printf (_("%s (removed)"), r->tag)
             : g_strdup (r->tag);
      cell (grid, name, 0, row, NULL);
      for (guint f = 0; f < PL_BASELINE_N_FIGURES; f++)
        {
          g_autofree char *pair = NULL, *change = NULL;
          int sign;

          if (r->kind != PL_PART_APPLICATOR && f == PL_BASELINE_SHOT_MASS)
            continue;
          pair = pair_text (r, f, units);
          change = change_text (r->difference[f], r->before[f], figures[f].quantity, units,
                                &sign);
          cell (grid, pair, 1 + 2 * (int) f, row, "numeric");
          cells[f] = cell (grid, change, 2 + 2 * (int) f, row,
                           sign > 0 ? "pl-rise" : sign < 0 ? "pl-fall" : "numeric");
          gtk_widget_add_css_class (cells[f], "numeric");
        }
      g_hash_table_insert (self->change_cells, g_strdup (r->part_id), cells);
    }
}

GArray *
pl_baseline_table_get_rows (PlBaselineTable *self)
{
  g_return_val_if_fail (PL_IS_BASELINE_TABLE (self), NULL);
  return self->rows;
}

const char *
pl_baseline_table_get_change_text (PlBaselineTable *self, const char *part_id,
                                   PlBaselineFigure figure)
{
  GtkWidget **cells;

  g_return_val_if_fail (PL_IS_BASELINE_TABLE (self), NULL);
  cells = g_hash_table_lookup (self->change_cells, part_id);
  if (cells == NULL || figure >= PL_BASELINE_N_FIGURES || cells[figure] == NULL)
    return NULL;
  return gtk_label_get_text (GTK_LABEL (cells[figure]));
}
