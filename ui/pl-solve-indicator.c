/* SPDX-License-Identifier: GPL-3.0-or-later */

#include "config.h"

#include "pl-solve-indicator.h"

#include <glib/gi18n.h>

struct _PlSolveIndicator
{
  GtkWidget parent_instance;

  GtkWidget *box;
  GtkWidget *image;
  GtkWidget *spinner;
  GtkWidget *label;
  PlSolveState state;
  char *reason;     /* what was last shown, to skip repeating it */
  gboolean shown;
};

G_DEFINE_FINAL_TYPE (PlSolveIndicator, pl_solve_indicator, GTK_TYPE_WIDGET)

static void
pl_solve_indicator_dispose (GObject *object)
{
  PlSolveIndicator *self = PL_SOLVE_INDICATOR (object);

  g_clear_pointer (&self->box, gtk_widget_unparent);
  g_clear_pointer (&self->reason, g_free);
  G_OBJECT_CLASS (pl_solve_indicator_parent_class)->dispose (object);
}

static void
pl_solve_indicator_class_init (PlSolveIndicatorClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);

  object_class->dispose = pl_solve_indicator_dispose;
  gtk_widget_class_set_layout_manager_type (widget_class, GTK_TYPE_BIN_LAYOUT);
  gtk_widget_class_set_css_name (widget_class, "pl-solve-indicator");
  gtk_widget_class_set_accessible_role (widget_class, GTK_ACCESSIBLE_ROLE_STATUS);
}

static void
pl_solve_indicator_init (PlSolveIndicator *self)
{
  self->box = gtk_box_new (GTK_ORIENTATION_HORIZONTAL, 6);
  self->image = gtk_image_new ();
  self->spinner = gtk_spinner_new ();
  self->label = gtk_label_new (NULL);
  gtk_widget_set_parent (self->box, GTK_WIDGET (self));
  gtk_box_append (GTK_BOX (self->box), self->image);
  gtk_box_append (GTK_BOX (self->box), self->spinner);
  gtk_box_append (GTK_BOX (self->box), self->label);
  /* The width of the longest state, so the header bar does not jump. */
  gtk_label_set_width_chars (GTK_LABEL (self->label), 14);
  gtk_label_set_xalign (GTK_LABEL (self->label), 0);
  pl_solve_indicator_set_state (self, PL_SOLVE_STATE_NONE, NULL);
}

GtkWidget *
pl_solve_indicator_new (void)
{
  return g_object_new (PL_TYPE_SOLVE_INDICATOR, NULL);
}

void
pl_solve_indicator_set_state (PlSolveIndicator *self,
                              PlSolveState      state,
                              const char       *reason)
{
  static const char *const css[] = { "pl-none", "pl-fresh", "pl-solving", "pl-stale",
                                     "pl-error" };
  const char *icon = NULL, *text = "", *tip = NULL;

  g_return_if_fail (PL_IS_SOLVE_INDICATOR (self));
  g_return_if_fail (state <= PL_SOLVE_STATE_ERROR);

  /* Told on every edit: the same state again changes nothing, and a new
   * tooltip would cost a round trip to the display. */
  if (self->shown && state == self->state && g_strcmp0 (reason, self->reason) == 0)
    return;
  self->shown = TRUE;
  g_free (self->reason);
  self->reason = g_strdup (reason);

  switch (state)
    {
    case PL_SOLVE_STATE_NONE:
      text = _("No results");
      tip = _("Nothing to solve yet: add a pump and wire it up.");
      break;
    case PL_SOLVE_STATE_FRESH:
      icon = "emblem-ok-symbolic";
      text = _("Results fresh");
      tip = _("Every result shown belongs to the drawing as it is.");
      break;
    case PL_SOLVE_STATE_SOLVING:
      text = _("Solving…");
      tip = _("Idle and steady-open results are fresh; the firing cycle and the "
              "shutdown are being simulated.");
      break;
    case PL_SOLVE_STATE_STALE:
      icon = "view-refresh-symbolic";
      text = _("Out of date");
      tip = _("The results shown belong to an earlier state of the drawing.");
      break;
    case PL_SOLVE_STATE_ERROR:
    default:
      icon = "dialog-warning-symbolic";
      text = _("Solve failed");
      tip = reason != NULL ? reason : _("The solve failed.");
      break;
    }
  for (guint i = 0; i < G_N_ELEMENTS (css); i++)
    gtk_widget_remove_css_class (GTK_WIDGET (self), css[i]);
  gtk_widget_add_css_class (GTK_WIDGET (self), css[state]);
  self->state = state;
  gtk_widget_set_visible (self->image, icon != NULL);
  if (icon != NULL)
    gtk_image_set_from_icon_name (GTK_IMAGE (self->image), icon);
  gtk_widget_set_visible (self->spinner, state == PL_SOLVE_STATE_SOLVING);
  gtk_spinner_set_spinning (GTK_SPINNER (self->spinner), state == PL_SOLVE_STATE_SOLVING);
  gtk_label_set_text (GTK_LABEL (self->label), text);
  gtk_widget_set_tooltip_text (GTK_WIDGET (self), tip);
  gtk_accessible_update_property (GTK_ACCESSIBLE (self), GTK_ACCESSIBLE_PROPERTY_LABEL,
                                  text, GTK_ACCESSIBLE_PROPERTY_DESCRIPTION, tip, -1);
}

PlSolveState
pl_solve_indicator_get_state (PlSolveIndicator *self)
{
  g_return_val_if_fail (PL_IS_SOLVE_INDICATOR (self), PL_SOLVE_STATE_NONE);
  return self->state;
}

const char *
pl_solve_indicator_get_text (PlSolveIndicator *self)
{
  g_return_val_if_fail (PL_IS_SOLVE_INDICATOR (self), NULL);
  return gtk_label_get_text (GTK_LABEL (self->label));
}
