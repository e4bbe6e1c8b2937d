/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * test-editor: the main window driven through its widgets' APIs and
 * actions under Xvfb: samples open, a part added from the shelf and wired,
 * a hose bore changed and the far applicator's pressure following, undo,
 * a malformed file refused with the document kept, save as and reload,
 * drags, clipboard, and screenshots (light and dark, normal and high
 * zoom) written as artifacts.  Timings are printed as figures, never
 * asserted (a shared CI machine has no stable clock).
 */

#include "config.h"

#include <glib/gstdio.h>
#include <gtk/gtk.h>
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "pl-application.h"
#include "pl-canvas.h"
#include "pl-check.h"
#include "pl-ui-test.h"
#include "pl-command.h"
#include "pl-geometry.h"
#include "pl-layout-reader.h"
#include "pl-layout-writer.h"
#include "pl-shelf.h"
#include "pl-solve-indicator.h"
#include "pl-window.h"

static void
app_setup (void)
{
  /* Frame statistics of the canvas (read when a canvas is made). */
  g_setenv ("PRESSLINE_FRAME_STATS", "1", TRUE);
  pl_ui_test_app_setup ();
}

static char *
source_path (const char *relative)
{
  const char *root = g_getenv ("PRESSLINE_SOURCE_ROOT");

  ck_assert_msg (root != NULL, "PRESSLINE_SOURCE_ROOT is not set");
  return g_build_filename (root, relative, NULL);
}

static void
close_window (PlWindow *window)
{
  /* Tests end with clean or deliberately discarded documents: mark clean
   * so close does not ask. */
  pl_undo_stack_mark_clean (pl_window_get_undo_stack (window));
  gtk_window_destroy (GTK_WINDOW (window));
  pl_ui_test_spin (10);
}

static PlCanvas *
canvas_of (PlWindow *window)
{
  return PL_CANVAS (pl_window_get_canvas (window));
}

static const char *
id_of_tag (PlWindow *window, const char *tag)
{
  const PlPart *part = pl_document_find_part_by_tag (pl_window_get_document (window), tag);

  ck_assert_msg (part != NULL, "no part %s", tag);
  return pl_part_get_id (part);
}

static void
port_on_screen (PlWindow *window, const char *part_id, const char *port, PlPoint *out)
{
  const PlPart *part = pl_document_find_part (pl_window_get_document (window), part_id);
  PlPoint w;

  ck_assert (part != NULL);
  ck_assert (pl_part_get_port_position (part, port, &w));
  pl_viewport_world_to_screen (pl_canvas_get_viewport (canvas_of (window)), w, out);
}

static void
world_to_screen (PlWindow *window, PlPoint w, PlPoint *out)
{
  pl_viewport_world_to_screen (pl_canvas_get_viewport (canvas_of (window)), w, out);
}

static double
port_pressure (PlWindow *window, const char *part_id, const char *port, PlPressureKind kind)
{
  gboolean stale = TRUE;
  PlResults *results = pl_canvas_get_shown_results (canvas_of (window), &stale);
  double p = NAN;

  ck_assert_ptr_nonnull (results);
  ck_assert_msg (!stale, "the canvas shows stale results");
  ck_assert_uint_eq (pl_results_get_revision (results),
                     pl_document_get_revision (pl_window_get_document (window)));
  ck_assert (pl_results_get_port_pressure (results, part_id, port, kind, &p));
  return p;
}

static void
activate (PlWindow *window, const char *action)
{
  ck_assert_msg (gtk_widget_activate_action (GTK_WIDGET (window), action, NULL),
                 "no action %s", action);
  pl_ui_test_spin (5);
}

/* --- samples --- */

static const char *const samples[] = {
  "samples/demo-glue-line.pline",
  "samples/carton-sealer-starved.pline",
  "samples/carton-sealer-retrofit.pline",
};

START_TEST (test_open_sample)
{
  PlWindow *window = pl_ui_test_open_window (app, samples[_i]);
  PlDocument *doc = pl_window_get_document (window);
  g_autofree char *base = g_path_get_basename (samples[_i]);
  g_autofree char *title = g_strdup_printf ("%s — Pressline", base);
  PlSolveIndicator *indicator = PL_SOLVE_INDICATOR (pl_window_get_indicator (window));
  gboolean stale = TRUE;
  PlSolveState state;

  ck_assert_uint_gt (pl_document_get_n_parts (doc), 5);
  ck_assert_str_eq (gtk_window_get_title (GTK_WINDOW (window)), title);
  ck_assert (!pl_window_get_dirty (window));
  ck_assert_ptr_nonnull (pl_canvas_get_shown_results (canvas_of (window), &stale));
  ck_assert (!stale);
  ck_assert_uint_gt (pl_canvas_get_n_draws (canvas_of (window)), 0);
  /* The view was fitted: every part lies on screen. */
  for (guint i = 0; i < pl_document_get_n_parts (doc); i++)
    {
      const PlPart *part = pl_document_get_part (doc, i);
      PlPoint w = { pl_part_get_x (part), pl_part_get_y (part) }, s;
      const PlViewport *vp = pl_canvas_get_viewport (canvas_of (window));
      world_to_screen (window, w, &s);
      ck_assert_msg (s.x >= 0 && s.x <= vp->width && s.y >= 0 && s.y <= vp->height,
                     "%s off screen", pl_part_get_tag (part));
    }
  pl_ui_test_wait_for_full (window);
  pl_ui_test_spin (20);
  state = pl_solve_indicator_get_state (indicator);
  ck_assert_msg (state == PL_SOLVE_STATE_FRESH || state == PL_SOLVE_STATE_ERROR,
                 "indicator says %s", pl_solve_indicator_get_text (indicator));
  close_window (window);
}
END_TEST

/* --- shelf, wire, bore, undo --- */

