/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-window-actions.c: the window's actions and shortcuts.
 *
 * Keys with Ctrl are application accelerators (they work wherever the
 * focus is).  Keys without a modifier (R rotate, F flip, Delete, Escape,
 * Home fit) and the clipboard and select-all keys belong to the canvas
 * alone: as global accelerators they would swallow the same keys typed in
 * the inspector's entries.
 */

#include "config.h"

#include <glib/gi18n.h>

#include "pl-export-dialog.h"
#include "pl-presentation.h"
#include "pl-print.h"
#include "pl-results-wait.h"
#include "pl-window-private.h"

/* One step of the zoom keys and menu items: five steps double the zoom
 * (1.25^3 = 1.95), a common practice in drawing programs, no source. */
#define ZOOM_STEP 1.25

static void
action_new (GtkWidget *widget, const char *name, GVariant *param)
{
  pl_file_ops_new (PL_WINDOW (widget));
}

static void
action_open (GtkWidget *widget, const char *name, GVariant *param)
{
  pl_file_ops_open (PL_WINDOW (widget));
}

static void
action_open_recent (GtkWidget *widget, const char *name, GVariant *param)
{
  pl_file_ops_open_uri (PL_WINDOW (widget), g_variant_get_string (param, NULL));
}

static void
action_save (GtkWidget *widget, const char *name, GVariant *param)
{
  pl_file_ops_save (PL_WINDOW (widget));
}

static void
action_save_as (GtkWidget *widget, const char *name, GVariant *param)
{
  pl_file_ops_save_as (PL_WINDOW (widget));
}

static void
action_present (GtkWidget *widget, const char *name, GVariant *param)
{
  PlWindow *self = PL_WINDOW (widget);

  gtk_window_present (GTK_WINDOW (pl_presentation_new (GTK_WINDOW (self), self->doc,
                                                       self->undo, self->scheduler,
                                                       &self->units, TRUE)));
}

static void
action_export_work_order (GtkWidget *widget, const char *name, GVariant *param)
{
  pl_export_dialog_show (PL_WINDOW (widget));
}

/* The export without its dialog, to a path, with the dialog's last
 * settings (for scripts and tests). */
static void
action_export_work_order_to (GtkWidget *widget, const char *name, GVariant *param)
{
  g_autoptr (GFile) file = g_file_new_for_path (g_variant_get_string (param, NULL));

  pl_export_dialog_write_when_solved (PL_WINDOW (widget), file,
                                      pl_export_dialog_get_settings ());
}

/* Printing waits for the full results like the export (pl-results-wait.h). */
static void
print_when_solved_cb (PlWindow *window, PlResults *results, gpointer data)
{
  g_autoptr (GError) error = NULL;

  if (results != NULL
      && pl_print_run (window, results, GTK_PRINT_OPERATION_ACTION_PRINT_DIALOG, NULL, &error)
         == GTK_PRINT_OPERATION_RESULT_ERROR)
    pl_file_ops_show_error (window, _("The work order could not be printed"),
                            error != NULL ? error->message : "");
}

static void
action_print (GtkWidget *widget, const char *name, GVariant *param)
{
  pl_results_wait (PL_WINDOW (widget), _("Print"), print_when_solved_cb, NULL, NULL);
}

static void
action_undo (GtkWidget *widget, const char *name, GVariant *param)
{
  PlWindow *self = PL_WINDOW (widget);

  pl_canvas_cancel (self->canvas);
  pl_undo_stack_undo (self->undo);
}

static void
action_redo (GtkWidget *widget, const char *name, GVariant *param)
{
  PlWindow *self = PL_WINDOW (widget);

  pl_canvas_cancel (self->canvas);
  pl_undo_stack_redo (self->undo);
}

static void
action_delete (GtkWidget *widget, const char *name, GVariant *param)
{
  pl_canvas_delete_selection (PL_WINDOW (widget)->canvas);
}

static void
action_select_all (GtkWidget *widget, const char *name, GVariant *param)
{
  pl_canvas_select_all (PL_WINDOW (widget)->canvas);
}

static void
action_copy (GtkWidget *widget, const char *name, GVariant *param)
{
  pl_canvas_copy (PL_WINDOW (widget)->canvas);
  pl_window_update_actions (PL_WINDOW (widget));
}

