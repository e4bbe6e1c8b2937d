/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-window-private.h: what pl-window.c shares with its companions
 * pl-window-actions.c, pl-file-ops.c, pl-export-dialog.c and pl-print.c.
 * Not for other files.
 */
#pragma once

#include "pl-window.h"

#include "pl-canvas.h"
#include "pl-document.h"
#include "pl-inspector.h"
#include "pl-results-panel.h"
#include "pl-shelf.h"
#include "pl-solve-indicator.h"
#include "pl-solve-scheduler.h"
#include "pl-undo-stack.h"
#include "pl-units.h"

G_BEGIN_DECLS

/* The most recent files the menu keeps. */
#define PL_RECENT_MAX 10

struct _PlWindow
{
  GtkApplicationWindow parent_instance;

  /* template */
  PlSolveIndicator *indicator;
  PlShelf *shelf;
  PlCanvas *canvas;
  PlInspector *inspector;
  PlResultsPanel *results_panel;
  GtkRevealer *toast_revealer;
  GtkLabel *toast_label;
  GMenu *recent_section;
  GtkWidget *undo_button;
  GtkWidget *redo_button;

  /* the document and what watches it */
  PlDocument *doc;
  PlUndoStack *undo;
  PlSolveScheduler *scheduler;
  GFile *file;
  gulong fast_id, full_id, busy_id, clean_id, can_undo_id, can_redo_id;
  gulong undo_label_id, redo_label_id;

  PlUnitPrefs units;
  GSettings *settings;      /* borrowed from the application */
  gulong units_changed_id, recent_changed_id;
  guint toast_id;
  /* What the results panel was last given (references). */
  PlResults *panel_fast;
  PlResults *panel_full;
  gboolean panel_stale;
  gboolean close_confirmed;
  gboolean in_dialog;       /* a confirm or chooser is up */
};

/* A step to take once unsaved changes are saved or discarded. */
typedef void (*PlWindowThen) (PlWindow *self, gpointer data);

/* pl-window.c */
void pl_window_set_document (PlWindow *self, PlDocument *doc, GFile *file);
void pl_window_update_title (PlWindow *self);
void pl_window_show_toast (PlWindow *self, const char *text);

/* pl-window-actions.c */
void pl_window_class_install_actions (GtkWidgetClass *widget_class);
void pl_window_add_canvas_shortcuts (PlWindow *self);
void pl_window_update_actions (PlWindow *self);
/* The accelerators of window actions, set once by the application. */
void pl_window_set_accels (GtkApplication *app);

/* pl-file-ops.c */
void pl_file_ops_new (PlWindow *self);
void pl_file_ops_open (PlWindow *self);
void pl_file_ops_open_uri (PlWindow *self, const char *uri);
void pl_file_ops_save (PlWindow *self);
void pl_file_ops_save_as (PlWindow *self);
/* Runs then at once when the document is clean, else after the user chose
 * to save (and the save worked) or to discard; never if they cancelled.
 * data is freed with destroy either way. */
void pl_file_ops_confirm_discard (PlWindow *self, PlWindowThen then, gpointer data,
                                  GDestroyNotify destroy);
void pl_file_ops_add_recent (PlWindow *self, GFile *file);
void pl_file_ops_rebuild_recent (PlWindow *self);
void pl_file_ops_show_error (PlWindow *self, const char *primary, const char *secondary);

G_END_DECLS