START_TEST (test_shelf_wire_bore_undo)
{
  PlWindow *window = pl_ui_test_open_window (app, "samples/carton-sealer-starved.pline");
  PlDocument *doc = pl_window_get_document (window);
  PlCanvas *canvas = canvas_of (window);
  PlShelf *shelf = PL_SHELF (pl_window_get_shelf (window));
  PlUndoStack *undo = pl_window_get_undo_stack (window);
  guint n_parts = pl_document_get_n_parts (doc), n_wires = pl_document_get_n_wires (doc);
  const char *hose = id_of_tag (window, "H1");
  g_autofree char *far = g_strdup (id_of_tag (window, "N4"));
  g_autofree char *gauge = NULL;
  g_auto (GStrv) sel = NULL;
  PlRect box;
  PlPoint where, s, from, to;
  double before, after, undone, gauge_p;
  guint draws;
  gint64 t0, t1;

  ck_assert_uint_eq (pl_shelf_get_n_entries (shelf), pl_part_type_get_n_placeable ());
  /* Click the gauge entry, then click on the drawing below the layout. */
  ck_assert (pl_shelf_arm (shelf, "gauge"));
  ck_assert_str_eq (pl_canvas_get_armed_type (canvas), "gauge");
  ck_assert (pl_geometry_document_bounds (doc, &box));
  where.x = box.x0 + 60;
  where.y = box.y1 - 5;
  world_to_screen (window, where, &s);
  pl_canvas_pointer_press (canvas, s.x, s.y, 0);
  pl_canvas_pointer_release (canvas, s.x, s.y);
  pl_ui_test_spin (5);
  ck_assert_uint_eq (pl_document_get_n_parts (doc), n_parts + 1);
  ck_assert_ptr_null (pl_canvas_get_armed_type (canvas));
  ck_assert_ptr_null (pl_shelf_get_armed (shelf));
  sel = pl_canvas_get_selection (canvas);
  ck_assert_uint_eq (g_strv_length (sel), 1);
  gauge = g_strdup (sel[0]);
  ck_assert_str_eq (pl_part_get_part_type (pl_document_find_part (doc, gauge))->key,
                    "gauge");
  /* Snapped to the grid. */
  ck_assert_double_eq (fmod (pl_part_get_x (pl_document_find_part (doc, gauge)),
                             PL_GRID_SNAP_MM), 0.0);
  ck_assert (pl_window_get_dirty (window));
  ck_assert (g_str_has_prefix (gtk_window_get_title (GTK_WINDOW (window)), "•"));

  /* Drag a wire from the gauge's port to the far applicator's inlet. */
  port_on_screen (window, gauge, "p", &from);
  port_on_screen (window, far, "in", &to);
  pl_canvas_pointer_press (canvas, from.x, from.y, 0);
  pl_canvas_pointer_motion (canvas, (from.x + to.x) / 2, (from.y + to.y) / 2);
  pl_canvas_pointer_motion (canvas, to.x, to.y);
  pl_canvas_pointer_release (canvas, to.x, to.y);
  pl_ui_test_spin (5);
  ck_assert_uint_eq (pl_document_get_n_wires (doc), n_wires + 1);
  /* The gauge reads the applicator's pressure now. */
  gauge_p = port_pressure (window, gauge, "p", PL_PRESSURE_STEADY_OPEN);
  ck_assert_double_eq_tol (gauge_p, port_pressure (window, far, "in",
                                                   PL_PRESSURE_STEADY_OPEN), 1e-6);

  /* Widen the supply hose: the far applicator's pressure must rise. */
  before = port_pressure (window, far, "in", PL_PRESSURE_STEADY_OPEN);
  draws = pl_canvas_get_n_draws (canvas);
  {
    g_autoptr (PlCommand) cmd = pl_command_new_set_number (
      hose, "bore", pl_part_get_number (pl_document_find_part (doc, hose), "bore") * 1.5);
    t0 = g_get_monotonic_time ();
    ck_assert (pl_undo_stack_push (undo, cmd, NULL));
    t1 = g_get_monotonic_time ();
  }
  printf ("figure: edit (hose bore) to fresh fast results, carton-sealer-starved: "
          "%.3f ms\n", (t1 - t0) / 1000.0);
  after = port_pressure (window, far, "in", PL_PRESSURE_STEADY_OPEN);
  ck_assert_msg (after > before + 1000.0, "far applicator: %g Pa -> %g Pa", before, after);
  pl_ui_test_spin (50);
  ck_assert_uint_gt (pl_canvas_get_n_draws (canvas), draws);

  /* Undo gives back the previous result exactly (the same solve of the
   * same network, so bit for bit). */
  activate (window, "win.undo");
  undone = port_pressure (window, far, "in", PL_PRESSURE_STEADY_OPEN);
  ck_assert_double_eq (undone, before);
  activate (window, "win.redo");
  ck_assert_double_eq (port_pressure (window, far, "in", PL_PRESSURE_STEADY_OPEN), after);
  close_window (window);
}
END_TEST

START_TEST (test_wire_refused)
{
  PlWindow *window = pl_ui_test_open_window (app, "samples/demo-glue-line.pline");
  PlDocument *doc = pl_window_get_document (window);
  PlCanvas *canvas = canvas_of (window);
  guint n_wires;
  g_autofree char *tee = NULL;
  PlPoint from, to, where;
  PlRect box;

  /* A tee of its own below the drawing, so no other port shares its
   * ports' places. */
  ck_assert (pl_geometry_document_bounds (doc, &box));
  where.x = box.x0;
  where.y = box.y1 + 60;
  tee = pl_canvas_place_part (canvas, "tee", where);
  ck_assert_ptr_nonnull (tee);
  pl_undo_stack_mark_clean (pl_window_get_undo_stack (window));
  n_wires = pl_document_get_n_wires (doc);

  /* From one port of a tee to another port of the same tee. */
  port_on_screen (window, tee, "a", &from);
  port_on_screen (window, tee, "b", &to);
  pl_canvas_pointer_press (canvas, from.x, from.y, 0);
  pl_canvas_pointer_motion (canvas, to.x, to.y);
  pl_canvas_pointer_release (canvas, to.x, to.y);
  pl_ui_test_spin (5);
  ck_assert_uint_eq (pl_document_get_n_wires (doc), n_wires);
  ck_assert_msg (strstr (pl_window_get_toast (window), "two different parts") != NULL,
                 "toast: %s", pl_window_get_toast (window));
  ck_assert (!pl_window_get_dirty (window));
  close_window (window);
}
END_TEST

/* The button under widget that runs action, or NULL. */
static GtkWidget *
button_for_action (GtkWidget *widget, const char *action)
{
  if (GTK_IS_BUTTON (widget)
      && g_strcmp0 (gtk_actionable_get_action_name (GTK_ACTIONABLE (widget)), action) == 0)
    return widget;
  for (GtkWidget *c = gtk_widget_get_first_child (widget); c != NULL;
       c = gtk_widget_get_next_sibling (c))
    {
      GtkWidget *found = button_for_action (c, action);

      if (found != NULL)
        return found;
    }
  return NULL;
}

/* Undo and redo name the step and its parts in their tooltips, and follow
 * each change: one part by its tag on the canvas, several by their count. */
