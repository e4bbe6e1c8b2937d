/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-export-dialog.c: the dialog that exports the work order.  GTK 4.8 has
 * no GtkFileDialog: the options are a GtkDialog, the file a
 * GtkFileChooserNative after it.
 */
#include "config.h"

#include "pl-export-dialog.h"

#include <glib/gi18n.h>
#include <string.h>

#include "pl-print.h"
#include "pl-results-wait.h"
#include "pl-window-private.h"

static PlExportSettings last_settings = {
  PL_WORK_ORDER_PDF, PL_PAPER_A4, PL_ORIENTATION_AUTO, PL_WORK_ORDER_DEFAULT_DPI
};

const PlExportSettings *
pl_export_dialog_get_settings (void)
{
  return &last_settings;
}

gboolean
pl_export_dialog_write (PlWindow *window, PlResults *results, GFile *file,
                        const PlExportSettings *settings, GPtrArray *removed, GError **error)
{
  g_autofree char *path = NULL;
  g_autoptr (PlWorkOrder) wo = NULL;
  PlWorkOrderFormat format;
  double w, h;

  g_return_val_if_fail (PL_IS_WINDOW (window), FALSE);
  g_return_val_if_fail (G_IS_FILE (file) && settings != NULL, FALSE);

  path = g_file_get_path (file);
  if (path == NULL)
    {
      g_autofree char *uri = g_file_get_uri (file);

      g_set_error (error, PL_WORK_ORDER_ERROR, PL_WORK_ORDER_ERROR_WRITE,
                   _("Cannot write %s: only local files can be written."), uri);
      return FALSE;
    }
  format = pl_work_order_format_from_filename (path);
  if (format == PL_N_WORK_ORDER_FORMATS)
    format = settings->format;
  pl_paper_get_size (settings->paper,
                     pl_orientation_resolve (settings->orientation, settings->paper,
                                             pl_window_get_document (window)),
                     &w, &h);
  wo = pl_print_make_work_order (window, results, w, h);
  return pl_work_order_write_full (wo, format, settings->dpi, path, removed, error);
}

char *
pl_export_dialog_describe (GFile *file, GPtrArray *removed)
{
  g_autofree char *name = g_file_get_basename (file);
  g_autoptr (GString) names = g_string_new (NULL);

  if (removed == NULL || removed->len == 0)
    /* Translators: a brief message after an export; %s is a file name. */
    return g_strdup_printf (_("Work order written to %s"), name);
  for (guint i = 0; i < removed->len; i++)
    {
      g_autofree char *base = g_path_get_basename (g_ptr_array_index (removed, i));

      if (i > 0)
        /* Translators: between the names of removed files. */
        g_string_append (names, _(", "));
      g_string_append (names, base);
    }
  return g_strdup_printf (
    /* Translators: a brief message after an export; the first %s is a file
     * name, the second a list of file names. */
    ngettext ("Work order written to %s; removed %s, a sheet left from an earlier export",
              "Work order written to %s; removed %s, sheets left from an earlier export",
              removed->len),
    name, names->str);
}

typedef struct
{
  GFile *file;
  PlExportSettings settings;
} PendingExport;

static void
pending_export_free (gpointer data)
{
  PendingExport *p = data;

  g_object_unref (p->file);
  g_free (p);
}

static void
export_when_solved_cb (PlWindow *window, PlResults *results, gpointer data)
{
  PendingExport *p = data;
  g_autoptr (GPtrArray) removed = g_ptr_array_new_with_free_func (g_free);
  g_autoptr (GError) error = NULL;
  g_autofree char *text = NULL;

  if (results == NULL)
    return;   /* cancelled: nothing written */
  if (!pl_export_dialog_write (window, results, p->file, &p->settings, removed, &error))
    {
      pl_file_ops_show_error (window, _("The work order could not be exported"),
                              error->message);
      return;
    }
  text = pl_export_dialog_describe (p->file, removed);
  pl_window_show_toast (window, text);
}

void
pl_export_dialog_write_when_solved (PlWindow *window, GFile *file,
                                    const PlExportSettings *settings)
{
  PendingExport *p = g_new0 (PendingExport, 1);

  g_return_if_fail (PL_IS_WINDOW (window) && G_IS_FILE (file) && settings != NULL);
  p->file = g_object_ref (file);
  p->settings = *settings;
  pl_results_wait (window, _("Export Work Order"), export_when_solved_cb, p,
                   pending_export_free);
}

/* --- the dialog --- */

