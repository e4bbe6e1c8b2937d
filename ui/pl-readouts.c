/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-readouts.c: big pressure readouts at the replay instant.
 */
#include "config.h"

#include "pl-readouts.h"

#include <glib/gi18n.h>

#include "pl-label-text.h"

/* One readout: a gauge's connection or an applicator's inlet. */
typedef struct
{
  char *part_id;
  const char *port_key;        /* static: "p" or "in" */
  GtkWidget *box, *name, *value, *detail, *choice;
} Readout;

struct _PlReadouts
{
  GtkWidget parent_instance;

  GtkWidget *column;           /* the readouts, one under the other */
  GtkWidget *choices;          /* their check buttons (a reference kept) */
  GArray *readouts;            /* Readout */
  PlDocument *doc;
  gulong changed_id;
};

G_DEFINE_FINAL_TYPE (PlReadouts, pl_readouts, GTK_TYPE_WIDGET)

static void
readout_clear (gpointer data)
{
  Readout *r = data;

  g_free (r->part_id);
}

static GtkWidget *
label_with (const char *text, const char *css, double xalign)
{
  GtkWidget *label = gtk_label_new (text);

  gtk_widget_add_css_class (label, css);
  gtk_label_set_xalign (GTK_LABEL (label), xalign);
  return label;
}

static void
choice_toggled_cb (GtkCheckButton *button, GtkWidget *box)
{
  gtk_widget_set_visible (box, gtk_check_button_get_active (button));
}

/* One readout per gauge and applicator of the document, in its order. */
static void
rebuild (PlReadouts *self)
{
  GtkWidget *child;

  while ((child = gtk_widget_get_first_child (self->column)) != NULL)
    gtk_box_remove (GTK_BOX (self->column), child);
  while ((child = gtk_widget_get_first_child (self->choices)) != NULL)
    gtk_box_remove (GTK_BOX (self->choices), child);
  g_array_set_size (self->readouts, 0);
  for (guint i = 0; self->doc != NULL && i < pl_document_get_n_parts (self->doc); i++)
    {
      const PlPart *part = pl_document_get_part (self->doc, i);
      PlPartKind kind = pl_part_get_part_type (part)->kind;
      g_autofree char *name = NULL;
      Readout r = { 0 };

      if (kind != PL_PART_GAUGE && kind != PL_PART_APPLICATOR)
        continue;
      r.part_id = g_strdup (pl_part_get_id (part));
      r.port_key = kind == PL_PART_GAUGE ? "p" : "in";
      /* Translators: the name over a big readout: "G1 gauge", "N4 at the inlet". */
      name = kind == PL_PART_GAUGE ? g_strdup_printf (_("%s gauge"), pl_part_get_tag (part))
                                   : g_strdup_printf (_("%s at the inlet"),
                                                      pl_part_get_tag (part));
      /* The name and the detail stacked on the left, the big value on the
       * right: five readouts and the what-if panel fit one column. */
      r.box = gtk_grid_new ();
      gtk_grid_set_column_spacing (GTK_GRID (r.box), 12);
      gtk_widget_add_css_class (r.box, "pl-readout");
      r.name = label_with (name, "pl-readout-name", 0.0);
      r.value = label_with ("–", "pl-readout-value", 1.0);
      r.detail = label_with ("", "pl-readout-detail", 0.0);
      gtk_widget_add_css_class (r.value, "numeric");
      gtk_widget_set_hexpand (r.name, TRUE);
      gtk_label_set_wrap (GTK_LABEL (r.detail), TRUE);
      gtk_label_set_max_width_chars (GTK_LABEL (r.detail), 24);
      gtk_label_set_width_chars (GTK_LABEL (r.value), 8);
      gtk_grid_attach (GTK_GRID (r.box), r.name, 0, 0, 1, 1);
      gtk_grid_attach (GTK_GRID (r.box), r.detail, 0, 1, 1, 1);
      gtk_grid_attach (GTK_GRID (r.box), r.value, 1, 0, 1, 2);
      gtk_box_append (GTK_BOX (self->column), r.box);
      r.choice = gtk_check_button_new_with_label (name);
      gtk_check_button_set_active (GTK_CHECK_BUTTON (r.choice), TRUE);
      g_signal_connect (r.choice, "toggled", G_CALLBACK (choice_toggled_cb), r.box);
      gtk_box_append (GTK_BOX (self->choices), r.choice);
      g_array_append_val (self->readouts, r);
    }
}

static void
doc_changed_cb (PlDocument *doc, guint change, PlReadouts *self)
{
  if (change & (PL_CHANGE_TOPOLOGY | PL_CHANGE_ANNOTATION))
    rebuild (self);
}