START_TEST (test_undo_tooltips_name_the_step)
{
  PlWindow *window = pl_ui_test_open_window (app, "samples/demo-glue-line.pline");
  PlUndoStack *undo = pl_window_get_undo_stack (window);
  PlDocument *doc = pl_window_get_document (window);
  GtkWidget *undo_button = button_for_action (GTK_WIDGET (window), "win.undo");
  GtkWidget *redo_button = button_for_action (GTK_WIDGET (window), "win.redo");
  const char *hose = id_of_tag (window, "H1");
  const char *three[] = { hose, id_of_tag (window, "H2"), id_of_tag (window, "G1") };
  g_autoptr (PlCommand) bore = pl_command_new_set_number (
    hose, "bore", pl_part_get_number (pl_document_find_part (doc, hose), "bore") * 1.2);
  g_autoptr (PlCommand) move = pl_command_new_move (three, 3, 5.0, 0.0);

  ck_assert_ptr_nonnull (undo_button);
  ck_assert_ptr_nonnull (redo_button);
  ck_assert_str_eq (gtk_widget_get_tooltip_text (undo_button), "Undo (Ctrl+Z)");
  ck_assert (pl_undo_stack_push (undo, bore, NULL));
  ck_assert_str_eq (gtk_widget_get_tooltip_text (undo_button),
                    "Undo Change Bore H1 (Ctrl+Z)");
  ck_assert (pl_undo_stack_push (undo, move, NULL));
  ck_assert_str_eq (gtk_widget_get_tooltip_text (undo_button), "Undo Move 3 Parts (Ctrl+Z)");
  activate (window, "win.undo");
  ck_assert_str_eq (gtk_widget_get_tooltip_text (redo_button),
                    "Redo Move 3 Parts (Shift+Ctrl+Z)");
  ck_assert_str_eq (gtk_widget_get_tooltip_text (undo_button),
                    "Undo Change Bore H1 (Ctrl+Z)");
  close_window (window);
}
END_TEST

/* --- bad files --- */

static const char *const bad_files[] = {
  "tests/data/layouts/bad/unclosed.pline",
  "tests/data/layouts/bad/unknown-type.pline",
  "tests/data/layouts/bad/out-of-range.pline",
  "tests/data/layouts/bad/duplicate-tag.pline",
};

START_TEST (test_bad_file_keeps_document)
{
  PlWindow *window = pl_ui_test_open_window (app, "samples/demo-glue-line.pline");
  PlDocument *doc = pl_window_get_document (window);
  g_autoptr (PlDocument) copy = pl_document_copy (doc);
  g_autofree char *path = source_path (bad_files[_i]);
  g_autoptr (GFile) file = g_file_new_for_path (path);
  g_autoptr (GFile) old_file = g_object_ref (pl_window_get_file (window));
  g_autofree char *title = g_strdup (gtk_window_get_title (GTK_WINDOW (window)));
  g_autoptr (GListModel) toplevels = NULL;
  GtkMessageDialog *dialog = NULL;
  g_autofree char *text = NULL;
  g_autoptr (GRegex) line_re = g_regex_new (":[0-9]+(:[0-9]+)?: ", 0, 0, NULL);

  pl_window_open_file (window, file);
  pl_ui_test_spin (20);
  toplevels = gtk_window_get_toplevels ();
  g_object_ref (toplevels);
  for (guint i = 0; i < g_list_model_get_n_items (toplevels); i++)
    {
      g_autoptr (GObject) w = g_list_model_get_item (toplevels, i);
      if (GTK_IS_MESSAGE_DIALOG (w)
          && gtk_window_get_transient_for (GTK_WINDOW (w)) == GTK_WINDOW (window))
        dialog = GTK_MESSAGE_DIALOG (w);
    }
  ck_assert_msg (dialog != NULL, "no error dialog for %s", bad_files[_i]);
  g_object_get (dialog, "secondary-text", &text, NULL);
  /* The reader's message names the file and the line. */
  ck_assert_msg (strstr (text, path) != NULL, "%s", text);
  ck_assert_msg (g_regex_match (line_re, text, 0, NULL), "no line in: %s", text);
  gtk_window_destroy (GTK_WINDOW (dialog));

  ck_assert_ptr_eq (pl_window_get_document (window), doc);
  ck_assert (pl_document_equal (doc, copy));
  ck_assert (g_file_equal (pl_window_get_file (window), old_file));
  ck_assert_str_eq (gtk_window_get_title (GTK_WINDOW (window)), title);
  close_window (window);
}
END_TEST

/* --- the unsaved-changes prompt and the file chooser --- */

/* The newest toplevel of type that is transient for window, or NULL. */
static GtkWindow *
dialog_of (PlWindow *window, GType type)
{
  g_autoptr (GListModel) toplevels = g_object_ref (gtk_window_get_toplevels ());
  GtkWindow *found = NULL;

  for (guint i = 0; i < g_list_model_get_n_items (toplevels); i++)
    {
      g_autoptr (GObject) w = g_list_model_get_item (toplevels, i);

      if (G_TYPE_CHECK_INSTANCE_TYPE (w, type)
          && gtk_window_get_transient_for (GTK_WINDOW (w)) == GTK_WINDOW (window))
        found = GTK_WINDOW (w);
    }
  return found;
}

static void
make_dirty (PlWindow *window)
{
  g_autoptr (PlCommand) cmd = pl_command_new_set_number (id_of_tag (window, "H1"), "length",
                                                         31.0);

  ck_assert (pl_undo_stack_push (pl_window_get_undo_stack (window), cmd, NULL));
  ck_assert (pl_window_get_dirty (window));
}

/* "New" on a changed layout asks first; Cancel keeps everything, Discard
 * starts afresh, Save writes the file and then starts afresh. */
