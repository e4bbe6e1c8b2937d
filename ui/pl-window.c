/* SPDX-License-Identifier: GPL-3.0-or-later */

#include "config.h"

#include "pl-window.h"

#include <glib/gi18n.h>

#include "pl-layout-reader.h"
#include "pl-layout-writer.h"
#include "pl-window-private.h"

/* How long a brief message stays over the canvas: long enough to read a
 * two-line refusal (about 15 words at 250 words a minute). */
#define TOAST_SECONDS 4

G_DEFINE_FINAL_TYPE (PlWindow, pl_window, GTK_TYPE_APPLICATION_WINDOW)

static GSettings *
pl_window_settings (PlWindow *self)
{
  GtkApplication *app = gtk_window_get_application (GTK_WINDOW (self));

  return app != NULL ? pl_application_get_settings (PL_APPLICATION (app)) : NULL;
}

static void
pl_window_restore_size (PlWindow *self)
{
  GSettings *settings = pl_window_settings (self);

  if (settings == NULL)
    return;
  gtk_window_set_default_size (GTK_WINDOW (self),
                               g_settings_get_int (settings, "window-width"),
                               g_settings_get_int (settings, "window-height"));
  if (g_settings_get_boolean (settings, "window-maximized"))
    gtk_window_maximize (GTK_WINDOW (self));
}

static void
pl_window_save_size (PlWindow *self)
{
  GSettings *settings = pl_window_settings (self);
  int width, height;

  if (settings == NULL)
    return;
  /* The default size tracks the unmaximised size, which is what to restore. */
  gtk_window_get_default_size (GTK_WINDOW (self), &width, &height);
  g_settings_set_int (settings, "window-width", width);
  g_settings_set_int (settings, "window-height", height);
  g_settings_set_boolean (settings, "window-maximized",
                          gtk_window_is_maximized (GTK_WINDOW (self)));
}

/* --- results --- */

static const PlFinding *
pl_window_failure (PlResults *results)
{
  guint n = results != NULL ? pl_results_get_n_findings (results) : 0;

  for (guint i = 0; i < n; i++)
    {
      const PlFinding *f = pl_results_get_finding (results, i);
      if (g_strcmp0 (f->code, "solve-failed") == 0)
        return f;
    }
  return NULL;
}

static void
pl_window_update_indicator (PlWindow *self)
{
  PlResults *fast = pl_solve_scheduler_get_fast_results (self->scheduler);
  PlResults *full = pl_solve_scheduler_get_full_results (self->scheduler);
  guint64 rev = pl_document_get_revision (self->doc);
  const PlFinding *failure = NULL;
  PlSolveState state;

  if (fast == NULL || pl_document_get_n_parts (self->doc) == 0)
    state = PL_SOLVE_STATE_NONE;
  else if (pl_results_get_revision (fast) != rev)
    state = PL_SOLVE_STATE_STALE;
  else if ((failure = pl_window_failure (fast)) != NULL)
    state = PL_SOLVE_STATE_ERROR;
  else if (pl_results_get_transient_state (fast) == PL_TRANSIENT_SKIPPED)
    state = PL_SOLVE_STATE_FRESH;
  else if (full != NULL && pl_results_get_revision (full) == rev)
    state = (failure = pl_window_failure (full)) != NULL ? PL_SOLVE_STATE_ERROR
                                                         : PL_SOLVE_STATE_FRESH;
  else if (pl_solve_scheduler_get_busy (self->scheduler))
    state = PL_SOLVE_STATE_SOLVING;
  else
    state = PL_SOLVE_STATE_STALE;
  pl_solve_indicator_set_state (self->indicator, state,
                                failure != NULL ? failure->message : NULL);
}

/* Whether b holds the same solution as a: the same compiled network (a
 * re-tagged snapshot shares it) and the same transient state. */
static gboolean
pl_window_same_solution (PlResults *a, PlResults *b)
{
  if (a == NULL || b == NULL)
    return a == b;
  return pl_results_get_compiled (a) == pl_results_get_compiled (b)
         && pl_results_get_transient_state (a) == pl_results_get_transient_state (b);
}