static void
action_paste (GtkWidget *widget, const char *name, GVariant *param)
{
  pl_canvas_paste (PL_WINDOW (widget)->canvas);
}

static void
action_rotate (GtkWidget *widget, const char *name, GVariant *param)
{
  pl_canvas_rotate_selection (PL_WINDOW (widget)->canvas);
}

static void
action_flip (GtkWidget *widget, const char *name, GVariant *param)
{
  pl_canvas_flip_selection (PL_WINDOW (widget)->canvas);
}

static void
action_cancel (GtkWidget *widget, const char *name, GVariant *param)
{
  pl_canvas_cancel (PL_WINDOW (widget)->canvas);
}

static void
action_zoom_in (GtkWidget *widget, const char *name, GVariant *param)
{
  pl_canvas_zoom (PL_WINDOW (widget)->canvas, ZOOM_STEP);
}

static void
action_zoom_out (GtkWidget *widget, const char *name, GVariant *param)
{
  pl_canvas_zoom (PL_WINDOW (widget)->canvas, 1.0 / ZOOM_STEP);
}

static void
action_zoom_reset (GtkWidget *widget, const char *name, GVariant *param)
{
  pl_canvas_zoom_reset (PL_WINDOW (widget)->canvas);
}

static void
action_zoom_fit (GtkWidget *widget, const char *name, GVariant *param)
{
  pl_canvas_zoom_fit (PL_WINDOW (widget)->canvas);
}

void
pl_window_class_install_actions (GtkWidgetClass *widget_class)
{
  gtk_widget_class_install_action (widget_class, "win.new", NULL, action_new);
  gtk_widget_class_install_action (widget_class, "win.open", NULL, action_open);
  gtk_widget_class_install_action (widget_class, "win.open-recent", "s", action_open_recent);
  gtk_widget_class_install_action (widget_class, "win.save", NULL, action_save);
  gtk_widget_class_install_action (widget_class, "win.save-as", NULL, action_save_as);
  gtk_widget_class_install_action (widget_class, "win.present", NULL, action_present);
  gtk_widget_class_install_action (widget_class, "win.export-work-order", NULL,
                                   action_export_work_order);
  gtk_widget_class_install_action (widget_class, "win.export-work-order-to", "s",
                                   action_export_work_order_to);
  gtk_widget_class_install_action (widget_class, "win.print", NULL, action_print);
  gtk_widget_class_install_action (widget_class, "win.undo", NULL, action_undo);
  gtk_widget_class_install_action (widget_class, "win.redo", NULL, action_redo);
  gtk_widget_class_install_action (widget_class, "win.delete", NULL, action_delete);
  gtk_widget_class_install_action (widget_class, "win.select-all", NULL, action_select_all);
  gtk_widget_class_install_action (widget_class, "win.copy", NULL, action_copy);
  gtk_widget_class_install_action (widget_class, "win.paste", NULL, action_paste);
  gtk_widget_class_install_action (widget_class, "win.rotate", NULL, action_rotate);
  gtk_widget_class_install_action (widget_class, "win.flip", NULL, action_flip);
  gtk_widget_class_install_action (widget_class, "win.cancel", NULL, action_cancel);
  gtk_widget_class_install_action (widget_class, "win.zoom-in", NULL, action_zoom_in);
  gtk_widget_class_install_action (widget_class, "win.zoom-out", NULL, action_zoom_out);
  gtk_widget_class_install_action (widget_class, "win.zoom-reset", NULL, action_zoom_reset);
  gtk_widget_class_install_action (widget_class, "win.zoom-fit", NULL, action_zoom_fit);
}