START_TEST (test_new_asks_before_discarding)
{
  g_autoptr (GError) error = NULL;
  g_autofree char *dir = g_dir_make_tmp ("pressline-prompt-XXXXXX", &error);
  g_autofree char *src = source_path ("samples/demo-glue-line.pline");
  g_autofree char *path = g_build_filename (dir, "prompt.pline", NULL);
  g_autofree char *data = NULL;
  g_autoptr (GFile) file = g_file_new_for_path (path);
  g_autoptr (PlDocument) saved = NULL;
  PlWindow *window = pl_ui_test_open_window (app, NULL);
  PlDocument *doc;
  GtkWindow *prompt;
  gsize len;
  char *text = NULL;
  double length;

  /* A copy of a sample, so that Save has a file of its own to write. */
  ck_assert (g_file_get_contents (src, &data, &len, NULL));
  ck_assert (g_file_set_contents (path, data, (gssize) len, NULL));
  ck_assert (pl_window_load_file (window, file, &error));
  doc = pl_window_get_document (window);
  length = pl_part_get_number (pl_document_find_part_by_tag (doc, "H1"), "length");
  ck_assert_double_ne (length, 31.0);
  make_dirty (window);

  /* Cancel. */
  activate (window, "win.new");
  prompt = dialog_of (window, GTK_TYPE_MESSAGE_DIALOG);
  ck_assert_msg (prompt != NULL, "no prompt before discarding changes");
  g_object_get (prompt, "text", &text, NULL);
  ck_assert_msg (strstr (text, "prompt.pline") != NULL, "%s", text);
  g_free (text);
  gtk_dialog_response (GTK_DIALOG (prompt), GTK_RESPONSE_CANCEL);
  pl_ui_test_spin (10);
  ck_assert_ptr_null (dialog_of (window, GTK_TYPE_MESSAGE_DIALOG));
  ck_assert_ptr_eq (pl_window_get_document (window), doc);
  ck_assert (pl_window_get_dirty (window));

  /* Discard. */
  activate (window, "win.new");
  prompt = dialog_of (window, GTK_TYPE_MESSAGE_DIALOG);
  ck_assert_ptr_nonnull (prompt);
  gtk_dialog_response (GTK_DIALOG (prompt), GTK_RESPONSE_REJECT);
  pl_ui_test_spin (10);
  ck_assert_ptr_ne (pl_window_get_document (window), doc);
  ck_assert_uint_eq (pl_document_get_n_parts (pl_window_get_document (window)), 0);
  ck_assert (!pl_window_get_dirty (window));
  ck_assert_ptr_null (pl_window_get_file (window));
  ck_assert_str_eq (gtk_window_get_title (GTK_WINDOW (window)), "Untitled layout — Pressline");
  /* The file on disk kept what it had. */
  saved = pl_layout_read_file (path, &error);
  ck_assert_msg (saved != NULL, "%s", error ? error->message : "");
  ck_assert_double_eq (pl_part_get_number (pl_document_find_part_by_tag (saved, "H1"),
                                           "length"), length);
  g_clear_object (&saved);

  /* Save first. */
  ck_assert (pl_window_load_file (window, file, &error));
  make_dirty (window);
  activate (window, "win.new");
  prompt = dialog_of (window, GTK_TYPE_MESSAGE_DIALOG);
  ck_assert_ptr_nonnull (prompt);
  gtk_dialog_response (GTK_DIALOG (prompt), GTK_RESPONSE_ACCEPT);
  pl_ui_test_spin (10);
  ck_assert_uint_eq (pl_document_get_n_parts (pl_window_get_document (window)), 0);
  saved = pl_layout_read_file (path, &error);
  ck_assert_msg (saved != NULL, "%s", error ? error->message : "");
  ck_assert_double_eq (pl_part_get_number (pl_document_find_part_by_tag (saved, "H1"),
                                           "length"), 31.0);
  close_window (window);
  g_remove (path);
  g_rmdir (dir);
}
END_TEST

/* Save As through the window's own chooser: a name without the suffix
 * gets it, the file is written, the title and the clean mark follow. */
START_TEST (test_save_as_through_the_chooser)
{
  g_autoptr (GError) error = NULL;
  g_autofree char *dir = g_dir_make_tmp ("pressline-chooser-XXXXXX", &error);
  g_autofree char *path = g_build_filename (dir, "chosen.pline", NULL);
  g_autoptr (GFile) folder = g_file_new_for_path (dir);
  g_autoptr (PlDocument) back = NULL;
  PlWindow *window = pl_ui_test_open_window (app, "samples/demo-glue-line.pline");
  GtkWindow *chooser;

  make_dirty (window);
  activate (window, "win.save-as");
  pl_ui_test_spin (50);
  /* No portal under the test session: GTK's own chooser dialog stands in
   * for the native one. */
  chooser = dialog_of (window, GTK_TYPE_FILE_CHOOSER_DIALOG);
  ck_assert_msg (chooser != NULL, "no file chooser for Save As");
  ck_assert (gtk_file_chooser_set_current_folder (GTK_FILE_CHOOSER (chooser), folder, NULL));
  gtk_file_chooser_set_current_name (GTK_FILE_CHOOSER (chooser), "chosen");
  gtk_dialog_response (GTK_DIALOG (chooser), GTK_RESPONSE_ACCEPT);
  /* The chooser hands on its answer from the main loop, and the window
   * waits for a clean title: up to 5 s. */
  for (int i = 0; i < 500 && pl_window_get_dirty (window); i++)
    pl_ui_test_spin (10);
  ck_assert_msg (g_file_test (path, G_FILE_TEST_EXISTS), "%s not written", path);
  back = pl_layout_read_file (path, &error);
  ck_assert_msg (back != NULL, "%s", error ? error->message : "");
  ck_assert (pl_document_equal (back, pl_window_get_document (window)));
  ck_assert (!pl_window_get_dirty (window));
  ck_assert_str_eq (gtk_window_get_title (GTK_WINDOW (window)), "chosen.pline — Pressline");
  close_window (window);
  g_remove (path);
  g_rmdir (dir);
}
END_TEST

/* --- save as, reload, recent files --- */

START_TEST (test_save_as_reload)
{
  PlWindow *window = pl_ui_test_open_window (app, "samples/demo-glue-line.pline");
  PlDocument *doc = pl_window_get_document (window);
  g_autoptr (GError) error = NULL;
  g_autofree char *dir = g_dir_make_tmp ("pressline-ui-XXXXXX", &error);
  g_autofree char *path = NULL;
  g_autoptr (GFile) file = NULL;
  g_autoptr (PlDocument) back = NULL;
  g_auto (GStrv) recent = NULL;
  g_autofree char *uri = NULL;
  g_autoptr (PlCommand) cmd = pl_command_new_set_number (id_of_tag (window, "H1"),
                                                         "length", 30.0);

  ck_assert_ptr_nonnull (dir);
  ck_assert (pl_undo_stack_push (pl_window_get_undo_stack (window), cmd, NULL));
  ck_assert (pl_window_get_dirty (window));
  path = g_build_filename (dir, "copy.pline", NULL);
  file = g_file_new_for_path (path);
  ck_assert_msg (pl_window_save_to_file (window, file, &error), "%s",
                 error ? error->message : "");
  ck_assert (!pl_window_get_dirty (window));
  ck_assert_str_eq (gtk_window_get_title (GTK_WINDOW (window)), "copy.pline — Pressline");
  back = pl_layout_read_file (path, &error);
  ck_assert_msg (back != NULL, "%s", error ? error->message : "");
  ck_assert (pl_document_equal (doc, back));

  recent = g_settings_get_strv (pl_application_get_settings (app), "recent-files");
  uri = g_file_get_uri (file);
  ck_assert_str_eq (recent[0], uri);

  /* Reopening through the window equals too. */
  ck_assert (pl_window_load_file (window, file, NULL));
  ck_assert (pl_document_equal (pl_window_get_document (window), back));
  close_window (window);
  g_remove (path);
  g_rmdir (dir);
}
END_TEST