static void
pl_window_push_results (PlWindow *self)
{
  PlResults *fast = pl_solve_scheduler_get_fast_results (self->scheduler);
  PlResults *full = pl_solve_scheduler_get_full_results (self->scheduler);
  PlResults *shown;
  gboolean stale = FALSE;

  pl_canvas_set_results (self->canvas, fast, full);
  shown = pl_canvas_get_shown_results (self->canvas, &stale);
  pl_inspector_set_results (self->inspector, shown, stale);
  pl_window_update_indicator (self);

  /* The results panel updates itself once a frame, only its visible page
   * and only the rows on screen; it is not told at all of a snapshot that
   * only changed its revision (a move re-tags the same solution). */
  if (pl_window_same_solution (self->panel_fast, fast)
      && pl_window_same_solution (self->panel_full, full) && self->panel_stale == stale)
    return;
  /* References, so that the networks compared above stay alive and a new
   * one cannot reuse an old one's address. */
  g_clear_pointer (&self->panel_fast, pl_results_unref);
  g_clear_pointer (&self->panel_full, pl_results_unref);
  self->panel_fast = fast != NULL ? pl_results_ref (fast) : NULL;
  self->panel_full = full != NULL ? pl_results_ref (full) : NULL;
  self->panel_stale = stale;
  pl_results_panel_set_results (self->results_panel, fast, full, stale);
}

static void
pl_window_results_cb (PlSolveScheduler *scheduler,
                      PlResults        *results,
                      gpointer          user_data)
{
  pl_window_push_results (PL_WINDOW (user_data));
}

static void
pl_window_busy_cb (GObject    *object,
                   GParamSpec *pspec,
                   gpointer    user_data)
{
  pl_window_update_indicator (PL_WINDOW (user_data));
}

static void
pl_window_undo_notify_cb (GObject    *object,
                          GParamSpec *pspec,
                          gpointer    user_data)
{
  PlWindow *self = PL_WINDOW (user_data);

  pl_window_update_title (self);
  pl_window_update_actions (self);
}

/* --- selection and panels --- */

static void
pl_window_selection_changed_cb (PlCanvas *canvas,
                                gpointer  user_data)
{
  PlWindow *self = PL_WINDOW (user_data);
  g_auto (GStrv) ids = pl_canvas_get_selection (canvas);
  g_autoptr (GPtrArray) parts = g_ptr_array_new ();

  /* The inspector edits parts; a selected wire alone shows the scenario. */
  for (guint i = 0; ids[i] != NULL; i++)
    if (self->doc != NULL && pl_document_find_part (self->doc, ids[i]) != NULL)
      g_ptr_array_add (parts, ids[i]);
  g_ptr_array_add (parts, NULL);
  pl_inspector_set_selection (self->inspector, (const char *const *) parts->pdata);
  pl_window_update_actions (self);
}

static void
pl_window_part_activated_cb (PlResultsPanel *panel,
                             const char     *part_id,
                             gpointer        user_data)
{
  PlWindow *self = PL_WINDOW (user_data);
  const char *ids[] = { part_id, NULL };

  pl_canvas_select (self->canvas, ids);
  gtk_widget_grab_focus (GTK_WIDGET (self->canvas));
}

static void
pl_window_type_armed_cb (PlShelf    *shelf,
                         const char *type_key,
                         gpointer    user_data)
{
  PlWindow *self = PL_WINDOW (user_data);

  pl_canvas_arm_type (self->canvas, type_key);
  if (type_key != NULL)
    gtk_widget_grab_focus (GTK_WIDGET (self->canvas));
}

static void
pl_window_armed_changed_cb (PlCanvas *canvas,
                            gpointer  user_data)
{
  PlWindow *self = PL_WINDOW (user_data);

  pl_shelf_arm (self->shelf, pl_canvas_get_armed_type (canvas));
}

static gboolean
pl_window_toast_timeout_cb (gpointer user_data)
{
  PlWindow *self = PL_WINDOW (user_data);

  self->toast_id = 0;
  gtk_revealer_set_reveal_child (self->toast_revealer, FALSE);
  gtk_label_set_text (self->toast_label, "");
  return G_SOURCE_REMOVE;
}