void
pl_window_set_accels (GtkApplication *app)
{
  static const struct
  {
    const char *action;
    const char *accels[4];
  } table[] = {
    { "win.new", { "<Control>n", NULL } },
    { "win.open", { "<Control>o", NULL } },
    { "win.save", { "<Control>s", NULL } },
    { "win.save-as", { "<Control><Shift>s", NULL } },
    { "win.print", { "<Control>p", NULL } },
    { "win.undo", { "<Control>z", NULL } },
    { "win.redo", { "<Control><Shift>z", "<Control>y", NULL } },
    { "win.zoom-in", { "<Control>plus", "<Control>equal", "<Control>KP_Add", NULL } },
    { "win.zoom-out", { "<Control>minus", "<Control>KP_Subtract", NULL } },
    { "win.zoom-reset", { "<Control>0", "<Control>KP_0", NULL } },
    { "win.show-help-overlay", { "<Control>question", NULL } },
    { "win.present", { "F5", NULL } },
    { "app.new-window", { "<Control><Shift>n", NULL } },
  };

  for (guint i = 0; i < G_N_ELEMENTS (table); i++)
    gtk_application_set_accels_for_action (app, table[i].action, table[i].accels);
}

void
pl_window_add_canvas_shortcuts (PlWindow *self)
{
  static const struct
  {
    const char *trigger;
    const char *action;
  } table[] = {
    { "Delete", "win.delete" },
    { "BackSpace", "win.delete" },
    { "KP_Delete", "win.delete" },
    { "<Control>a", "win.select-all" },
    { "<Control>c", "win.copy" },
    { "<Control>v", "win.paste" },
    { "r", "win.rotate" },
    { "f", "win.flip" },
    { "Escape", "win.cancel" },
    { "Home", "win.zoom-fit" },
  };
  GtkEventController *controller = gtk_shortcut_controller_new ();

  for (guint i = 0; i < G_N_ELEMENTS (table); i++)
    gtk_shortcut_controller_add_shortcut (
      GTK_SHORTCUT_CONTROLLER (controller),
      gtk_shortcut_new (gtk_shortcut_trigger_parse_string (table[i].trigger),
                        gtk_named_action_new (table[i].action)));
  gtk_widget_add_controller (GTK_WIDGET (self->canvas), controller);
}

/* Sets a tooltip only when it changes: each new one asks the display where
 * the pointer is. */
static void
pl_window_set_tooltip (GtkWidget *widget, const char *text)
{
  if (g_strcmp0 (gtk_widget_get_tooltip_text (widget), text) != 0)
    gtk_widget_set_tooltip_text (widget, text);
}

/* The undo and redo buttons name the step they take back or again and
 * the parts it acts on. */
static void
pl_window_update_undo_tooltips (PlWindow *self)
{
  g_autofree char *undo = pl_undo_stack_describe_undo (self->undo);
  g_autofree char *redo = pl_undo_stack_describe_redo (self->undo);
  /* Translators: a button's tooltip naming the step, "Undo Change Bore H2 (Ctrl+Z)". */
  g_autofree char *undo_tip = undo != NULL ? g_strdup_printf (_("Undo %s (Ctrl+Z)"), undo)
                                           : g_strdup (_("Undo (Ctrl+Z)"));
  /* Translators: a button's tooltip naming the step, "Redo Move 3 Parts (Shift+Ctrl+Z)". */
  g_autofree char *redo_tip = redo != NULL
                              ? g_strdup_printf (_("Redo %s (Shift+Ctrl+Z)"), redo)
                              : g_strdup (_("Redo (Shift+Ctrl+Z)"));

  pl_window_set_tooltip (self->undo_button, undo_tip);
  pl_window_set_tooltip (self->redo_button, redo_tip);
}

void
pl_window_update_actions (PlWindow *self)
{
  GtkWidget *widget = GTK_WIDGET (self);
  g_auto (GStrv) ids = NULL;
  gboolean any;

  if (self->canvas == NULL || self->undo == NULL)
    return;
  ids = pl_canvas_get_selection (self->canvas);
  any = ids != NULL && ids[0] != NULL;
  gtk_widget_action_set_enabled (widget, "win.undo", pl_undo_stack_can_undo (self->undo));
  gtk_widget_action_set_enabled (widget, "win.redo", pl_undo_stack_can_redo (self->undo));
  gtk_widget_action_set_enabled (widget, "win.delete", any);
  gtk_widget_action_set_enabled (widget, "win.copy", any);
  gtk_widget_action_set_enabled (widget, "win.rotate", any);
  gtk_widget_action_set_enabled (widget, "win.flip", any);
  gtk_widget_action_set_enabled (widget, "win.paste", pl_canvas_can_paste (self->canvas));
  pl_window_update_undo_tooltips (self);
}