START_TEST (test_recent_files_capped)
{
  GSettings *settings = pl_application_get_settings (app);
  PlWindow *window = pl_ui_test_open_window (app, "samples/demo-glue-line.pline");
  g_autoptr (GError) error = NULL;
  g_autofree char *dir = g_dir_make_tmp ("pressline-recent-XXXXXX", &error);
  g_auto (GStrv) recent = NULL;
  g_autofree char *newest = NULL;
  g_autoptr (GFile) missing = g_file_new_for_path ("/nonexistent/pressline/x.pline");

  g_settings_set_strv (settings, "recent-files", NULL);
  /* Twelve saves under twelve names, then the first name again. */
  for (int i = 0; i <= 12; i++)
    {
      g_autofree char *name = g_strdup_printf ("r%d.pline", i % 12);
      g_autofree char *path = g_build_filename (dir, name, NULL);
      g_autoptr (GFile) file = g_file_new_for_path (path);
      ck_assert (pl_window_save_to_file (window, file, NULL));
      if (i == 12)
        newest = g_file_get_uri (file);
    }
  /* A file that cannot be read is not added. */
  ck_assert (!pl_window_load_file (window, missing, NULL));
  recent = g_settings_get_strv (settings, "recent-files");
  ck_assert_uint_eq (g_strv_length (recent), 10);
  ck_assert_str_eq (recent[0], newest);
  for (guint i = 1; i < 10; i++)
    ck_assert_str_ne (recent[i], newest);
  close_window (window);
  for (int i = 0; i < 12; i++)
    {
      g_autofree char *name = g_strdup_printf ("r%d.pline", i);
      g_autofree char *path = g_build_filename (dir, name, NULL);
      g_remove (path);
    }
  g_rmdir (dir);
}
END_TEST

/* --- title and dirty state --- */

START_TEST (test_title_tracks_unsaved)
{
  PlWindow *window = pl_ui_test_open_window (app, NULL);
  PlCanvas *canvas = canvas_of (window);
  PlPoint origin = { 0, 0 };
  g_autofree char *id = NULL;

  ck_assert_str_eq (gtk_window_get_title (GTK_WINDOW (window)), "Untitled layout — Pressline");
  ck_assert_ptr_null (pl_canvas_place_part (canvas, "scenario", origin));
  id = pl_canvas_place_part (canvas, "pump", origin);
  ck_assert_ptr_nonnull (id);
  ck_assert_str_eq (gtk_window_get_title (GTK_WINDOW (window)),
                    "• Untitled layout — Pressline");
  activate (window, "win.undo");
  ck_assert_str_eq (gtk_window_get_title (GTK_WINDOW (window)), "Untitled layout — Pressline");
  ck_assert_uint_eq (pl_document_get_n_parts (pl_window_get_document (window)), 0);
  close_window (window);
}
END_TEST

/* --- drags --- */

START_TEST (test_drag_moves_snapped_one_step)
{
  PlWindow *window = pl_ui_test_open_window (app, "samples/demo-glue-line.pline");
  PlDocument *doc = pl_window_get_document (window);
  PlCanvas *canvas = canvas_of (window);
  PlUndoStack *undo = pl_window_get_undo_stack (window);
  g_autoptr (PlDocument) copy = pl_document_copy (doc);
  g_autofree char *id = g_strdup (id_of_tag (window, "A1"));
  const PlPart *part = pl_document_find_part (doc, id);
  PlPoint w = { pl_part_get_x (part), pl_part_get_y (part) }, s;
  double scale = pl_viewport_get_scale (pl_canvas_get_viewport (canvas));
  double x0 = pl_part_get_x (part), y0 = pl_part_get_y (part);
  guint n_ticks = 0;
  gint64 worst;
  const int steps = 40;

  world_to_screen (window, w, &s);
  pl_canvas_reset_frame_stats (canvas);
  pl_canvas_pointer_press (canvas, s.x, s.y, 0);
  /* 40 motion events a frame apart, 43 mm to the right and 21 mm down. */
  for (int i = 1; i <= steps; i++)
    {
      pl_canvas_pointer_motion (canvas, s.x + 43.0 * scale * i / steps,
                                s.y + 21.0 * scale * i / steps);
      pl_ui_test_spin (16);
    }
  pl_canvas_pointer_release (canvas, s.x + 43.0 * scale, s.y + 21.0 * scale);
  worst = pl_canvas_get_max_frame_interval (canvas, &n_ticks);
  printf ("figure: longest frame interval during a %d-step drag: %.1f ms over %u ticks\n",
          steps, worst / 1000.0, n_ticks);
  part = pl_document_find_part (doc, id);
  /* 43 mm snaps to 45, 21 to 20 (5 mm grid). */
  ck_assert_double_eq_tol (pl_part_get_x (part), x0 + 45.0, 1e-9);
  ck_assert_double_eq_tol (pl_part_get_y (part), y0 + 20.0, 1e-9);
  ck_assert_uint_eq (pl_undo_stack_get_n_undo (undo), 1);
  activate (window, "win.undo");
  ck_assert (pl_document_equal (doc, copy));

  /* Escape in the middle of a drag leaves nothing behind. */
  world_to_screen (window, w, &s);
  pl_canvas_pointer_press (canvas, s.x, s.y, 0);
  pl_canvas_pointer_motion (canvas, s.x + 30 * scale, s.y);
  ck_assert (!pl_document_equal (doc, copy));
  activate (window, "win.cancel");
  pl_canvas_pointer_release (canvas, s.x + 40 * scale, s.y);
  ck_assert (pl_document_equal (doc, copy));
  ck_assert_uint_eq (pl_undo_stack_get_n_undo (undo), 0);
  close_window (window);
}
END_TEST

START_TEST (test_rubber_band_delete_rotate_flip)
{
  PlWindow *window = pl_ui_test_open_window (app, "samples/demo-glue-line.pline");
  PlDocument *doc = pl_window_get_document (window);
  PlCanvas *canvas = canvas_of (window);
  g_autoptr (PlDocument) copy = pl_document_copy (doc);
  g_auto (GStrv) sel = NULL;
  PlRect box;
  PlPoint a, b, sa, sb;
  const char *pump;

  ck_assert (pl_geometry_document_bounds (doc, &box));
  a.x = box.x0 - 10;
  a.y = box.y0 - 10;
  b.x = box.x1 + 10;
  b.y = box.y1 + 10;
  world_to_screen (window, a, &sa);
  world_to_screen (window, b, &sb);
  /* The band starts outside the drawing (empty paper). */
  pl_canvas_pointer_press (canvas, sa.x, sa.y, 0);
  pl_canvas_pointer_motion (canvas, sb.x, sb.y);
  pl_canvas_pointer_release (canvas, sb.x, sb.y);
  sel = pl_canvas_get_selection (canvas);
  ck_assert_uint_eq (g_strv_length (sel),
                     pl_document_get_n_parts (doc) + pl_document_get_n_wires (doc)
                       + pl_document_get_n_notes (doc));
  activate (window, "win.delete");
  ck_assert_uint_eq (pl_document_get_n_parts (doc), 0);
  activate (window, "win.undo");
  ck_assert (pl_document_equal (doc, copy));

  pump = id_of_tag (window, "P1");
  {
    const char *ids[] = { pump, NULL };
    pl_canvas_select (canvas, ids);
  }
  activate (window, "win.rotate");
  ck_assert_uint_eq (pl_part_get_rotation (pl_document_find_part (doc, pump)), 1);
  activate (window, "win.flip");
  ck_assert (pl_part_get_mirrored (pl_document_find_part (doc, pump)));
  activate (window, "win.undo");
  activate (window, "win.undo");
  ck_assert (pl_document_equal (doc, copy));
  close_window (window);
}
END_TEST