static void
pl_window_canvas_message_cb (PlCanvas   *canvas,
                             const char *text,
                             gpointer    user_data)
{
  pl_window_show_toast (PL_WINDOW (user_data), text);
}

static void
pl_window_units_changed_cb (GSettings  *settings,
                            const char *key,
                            gpointer    user_data)
{
  PlWindow *self = PL_WINDOW (user_data);
  g_auto (GStrv) ids = NULL;

  pl_unit_prefs_init (&self->units, g_settings_get_enum (settings, "units-system"));
  pl_canvas_set_units (self->canvas, &self->units);
  /* The inspector's context carries the units; it clears its selection,
   * so put the selection back. */
  pl_inspector_set_context (self->inspector, self->doc, self->undo, &self->units);
  pl_results_panel_set_context (self->results_panel, self->doc, &self->units);
  pl_window_selection_changed_cb (self->canvas, self);
  pl_window_push_results (self);
}

static void
pl_window_recent_changed_cb (GSettings  *settings,
                             const char *key,
                             gpointer    user_data)
{
  pl_file_ops_rebuild_recent (PL_WINDOW (user_data));
}

/* --- GtkWindow --- */

static void
pl_window_close_confirmed (PlWindow *self,
                           gpointer  data)
{
  self->close_confirmed = TRUE;
  gtk_window_close (GTK_WINDOW (self));
}

static gboolean
pl_window_close_request (GtkWindow *window)
{
  PlWindow *self = PL_WINDOW (window);

  if (!self->close_confirmed && pl_window_get_dirty (self))
    {
      if (!self->in_dialog)
        pl_file_ops_confirm_discard (self, pl_window_close_confirmed, NULL, NULL);
      return TRUE;
    }
  pl_window_save_size (self);
  if (self->scheduler != NULL)
    pl_solve_scheduler_cancel (self->scheduler);
  return GTK_WINDOW_CLASS (pl_window_parent_class)->close_request (window);
}

static void
pl_window_drop_document (PlWindow *self)
{
  if (self->scheduler != NULL)
    {
      pl_solve_scheduler_cancel (self->scheduler);
      g_clear_signal_handler (&self->fast_id, self->scheduler);
      g_clear_signal_handler (&self->full_id, self->scheduler);
      g_clear_signal_handler (&self->busy_id, self->scheduler);
    }
  if (self->undo != NULL)
    {
      g_clear_signal_handler (&self->clean_id, self->undo);
      g_clear_signal_handler (&self->can_undo_id, self->undo);
      g_clear_signal_handler (&self->can_redo_id, self->undo);
      g_clear_signal_handler (&self->undo_label_id, self->undo);
      g_clear_signal_handler (&self->redo_label_id, self->undo);
    }
  g_clear_object (&self->scheduler);
  g_clear_object (&self->undo);
  g_clear_object (&self->doc);
}

static void
pl_window_dispose (GObject *object)
{
  PlWindow *self = PL_WINDOW (object);

  g_clear_handle_id (&self->toast_id, g_source_remove);
  g_clear_pointer (&self->panel_fast, pl_results_unref);
  g_clear_pointer (&self->panel_full, pl_results_unref);
  if (self->settings != NULL)
    {
      g_clear_signal_handler (&self->units_changed_id, self->settings);
      g_clear_signal_handler (&self->recent_changed_id, self->settings);
    }
  /* The children outlive this call by a little (the template disposes
   * them below): they must not call back into a half-disposed window. */
  if (self->canvas != NULL)
    {
      g_signal_handlers_disconnect_by_data (self->canvas, self);
      pl_canvas_set_document (self->canvas, NULL, NULL);
    }
  if (self->shelf != NULL)
    g_signal_handlers_disconnect_by_data (self->shelf, self);
  if (self->results_panel != NULL)
    g_signal_handlers_disconnect_by_data (self->results_panel, self);
  if (self->inspector != NULL)
    pl_inspector_set_context (self->inspector, NULL, NULL, NULL);
  if (self->results_panel != NULL)
    {
      pl_results_panel_set_results (self->results_panel, NULL, NULL, FALSE);
      pl_results_panel_set_context (self->results_panel, NULL, NULL);
    }
  pl_window_drop_document (self);
  g_clear_object (&self->file);
  gtk_widget_dispose_template (GTK_WIDGET (self), PL_TYPE_WINDOW);
  G_OBJECT_CLASS (pl_window_parent_class)->dispose (object);
}