typedef struct
{
  PlWindow *window;
  GtkDropDown *format, *paper, *orientation;
  GtkSpinButton *dpi;
  GtkWidget *dpi_label;
} ExportDialog;

static void
export_dialog_free (gpointer data, GClosure *closure)
{
  ExportDialog *d = data;

  g_object_unref (d->window);
  g_free (d);
}

/* "work.pdf" from the layout's name and the format. */
static char *
suggested_name (PlWindow *window, PlWorkOrderFormat format)
{
  GFile *file = pl_window_get_file (window);
  g_autofree char *base = file != NULL ? g_file_get_basename (file) : NULL;
  const char *dot = base != NULL ? strrchr (base, '.') : NULL;
  g_autofree char *stem = base == NULL ? g_strdup (_("Work order"))
                          : dot != NULL && dot != base ? g_strndup (base, dot - base)
                          : g_strdup (base);

  return g_strdup_printf ("%s.%s", stem, pl_work_order_format_get_key (format));
}

static void
chooser_response_cb (GtkNativeDialog *native, int response, gpointer data)
{
  PlWindow *window = data;

  window->in_dialog = FALSE;
  if (response == GTK_RESPONSE_ACCEPT)
    {
      g_autoptr (GFile) file = gtk_file_chooser_get_file (GTK_FILE_CHOOSER (native));

      if (file != NULL)
        pl_export_dialog_write_when_solved (window, file, &last_settings);
    }
  g_object_unref (native);
  g_object_unref (window);
}

static void
choose_file (PlWindow *window)
{
  GtkFileChooserNative *native;
  g_autoptr (GtkFileFilter) filter = gtk_file_filter_new ();
  g_autofree char *name = suggested_name (window, last_settings.format);
  static const char *const types[PL_N_WORK_ORDER_FORMATS] = {
    "application/pdf", "image/svg+xml", "image/png"
  };

  native = gtk_file_chooser_native_new (_("Export Work Order"), GTK_WINDOW (window),
                                        GTK_FILE_CHOOSER_ACTION_SAVE, _("_Export"),
                                        _("_Cancel"));
  gtk_native_dialog_set_modal (GTK_NATIVE_DIALOG (native), TRUE);
  gtk_file_filter_set_name (filter, pl_work_order_format_get_key (last_settings.format));
  gtk_file_filter_add_mime_type (filter, types[last_settings.format]);
  gtk_file_chooser_add_filter (GTK_FILE_CHOOSER (native), filter);
  gtk_file_chooser_set_current_name (GTK_FILE_CHOOSER (native), name);
  g_signal_connect (native, "response", G_CALLBACK (chooser_response_cb),
                    g_object_ref (window));
  window->in_dialog = TRUE;
  gtk_native_dialog_show (GTK_NATIVE_DIALOG (native));
}

static void
dialog_response_cb (GtkDialog *dialog, int response, gpointer data)
{
  ExportDialog *d = data;
  PlWindow *window = g_object_ref (d->window);

  if (response == GTK_RESPONSE_ACCEPT)
    {
      last_settings.format = gtk_drop_down_get_selected (d->format);
      last_settings.paper = gtk_drop_down_get_selected (d->paper);
      last_settings.orientation = gtk_drop_down_get_selected (d->orientation);
      last_settings.dpi = gtk_spin_button_get_value (d->dpi);
    }
  gtk_window_destroy (GTK_WINDOW (dialog));
  if (response == GTK_RESPONSE_ACCEPT)
    choose_file (window);
  g_object_unref (window);
}

static void
format_changed_cb (GtkDropDown *format, GParamSpec *pspec, gpointer data)
{
  ExportDialog *d = data;
  gboolean png = gtk_drop_down_get_selected (format) == PL_WORK_ORDER_PNG;

  gtk_widget_set_sensitive (GTK_WIDGET (d->dpi), png);
  gtk_widget_set_sensitive (d->dpi_label, png);
}

static GtkWidget *
add_row (GtkGrid *grid, int row, const char *label_text, GtkWidget *widget)
{
  GtkWidget *label = gtk_label_new_with_mnemonic (label_text);

  gtk_label_set_xalign (GTK_LABEL (label), 1.0);
  gtk_label_set_mnemonic_widget (GTK_LABEL (label), widget);
  gtk_widget_set_hexpand (widget, TRUE);
  gtk_grid_attach (grid, label, 0, row, 1, 1);
  gtk_grid_attach (grid, widget, 1, row, 1, 1);
  return label;
}