START_TEST (test_copy_paste_keeps_internal_wires)
{
  PlWindow *window = pl_ui_test_open_window (app, "samples/demo-glue-line.pline");
  PlDocument *doc = pl_window_get_document (window);
  PlCanvas *canvas = canvas_of (window);
  g_autoptr (PlDocument) copy = pl_document_copy (doc);
  guint n_parts = pl_document_get_n_parts (doc), n_wires = pl_document_get_n_wires (doc);
  const char *ids[] = { id_of_tag (window, "T2"), id_of_tag (window, "H4"), NULL };
  g_auto (GStrv) sel = NULL;
  guint internal = 0;

  /* How many wires join T2 and H4 directly. */
  for (guint i = 0; i < n_wires; i++)
    {
      const PlWire *wire = pl_document_get_wire (doc, i);
      const char *e0 = pl_wire_get_part_id (wire, 0), *e1 = pl_wire_get_part_id (wire, 1);
      if ((g_str_equal (e0, ids[0]) && g_str_equal (e1, ids[1]))
          || (g_str_equal (e0, ids[1]) && g_str_equal (e1, ids[0])))
        internal++;
    }
  ck_assert_uint_ge (internal, 1);
  pl_canvas_select (canvas, ids);
  activate (window, "win.copy");
  activate (window, "win.paste");
  ck_assert_uint_eq (pl_document_get_n_parts (doc), n_parts + 2);
  ck_assert_uint_eq (pl_document_get_n_wires (doc), n_wires + internal);
  sel = pl_canvas_get_selection (canvas);
  ck_assert_uint_eq (g_strv_length (sel), 2);
  for (guint i = 0; i < 2; i++)
    {
      const PlPart *orig = pl_document_find_part (doc, ids[i]);
      const PlPart *pasted = pl_document_find_part (doc, sel[i]);
      ck_assert_str_ne (pl_part_get_tag (pasted), pl_part_get_tag (orig));
      ck_assert_ptr_eq (pl_part_get_part_type (pasted), pl_part_get_part_type (orig));
      ck_assert_uint_eq (pl_part_get_rotation (pasted), pl_part_get_rotation (orig));
      /* Values come along (a hose keeps its bore). */
      if (pl_part_get_part_type (orig)->kind == PL_PART_HOSE)
        ck_assert_double_eq (pl_part_get_number (pasted, "bore"),
                             pl_part_get_number (orig, "bore"));
    }
  activate (window, "win.undo");
  ck_assert (pl_document_equal (doc, copy));
  close_window (window);
}
END_TEST

/* --- zoom --- */

START_TEST (test_zoom_actions_keep_centre)
{
  PlWindow *window = pl_ui_test_open_window (app, "samples/demo-glue-line.pline");
  PlCanvas *canvas = canvas_of (window);
  const PlViewport *vp = pl_canvas_get_viewport (canvas);
  PlPoint centre = { vp->width / 2, vp->height / 2 }, w0, w1;
  double z0 = vp->zoom;

  pl_viewport_screen_to_world (vp, centre, &w0);
  activate (window, "win.zoom-in");
  ck_assert_double_eq_tol (vp->zoom, z0 * 1.25, 1e-9);
  pl_viewport_screen_to_world (vp, centre, &w1);
  ck_assert_double_eq_tol (w1.x, w0.x, 1e-9);
  ck_assert_double_eq_tol (w1.y, w0.y, 1e-9);
  activate (window, "win.zoom-out");
  ck_assert_double_eq_tol (vp->zoom, z0, 1e-9);
  activate (window, "win.zoom-reset");
  ck_assert_double_eq_tol (vp->zoom, 1.0, 1e-12);
  activate (window, "win.zoom-fit");
  ck_assert_double_eq_tol (vp->zoom, z0, 1e-9);
  /* Zoom at a corner keeps the point under it. */
  pl_viewport_screen_to_world (vp, (PlPoint){ 10, 20 }, &w0);
  pl_canvas_zoom_at (canvas, 2.0, 10, 20);
  pl_viewport_screen_to_world (vp, (PlPoint){ 10, 20 }, &w1);
  ck_assert_double_eq_tol (w1.x, w0.x, 1e-9);
  ck_assert_double_eq_tol (w1.y, w0.y, 1e-9);
  close_window (window);
}
END_TEST

/* --- pinch and middle drag --- */

/* The canvas's own controller of a type (for a drag: on button), or NULL. */
static GtkEventController *
canvas_controller (PlCanvas *canvas, GType type, guint button)
{
  g_autoptr (GListModel) list = gtk_widget_observe_controllers (GTK_WIDGET (canvas));

  for (guint i = 0; i < g_list_model_get_n_items (list); i++)
    {
      g_autoptr (GObject) c = g_list_model_get_item (list, i);

      if (G_TYPE_CHECK_INSTANCE_TYPE (c, type)
          && (button == 0 || gtk_gesture_single_get_button (GTK_GESTURE_SINGLE (c)) == button))
        return GTK_EVENT_CONTROLLER (c);
    }
  return NULL;
}

/* GTK 4 gives no way to inject touch or button events, so the gestures
 * the canvas installed are driven through their own signals, as GTK's
 * event handling would emit them: the handlers and the viewport maths are
 * the real ones. */