static void
pl_window_class_init (PlWindowClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);
  GtkWindowClass *window_class = GTK_WINDOW_CLASS (klass);

  object_class->dispose = pl_window_dispose;
  window_class->close_request = pl_window_close_request;

  g_type_ensure (PL_TYPE_CANVAS);
  g_type_ensure (PL_TYPE_SHELF);
  g_type_ensure (PL_TYPE_SOLVE_INDICATOR);
  g_type_ensure (PL_TYPE_INSPECTOR);
  g_type_ensure (PL_TYPE_RESULTS_PANEL);

  gtk_widget_class_set_template_from_resource (widget_class,
                                               "/org/pressline/Pressline/pl-window.ui");
  gtk_widget_class_bind_template_child (widget_class, PlWindow, indicator);
  gtk_widget_class_bind_template_child (widget_class, PlWindow, shelf);
  gtk_widget_class_bind_template_child (widget_class, PlWindow, canvas);
  gtk_widget_class_bind_template_child (widget_class, PlWindow, inspector);
  gtk_widget_class_bind_template_child (widget_class, PlWindow, results_panel);
  gtk_widget_class_bind_template_child (widget_class, PlWindow, toast_revealer);
  gtk_widget_class_bind_template_child (widget_class, PlWindow, toast_label);
  gtk_widget_class_bind_template_child (widget_class, PlWindow, recent_section);
  gtk_widget_class_bind_template_child (widget_class, PlWindow, undo_button);
  gtk_widget_class_bind_template_child (widget_class, PlWindow, redo_button);

  pl_window_class_install_actions (widget_class);
}

static void
pl_window_init (PlWindow *self)
{
  g_autoptr (PlDocument) doc = NULL;

  gtk_widget_init_template (GTK_WIDGET (self));
  pl_unit_prefs_init (&self->units, PL_UNIT_SYSTEM_SI);

  g_signal_connect (self->canvas, "selection-changed",
                    G_CALLBACK (pl_window_selection_changed_cb), self);
  g_signal_connect (self->canvas, "armed-changed", G_CALLBACK (pl_window_armed_changed_cb),
                    self);
  g_signal_connect (self->canvas, "message", G_CALLBACK (pl_window_canvas_message_cb), self);
  g_signal_connect (self->shelf, "type-armed", G_CALLBACK (pl_window_type_armed_cb), self);
  g_signal_connect (self->results_panel, "part-activated",
                    G_CALLBACK (pl_window_part_activated_cb), self);
  pl_window_add_canvas_shortcuts (self);
  /* Keys like R and Delete act on the drawing from the start. */
  gtk_window_set_focus (GTK_WINDOW (self), GTK_WIDGET (self->canvas));

  doc = pl_document_new ();
  pl_window_set_document (self, doc, NULL);
}

/* --- shared with the companions --- */