void
pl_export_dialog_show (PlWindow *window)
{
  ExportDialog *d = g_new0 (ExportDialog, 1);
  const char *formats[] = { _("PDF document, every sheet a page"),
                            _("SVG drawing, a file per sheet"),
                            _("PNG image, a file per sheet"), NULL };
  const char *papers[PL_N_PAPERS + 1] = { NULL };
  /* In the order of PlOrientation. */
  const char *orientations[] = { _("Portrait"), _("Landscape"),
                                 _("Automatic, by the diagram's shape"), NULL };
  GtkWidget *dialog, *grid, *note;

  g_return_if_fail (PL_IS_WINDOW (window));
  for (guint i = 0; i < PL_N_PAPERS; i++)
    papers[i] = pl_paper_get_label (i);
  d->window = g_object_ref (window);

  dialog = gtk_dialog_new_with_buttons (_("Export Work Order"), GTK_WINDOW (window),
                                        GTK_DIALOG_MODAL | GTK_DIALOG_DESTROY_WITH_PARENT
                                        | GTK_DIALOG_USE_HEADER_BAR,
                                        _("_Cancel"), GTK_RESPONSE_CANCEL,
                                        _("_Choose File…"), GTK_RESPONSE_ACCEPT, NULL);
  gtk_dialog_set_default_response (GTK_DIALOG (dialog), GTK_RESPONSE_ACCEPT);
  grid = gtk_grid_new ();
  gtk_grid_set_row_spacing (GTK_GRID (grid), 6);
  gtk_grid_set_column_spacing (GTK_GRID (grid), 12);
  gtk_widget_set_margin_start (grid, 18);
  gtk_widget_set_margin_end (grid, 18);
  gtk_widget_set_margin_top (grid, 18);
  gtk_widget_set_margin_bottom (grid, 18);

  d->format = GTK_DROP_DOWN (gtk_drop_down_new_from_strings (formats));
  d->paper = GTK_DROP_DOWN (gtk_drop_down_new_from_strings (papers));
  d->orientation = GTK_DROP_DOWN (gtk_drop_down_new_from_strings (orientations));
  d->dpi = GTK_SPIN_BUTTON (gtk_spin_button_new_with_range (PL_WORK_ORDER_MIN_DPI,
                                                            PL_WORK_ORDER_MAX_DPI, 25.0));
  gtk_drop_down_set_selected (d->format, last_settings.format);
  gtk_drop_down_set_selected (d->paper, last_settings.paper);
  gtk_drop_down_set_selected (d->orientation, last_settings.orientation);
  gtk_spin_button_set_value (d->dpi, last_settings.dpi);
  gtk_widget_set_tooltip_text (GTK_WIDGET (d->orientation),
                               _("Automatic turns the sheets to landscape when the diagram is "
                                 "wider than tall by more than the paper's own proportion."));
  gtk_widget_set_tooltip_text (GTK_WIDGET (d->dpi),
                               _("Dots per inch of the PNG images: 150 for the screen, "
                                 "300 for a printer."));

  add_row (GTK_GRID (grid), 0, _("_Format"), GTK_WIDGET (d->format));
  add_row (GTK_GRID (grid), 1, _("_Paper"), GTK_WIDGET (d->paper));
  add_row (GTK_GRID (grid), 2, _("_Orientation"), GTK_WIDGET (d->orientation));
  d->dpi_label = add_row (GTK_GRID (grid), 3, _("_Resolution (dpi)"), GTK_WIDGET (d->dpi));
  note = gtk_label_new (_("SVG and PNG sheets after the first are saved beside the file "
                          "with -2, -3, … before the extension. Exporting again with fewer "
                          "sheets removes the numbered sheets of an earlier export that are "
                          "left over."));
  gtk_label_set_wrap (GTK_LABEL (note), TRUE);
  gtk_label_set_max_width_chars (GTK_LABEL (note), 44);
  gtk_label_set_xalign (GTK_LABEL (note), 0.0);
  gtk_widget_add_css_class (note, "dim-label");
  gtk_grid_attach (GTK_GRID (grid), note, 0, 4, 2, 1);
  gtk_box_append (GTK_BOX (gtk_dialog_get_content_area (GTK_DIALOG (dialog))), grid);

  g_signal_connect (d->format, "notify::selected", G_CALLBACK (format_changed_cb), d);
  format_changed_cb (d->format, NULL, d);
  g_signal_connect_data (dialog, "response", G_CALLBACK (dialog_response_cb), d,
                         export_dialog_free, 0);
  gtk_window_present (GTK_WINDOW (dialog));
}