START_TEST (test_pinch_and_middle_drag)
{
  PlWindow *window = pl_ui_test_open_window (app, "samples/demo-glue-line.pline");
  PlCanvas *canvas = canvas_of (window);
  const PlViewport *vp = pl_canvas_get_viewport (canvas);
  GtkEventController *zoom = canvas_controller (canvas, GTK_TYPE_GESTURE_ZOOM, 0);
  GtkEventController *pan = canvas_controller (canvas, GTK_TYPE_GESTURE_DRAG,
                                               GDK_BUTTON_MIDDLE);
  PlPoint centre = { vp->width / 2, vp->height / 2 }, w0, w1;
  double z0 = vp->zoom;

  ck_assert_ptr_nonnull (zoom);
  ck_assert_ptr_nonnull (pan);

  /* Fingers spread to twice, then three times their distance: the zoom
   * follows the scale, about the middle (no touch points to centre on). */
  pl_viewport_screen_to_world (vp, centre, &w0);
  g_signal_emit_by_name (zoom, "begin", NULL);
  g_signal_emit_by_name (zoom, "scale-changed", 2.0);
  ck_assert_double_eq_tol (vp->zoom, 2.0 * z0, 1e-9 * z0);
  g_signal_emit_by_name (zoom, "scale-changed", 3.0);
  ck_assert_double_eq_tol (vp->zoom, 3.0 * z0, 1e-9 * z0);
  pl_viewport_screen_to_world (vp, centre, &w1);
  ck_assert_double_eq_tol (w1.x, w0.x, 1e-9);
  ck_assert_double_eq_tol (w1.y, w0.y, 1e-9);
  /* A new pinch starts from where the last one left the zoom. */
  g_signal_emit_by_name (zoom, "begin", NULL);
  g_signal_emit_by_name (zoom, "scale-changed", 0.5);
  ck_assert_double_eq_tol (vp->zoom, 1.5 * z0, 1e-9 * z0);

  /* Middle drag: the drawing moves with the pointer, the whole offset of
   * the drag and nothing more, however many updates it came in. */
  pl_viewport_screen_to_world (vp, (PlPoint) { 300, 200 }, &w0);
  g_signal_emit_by_name (pan, "drag-begin", 300.0, 200.0);
  g_signal_emit_by_name (pan, "drag-update", 30.0, -20.0);
  g_signal_emit_by_name (pan, "drag-update", 50.0, 10.0);
  g_signal_emit_by_name (pan, "drag-end", 50.0, 10.0);
  pl_viewport_screen_to_world (vp, (PlPoint) { 350, 210 }, &w1);
  ck_assert_double_eq_tol (w1.x, w0.x, 1e-9);
  ck_assert_double_eq_tol (w1.y, w0.y, 1e-9);
  ck_assert_double_eq_tol (vp->zoom, 1.5 * z0, 1e-9 * z0);
  close_window (window);
}
END_TEST

/* --- large layout: edit to fast results --- */

START_TEST (test_large_layout_edit_figure)
{
  PlWindow *window = pl_ui_test_open_window (app, NULL);
  PlDocument *doc = pl_window_get_document (window);
  PlUndoStack *undo = pl_window_get_undo_stack (window);
  g_autoptr (PlDocument) big = pl_document_new ();
  g_autofree char *first_hose = NULL;
  gint64 best = G_MAXINT64, sum = 0;
  const int lines = 50, reps = 20;

  /* 50 lines of pump, hose, tee, hose, applicator, gauge... (10 parts a
   * line: 500 parts), wired, made through the document's commands. */
  for (int l = 0; l < lines; l++)
    {
      static const char *const chain[] = { "pump", "hose", "tee", "hose", "applicator" };
      char ids[10][16];
      double y = l * 120.0;

      for (int k = 0; k < 10; k++)
        {
          const char *type = k < 5 ? chain[k] : (k % 2 == 1 ? "hose" : "applicator");
          g_autoptr (PlCommand) cmd = pl_command_new_add_part (type, NULL, 60.0 * k, y);
          ck_assert (pl_command_apply (cmd, big, NULL));
          g_strlcpy (ids[k], pl_command_get_created_id (cmd), sizeof ids[k]);
          if (first_hose == NULL && g_str_equal (type, "hose"))
            first_hose = g_strdup (ids[k]);
        }
      {
        /* pump - hose - tee(a) ; tee(b) - hose - applicator ; tee(branch) -
         * hose - applicator ; then two more hoses and applicators chained off
         * the first applicator's node. */
        const char *w[][4] = {
          { ids[0], "out", ids[1], "a" }, { ids[1], "b", ids[2], "a" },
          { ids[2], "b", ids[3], "a" },   { ids[3], "b", ids[4], "in" },
          { ids[2], "branch", ids[5], "a" }, { ids[5], "b", ids[6], "in" },
          { ids[3], "b", ids[7], "a" },   { ids[7], "b", ids[8], "in" },
          { ids[5], "b", ids[9], "a" },
        };
        for (guint k = 0; k < G_N_ELEMENTS (w); k++)
          {
            g_autoptr (PlCommand) cmd = pl_command_new_add_wire (NULL, w[k][0], w[k][1],
                                                                 w[k][2], w[k][3], NULL, 0);
            pl_command_apply (cmd, big, NULL);
          }
      }
    }
  ck_assert_uint_eq (pl_document_get_n_parts (big), 500);
  {
    g_autofree char *path = NULL;
    g_autofree char *data = NULL;
    g_autoptr (GError) error = NULL;
    g_autofree char *dir = g_dir_make_tmp ("pressline-big-XXXXXX", &error);
    g_autoptr (GFile) file = NULL;

    path = g_build_filename (dir, "big.pline", NULL);
    ck_assert (pl_layout_write_file (big, path, &error));
    file = g_file_new_for_path (path);
    ck_assert (pl_window_load_file (window, file, &error));
    g_remove (path);
    g_rmdir (dir);
  }
  doc = pl_window_get_document (window);
  undo = pl_window_get_undo_stack (window);
  pl_ui_test_spin (30);
  for (int r = 0; r < reps; r++)
    {
      g_autoptr (PlCommand) cmd = pl_command_new_set_number (first_hose, "bore",
                                                             0.006 + 0.0001 * r);
      gint64 t0 = g_get_monotonic_time (), dt;
      ck_assert (pl_undo_stack_push (undo, cmd, NULL));
      dt = g_get_monotonic_time () - t0;
      best = MIN (best, dt);
      sum += dt;
      /* Fresh at once, for the new revision. */
      ck_assert_uint_eq (pl_results_get_revision (
                           pl_solve_scheduler_get_fast_results (pl_window_get_scheduler (window))),
                         pl_document_get_revision (doc));
      /* No main loop turn in between: the results tables (refreshed after
       * the frame, one update per burst) are not what is timed here. */
    }
  printf ("figure: edit to fresh fast results, 500-part layout, whole window: mean %.3f ms, "
          "best %.3f ms (%d edits)\n", sum / 1000.0 / reps, best / 1000.0, reps);
  /* What the scheduler does on the main thread for each edit, without any
   * widget: compile and the two fast solves, so the window's share shows. */
  best = G_MAXINT64;
  sum = 0;
  for (int r = 0; r < reps; r++)
    {
      gint64 t0 = g_get_monotonic_time (), dt;
      PlCompiled *compiled = pl_compile (doc);
      PlResults *fast = pl_results_solve_fast (compiled);
      dt = g_get_monotonic_time () - t0;
      ck_assert_uint_eq (pl_results_get_transient_state (fast), PL_TRANSIENT_PENDING);
      pl_results_unref (fast);
      pl_compiled_unref (compiled);
      best = MIN (best, dt);
      sum += dt;
    }
  printf ("figure: compile and fast solves alone, 500-part layout: mean %.3f ms, "
          "best %.3f ms\n", sum / 1000.0 / reps, best / 1000.0);
  close_window (window);
}
END_TEST