void
pl_window_set_document (PlWindow   *self,
                        PlDocument *doc,
                        GFile      *file)
{
  g_return_if_fail (PL_IS_WINDOW (self));
  g_return_if_fail (PL_IS_DOCUMENT (doc));

  pl_window_drop_document (self);
  self->doc = g_object_ref (doc);
  self->undo = pl_undo_stack_new (doc);
  if (file != self->file)
    {
      g_clear_object (&self->file);
      self->file = file != NULL ? g_object_ref (file) : NULL;
    }
  self->clean_id = g_signal_connect (self->undo, "notify::clean",
                                     G_CALLBACK (pl_window_undo_notify_cb), self);
  self->can_undo_id = g_signal_connect (self->undo, "notify::can-undo",
                                        G_CALLBACK (pl_window_undo_notify_cb), self);
  self->can_redo_id = g_signal_connect (self->undo, "notify::can-redo",
                                        G_CALLBACK (pl_window_undo_notify_cb), self);
  self->undo_label_id = g_signal_connect (self->undo, "notify::undo-label",
                                          G_CALLBACK (pl_window_undo_notify_cb), self);
  self->redo_label_id = g_signal_connect (self->undo, "notify::redo-label",
                                          G_CALLBACK (pl_window_undo_notify_cb), self);

  /* The canvas and the panels connect to "changed" before the scheduler,
   * but the scheduler's "fast-results" arrives within the same emission:
   * the canvas then picks the new snapshot. */
  pl_canvas_set_document (self->canvas, doc, self->undo);
  pl_inspector_set_context (self->inspector, doc, self->undo, &self->units);
  pl_results_panel_set_context (self->results_panel, doc, &self->units);
  self->scheduler = pl_solve_scheduler_new (doc);
  self->fast_id = g_signal_connect (self->scheduler, "fast-results",
                                    G_CALLBACK (pl_window_results_cb), self);
  self->full_id = g_signal_connect (self->scheduler, "full-results",
                                    G_CALLBACK (pl_window_results_cb), self);
  self->busy_id = g_signal_connect (self->scheduler, "notify::busy",
                                    G_CALLBACK (pl_window_busy_cb), self);
  g_clear_pointer (&self->panel_fast, pl_results_unref);
  g_clear_pointer (&self->panel_full, pl_results_unref);
  pl_window_push_results (self);
  pl_window_update_title (self);
  pl_window_update_actions (self);
}

void
pl_window_update_title (PlWindow *self)
{
  g_autofree char *name = NULL;
  g_autofree char *title = NULL;

  if (self->file != NULL)
    {
      g_autofree char *path = g_file_get_path (self->file);
      name = path != NULL ? g_filename_display_basename (path)
                          : g_file_get_basename (self->file);
    }
  else
    name = g_strdup (_("Untitled layout"));
  /* A leading bullet marks unsaved changes; "—" parts file from program. */
  title = g_strdup_printf (pl_window_get_dirty (self) ? _("• %s — Pressline")
                                                     : _("%s — Pressline"),
                           name);
  gtk_window_set_title (GTK_WINDOW (self), title);
}

void
pl_window_show_toast (PlWindow   *self,
                      const char *text)
{
  g_return_if_fail (PL_IS_WINDOW (self));

  gtk_label_set_text (self->toast_label, text != NULL ? text : "");
  gtk_revealer_set_reveal_child (self->toast_revealer, text != NULL && *text != '\0');
  g_clear_handle_id (&self->toast_id, g_source_remove);
  self->toast_id = g_timeout_add_seconds (TOAST_SECONDS, pl_window_toast_timeout_cb, self);
}

/* --- public --- */

PlWindow *
pl_window_new (PlApplication *app)
{
  PlWindow *self;
  g_autoptr (GAction) units_action = NULL;

  g_return_val_if_fail (PL_IS_APPLICATION (app), NULL);

  self = g_object_new (PL_TYPE_WINDOW, "application", app, NULL);
  /* "application" is not a construct property, so the settings are only
   * reachable once g_object_new has returned. */
  pl_window_restore_size (self);
  self->settings = pl_window_settings (self);
  if (self->settings != NULL)
    {
      units_action = g_settings_create_action (self->settings, "units-system");
      g_action_map_add_action (G_ACTION_MAP (self), units_action);
      self->units_changed_id = g_signal_connect (self->settings, "changed::units-system",
                                                 G_CALLBACK (pl_window_units_changed_cb),
                                                 self);
      self->recent_changed_id = g_signal_connect (self->settings, "changed::recent-files",
                                                  G_CALLBACK (pl_window_recent_changed_cb),
                                                  self);
      pl_window_units_changed_cb (self->settings, "units-system", self);
      pl_file_ops_rebuild_recent (self);
    }
  return self;
}