static void
pl_readouts_dispose (GObject *object)
{
  PlReadouts *self = PL_READOUTS (object);

  pl_readouts_set_document (self, NULL);
  g_clear_pointer (&self->readouts, g_array_unref);
  g_clear_object (&self->choices);
  g_clear_pointer (&self->column, gtk_widget_unparent);
  G_OBJECT_CLASS (pl_readouts_parent_class)->dispose (object);
}

static void
pl_readouts_class_init (PlReadoutsClass *klass)
{
  G_OBJECT_CLASS (klass)->dispose = pl_readouts_dispose;
  gtk_widget_class_set_layout_manager_type (GTK_WIDGET_CLASS (klass), GTK_TYPE_BIN_LAYOUT);
  gtk_widget_class_set_css_name (GTK_WIDGET_CLASS (klass), "pl-readouts");
}

static void
pl_readouts_init (PlReadouts *self)
{
  self->column = gtk_box_new (GTK_ORIENTATION_VERTICAL, 8);
  gtk_widget_set_parent (self->column, GTK_WIDGET (self));
  self->choices = g_object_ref_sink (gtk_box_new (GTK_ORIENTATION_VERTICAL, 4));
  self->readouts = g_array_new (FALSE, TRUE, sizeof (Readout));
  g_array_set_clear_func (self->readouts, readout_clear);
}

GtkWidget *
pl_readouts_new (void)
{
  return g_object_new (PL_TYPE_READOUTS, NULL);
}

void
pl_readouts_set_document (PlReadouts *self, PlDocument *doc)
{
  g_return_if_fail (PL_IS_READOUTS (self));
  if (self->doc != NULL)
    g_clear_signal_handler (&self->changed_id, self->doc);
  g_set_object (&self->doc, doc);
  if (doc != NULL)
    self->changed_id = g_signal_connect (doc, "changed", G_CALLBACK (doc_changed_cb), self);
  if (self->readouts != NULL)
    rebuild (self);
}

void
pl_readouts_update (PlReadouts *self, PlResults *full, PlResults *any, PlRun run, double t,
                    const PlUnitPrefs *units)
{
  g_return_if_fail (PL_IS_READOUTS (self));
  for (guint i = 0; i < self->readouts->len; i++)
    {
      Readout *r = &g_array_index (self->readouts, Readout, i);
      g_autofree char *value = NULL, *detail = NULL;
      double p, ref;

      if (full != NULL
          && pl_results_get_port_pressure_at (full, r->part_id, r->port_key, run, t, &p))
        {
          PlPressureKind kind = run == PL_RUN_CYCLE ? PL_PRESSURE_CYCLE_MIN : PL_PRESSURE_IDLE;

          value = pl_unit_format (p, PL_QUANTITY_PRESSURE, units, 3,
                                  PL_UNIT_DECIMAL_FROM_LOCALE);
          if (pl_results_get_port_pressure (full, r->part_id, r->port_key, kind, &ref))
            {
              g_autofree char *ref_text = pl_unit_format (ref, PL_QUANTITY_PRESSURE, units, 3,
                                                          PL_UNIT_DECIMAL_FROM_LOCALE);

              /* Translators: under a big pressure readout. */
              detail = run == PL_RUN_CYCLE
                       ? g_strdup_printf (_("lowest in the cycle %s"), ref_text)
                       : g_strdup_printf (_("%s before the air went off"), ref_text);
            }
        }
      else if (any != NULL
               && pl_results_get_port_pressure (any, r->part_id, r->port_key,
                                                PL_PRESSURE_STEADY_OPEN, &p))
        {
          value = pl_unit_format (p, PL_QUANTITY_PRESSURE, units, 3,
                                  PL_UNIT_DECIMAL_FROM_LOCALE);
          detail = g_strdup (_("all applicators open; the cycle is being solved"));
        }
      pl_label_set_text_if_changed (r->value, value != NULL ? value : "–");
      pl_label_set_text_if_changed (r->detail, detail != NULL ? detail : _("no result"));
    }
}

GtkWidget *
pl_readouts_get_choices (PlReadouts *self)
{
  g_return_val_if_fail (PL_IS_READOUTS (self), NULL);
  return self->choices;
}

const char *
pl_readouts_get_value (PlReadouts *self, const char *part_id)
{
  g_return_val_if_fail (PL_IS_READOUTS (self), NULL);
  for (guint i = 0; i < self->readouts->len; i++)
    {
      Readout *r = &g_array_index (self->readouts, Readout, i);

      if (g_strcmp0 (r->part_id, part_id) == 0)
        return gtk_label_get_text (GTK_LABEL (r->value));
    }
  return NULL;
}