/* --- screenshots --- */

/* Mean luma (Rec. 709 weights) of a texture, 0..1. */
static double
mean_luma (GdkTexture *texture)
{
  int w = gdk_texture_get_width (texture), h = gdk_texture_get_height (texture);
  g_autofree guchar *data = g_malloc ((gsize) w * h * 4);
  double sum = 0;

  gdk_texture_download (texture, data, (gsize) w * 4);
  /* GDK_MEMORY_DEFAULT: premultiplied B8G8R8A8 on little endian. */
  for (gsize i = 0; i < (gsize) w * h; i++)
    sum += 0.0722 * data[4 * i] + 0.7152 * data[4 * i + 1] + 0.2126 * data[4 * i + 2];
  return sum / ((double) w * h * 255.0);
}

START_TEST (test_screenshots)
{
  GtkSettings *settings = gtk_settings_get_default ();
  PlWindow *window = pl_ui_test_open_window (app, "samples/demo-glue-line.pline");
  PlCanvas *canvas = canvas_of (window);
  const char *gauge = id_of_tag (window, "G1");
  const char *ids[] = { id_of_tag (window, "H1"), NULL };
  double light, dark;

  pl_ui_test_wait_for_full (window);
  pl_canvas_select (canvas, ids);
  pl_ui_test_spin (100);
  pl_ui_test_save_shot (GTK_WIDGET (window), "window-light.png");
  {
    g_autoptr (GdkTexture) t = pl_ui_test_render_widget (GTK_WIDGET (canvas));
    light = mean_luma (t);
  }
  /* High zoom at the gauge. */
  {
    PlPoint s;
    port_on_screen (window, gauge, "p", &s);
    pl_canvas_zoom_at (canvas, 4.0, s.x, s.y);
    pl_ui_test_spin (50);
    pl_ui_test_save_shot (GTK_WIDGET (window), "window-light-zoom.png");
  }
  g_object_set (settings, "gtk-application-prefer-dark-theme", TRUE, NULL);
  ck_assert_int_eq (pl_canvas_get_style (canvas), PL_RENDER_STYLE_DARK);
  pl_ui_test_spin (100);
  pl_ui_test_save_shot (GTK_WIDGET (window), "window-dark-zoom.png");
  activate (window, "win.zoom-fit");
  pl_ui_test_spin (100);
  pl_ui_test_save_shot (GTK_WIDGET (window), "window-dark.png");
  {
    g_autoptr (GdkTexture) t = pl_ui_test_render_widget (GTK_WIDGET (canvas));
    dark = mean_luma (t);
  }
  g_object_set (settings, "gtk-application-prefer-dark-theme", FALSE, NULL);
  printf ("figure: canvas mean luma light %.3f, dark %.3f\n", light, dark);
  /* A light sheet is mostly white, a dark one mostly dark. */
  ck_assert_double_gt (light, 0.7);
  ck_assert_double_lt (dark, 0.35);
  close_window (window);
}
END_TEST

/* The sheet follows the theme's own colours, not only the dark
 * preference: run with GTK_THEME=Adwaita:dark (meson runs this case so,
 * as test-editor-gtk-theme-dark) the canvas must be dark from the start. */
START_TEST (test_canvas_follows_theme_colours)
{
  const char *theme = g_getenv ("GTK_THEME");
  gboolean dark_theme = theme != NULL && g_str_has_suffix (theme, ":dark");
  PlWindow *window = pl_ui_test_open_window (app, "samples/demo-glue-line.pline");
  PlCanvas *canvas = canvas_of (window);
  GdkRGBA fg;
  double luma;

  pl_ui_test_spin (100);
  gtk_style_context_get_color (gtk_widget_get_style_context (GTK_WIDGET (canvas)), &fg);
  if (dark_theme)
    ck_assert_double_gt (fg.red + fg.green + fg.blue, 1.5);
  ck_assert_int_eq (pl_canvas_get_style (canvas),
                    fg.red + fg.green + fg.blue > 1.5 ? PL_RENDER_STYLE_DARK
                                                      : PL_RENDER_STYLE_LIGHT);
  {
    g_autoptr (GdkTexture) t = pl_ui_test_render_widget (GTK_WIDGET (canvas));
    luma = mean_luma (t);
  }
  pl_ui_test_save_shot (GTK_WIDGET (window), dark_theme ? "window-gtk-theme-dark.png"
                                             : "window-gtk-theme-default.png");
  printf ("figure: canvas mean luma under GTK_THEME=%s: %.3f\n", theme ? theme : "(unset)",
          luma);
  if (dark_theme)
    ck_assert_double_lt (luma, 0.35);
  close_window (window);
}
END_TEST

static Suite *
editor_suite (void)
{
  Suite *s = suite_create ("editor");
  TCase *tc = tcase_create ("editor");
  TCase *theme = tcase_create ("theme");

  tcase_set_timeout (tc, 120);
  tcase_add_unchecked_fixture (tc, app_setup, NULL);
  tcase_add_loop_test (tc, test_open_sample, 0, G_N_ELEMENTS (samples));
  tcase_add_test (tc, test_shelf_wire_bore_undo);
  tcase_add_test (tc, test_wire_refused);
  tcase_add_test (tc, test_undo_tooltips_name_the_step);
  tcase_add_loop_test (tc, test_bad_file_keeps_document, 0, G_N_ELEMENTS (bad_files));
  tcase_add_test (tc, test_save_as_reload);
  tcase_add_test (tc, test_new_asks_before_discarding);
  tcase_add_test (tc, test_save_as_through_the_chooser);
  tcase_add_test (tc, test_recent_files_capped);
  tcase_add_test (tc, test_title_tracks_unsaved);
  tcase_add_test (tc, test_drag_moves_snapped_one_step);
  tcase_add_test (tc, test_rubber_band_delete_rotate_flip);
  tcase_add_test (tc, test_copy_paste_keeps_internal_wires);
  tcase_add_test (tc, test_zoom_actions_keep_centre);
  tcase_add_test (tc, test_pinch_and_middle_drag);
  tcase_add_test (tc, test_large_layout_edit_figure);
  tcase_add_test (tc, test_screenshots);
  suite_add_tcase (s, tc);
  tcase_set_timeout (theme, 60);
  tcase_add_unchecked_fixture (theme, app_setup, NULL);
  tcase_add_test (theme, test_canvas_follows_theme_colours);
  suite_add_tcase (s, theme);
  return s;
}

int
main (int argc, char **argv)
{
  int status;

  gtk_init ();
  status = pl_check_run (editor_suite ());
  pl_ui_test_app_teardown ();
  return status;
}