gboolean
pl_window_load_file (PlWindow  *self,
                     GFile     *file,
                     GError   **error)
{
  g_autofree char *path = NULL;
  g_autoptr (PlDocument) doc = NULL;

  g_return_val_if_fail (PL_IS_WINDOW (self), FALSE);
  g_return_val_if_fail (G_IS_FILE (file), FALSE);

  path = g_file_get_path (file);
  if (path == NULL)
    {
      g_autofree char *uri = g_file_get_uri (file);
      g_set_error (error, PL_LAYOUT_ERROR, PL_LAYOUT_ERROR_IO,
                   _("%s: only files on this computer can be opened."), uri);
      return FALSE;
    }
  doc = pl_layout_read_file (path, error);
  if (doc == NULL)
    return FALSE;
  pl_window_set_document (self, doc, file);
  pl_file_ops_add_recent (self, file);
  return TRUE;
}

void
pl_window_open_file (PlWindow *self,
                     GFile    *file)
{
  g_autoptr (GError) error = NULL;

  g_return_if_fail (PL_IS_WINDOW (self));
  g_return_if_fail (G_IS_FILE (file));

  if (!pl_window_load_file (self, file, &error))
    pl_file_ops_show_error (self, _("The layout could not be opened"), error->message);
}

gboolean
pl_window_save_to_file (PlWindow  *self,
                        GFile     *file,
                        GError   **error)
{
  g_autofree char *path = NULL;

  g_return_val_if_fail (PL_IS_WINDOW (self), FALSE);
  g_return_val_if_fail (G_IS_FILE (file), FALSE);

  path = g_file_get_path (file);
  if (path == NULL)
    {
      g_autofree char *uri = g_file_get_uri (file);
      g_set_error (error, PL_LAYOUT_ERROR, PL_LAYOUT_ERROR_IO,
                   _("%s: only files on this computer can be saved."), uri);
      return FALSE;
    }
  if (!pl_layout_write_file (self->doc, path, error))
    return FALSE;
  if (self->file == NULL || !g_file_equal (self->file, file))
    {
      g_clear_object (&self->file);
      self->file = g_object_ref (file);
    }
  pl_undo_stack_mark_clean (self->undo);
  pl_file_ops_add_recent (self, file);
  pl_window_update_title (self);
  return TRUE;
}

PlDocument *
pl_window_get_document (PlWindow *self)
{
  g_return_val_if_fail (PL_IS_WINDOW (self), NULL);
  return self->doc;
}

PlUndoStack *
pl_window_get_undo_stack (PlWindow *self)
{
  g_return_val_if_fail (PL_IS_WINDOW (self), NULL);
  return self->undo;
}

PlSolveScheduler *
pl_window_get_scheduler (PlWindow *self)
{
  g_return_val_if_fail (PL_IS_WINDOW (self), NULL);
  return self->scheduler;
}

GFile *
pl_window_get_file (PlWindow *self)
{
  g_return_val_if_fail (PL_IS_WINDOW (self), NULL);
  return self->file;
}

gboolean
pl_window_get_dirty (PlWindow *self)
{
  g_return_val_if_fail (PL_IS_WINDOW (self), FALSE);
  return self->undo != NULL && !pl_undo_stack_is_clean (self->undo);
}

GtkWidget *
pl_window_get_canvas (PlWindow *self)
{
  g_return_val_if_fail (PL_IS_WINDOW (self), NULL);
  return GTK_WIDGET (self->canvas);
}

GtkWidget *
pl_window_get_shelf (PlWindow *self)
{
  g_return_val_if_fail (PL_IS_WINDOW (self), NULL);
  return GTK_WIDGET (self->shelf);
}

GtkWidget *
pl_window_get_inspector (PlWindow *self)
{
  g_return_val_if_fail (PL_IS_WINDOW (self), NULL);
  return GTK_WIDGET (self->inspector);
}

GtkWidget *
pl_window_get_results_panel (PlWindow *self)
{
  g_return_val_if_fail (PL_IS_WINDOW (self), NULL);
  return GTK_WIDGET (self->results_panel);
}

GtkWidget *
pl_window_get_indicator (PlWindow *self)
{
  g_return_val_if_fail (PL_IS_WINDOW (self), NULL);
  return GTK_WIDGET (self->indicator);
}

const char *
pl_window_get_toast (PlWindow *self)
{
  g_return_val_if_fail (PL_IS_WINDOW (self), NULL);
  return gtk_label_get_text (self->toast_label);
}
