/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-file-ops.c: new, open, save, save as, recent files and the
 * confirmation before unsaved changes are discarded.
 */

#include "config.h"

#include <glib/gi18n.h>

#include "pl-layout-reader.h"
#include "pl-window-private.h"

typedef struct
{
  PlWindow *window;          /* a reference */
  PlWindowThen then;
  gpointer data;
  GDestroyNotify destroy;
} Pending;

static Pending *
pending_new (PlWindow *self, PlWindowThen then, gpointer data, GDestroyNotify destroy)
{
  Pending *p = g_new0 (Pending, 1);

  p->window = g_object_ref (self);
  p->then = then;
  p->data = data;
  p->destroy = destroy;
  return p;
}

static void
pending_free (Pending *p)
{
  if (p->destroy != NULL && p->data != NULL)
    p->destroy (p->data);
  g_object_unref (p->window);
  g_free (p);
}

static void
pending_run (Pending *p)
{
  if (p->then != NULL)
    p->then (p->window, p->data);
}

static void
dialog_response_cb (GtkDialog *dialog, int response, gpointer user_data)
{
  gtk_window_destroy (GTK_WINDOW (dialog));
}

void
pl_file_ops_show_error (PlWindow   *self,
                        const char *primary,
                        const char *secondary)
{
  GtkWidget *dialog;

  dialog = gtk_message_dialog_new (GTK_WINDOW (self),
                                   GTK_DIALOG_MODAL | GTK_DIALOG_DESTROY_WITH_PARENT,
                                   GTK_MESSAGE_ERROR, GTK_BUTTONS_CLOSE, "%s", primary);
  gtk_message_dialog_format_secondary_text (GTK_MESSAGE_DIALOG (dialog), "%s", secondary);
  g_signal_connect (dialog, "response", G_CALLBACK (dialog_response_cb), NULL);
  gtk_window_present (GTK_WINDOW (dialog));
}

static GtkFileFilter *
layout_filter (void)
{
  GtkFileFilter *filter = gtk_file_filter_new ();

  gtk_file_filter_set_name (filter, _("Pressline layouts"));
  gtk_file_filter_add_pattern (filter, "*" PL_LAYOUT_FILE_SUFFIX);
  gtk_file_filter_add_mime_type (filter, PL_LAYOUT_MIME_TYPE);
  return filter;
}

/* --- save as (with a step to take after a good save) --- */

static void
save_as_response_cb (GtkNativeDialog *native,
                     int              response,
                     gpointer         user_data)
{
  Pending *p = user_data;
  PlWindow *self = p->window;

  self->in_dialog = FALSE;
  if (response == GTK_RESPONSE_ACCEPT)
    {
      g_autoptr (GFile) chosen = gtk_file_chooser_get_file (GTK_FILE_CHOOSER (native));
      g_autoptr (GFile) file = NULL;
      g_autoptr (GError) error = NULL;
      g_autofree char *base = chosen != NULL ? g_file_get_basename (chosen) : NULL;

      /* The suffix lets the file manager and the open dialog find it. */
      if (base != NULL && !g_str_has_suffix (base, PL_LAYOUT_FILE_SUFFIX))
        {
          g_autofree char *name = g_strconcat (base, PL_LAYOUT_FILE_SUFFIX, NULL);
          g_autoptr (GFile) parent = g_file_get_parent (chosen);
          file = g_file_get_child (parent, name);
        }
      else
        file = g_steal_pointer (&chosen);
      if (file != NULL)
        {
          if (pl_window_save_to_file (self, file, &error))
            pending_run (p);
          else
            pl_file_ops_show_error (self, _("The layout could not be saved"), error->message);
        }
    }
  pending_free (p);
  g_object_unref (native);
}

static void
save_as_then (PlWindow *self, PlWindowThen then, gpointer data, GDestroyNotify destroy)
{
  GtkFileChooserNative *native;
  g_autoptr (GtkFileFilter) filter = layout_filter ();

  native = gtk_file_chooser_native_new (_("Save Layout"), GTK_WINDOW (self),
                                        GTK_FILE_CHOOSER_ACTION_SAVE, _("_Save"),
                                        _("_Cancel"));
  gtk_native_dialog_set_modal (GTK_NATIVE_DIALOG (native), TRUE);
  gtk_file_chooser_add_filter (GTK_FILE_CHOOSER (native), filter);
  if (self->file != NULL)
    gtk_file_chooser_set_file (GTK_FILE_CHOOSER (native), self->file, NULL);
  else
    gtk_file_chooser_set_current_name (GTK_FILE_CHOOSER (native),
                                       _("Untitled layout.pline"));
  g_signal_connect (native, "response", G_CALLBACK (save_as_response_cb),
                    pending_new (self, then, data, destroy));
  self->in_dialog = TRUE;
  gtk_native_dialog_show (GTK_NATIVE_DIALOG (native));
}

static void
save_then (PlWindow *self, PlWindowThen then, gpointer data, GDestroyNotify destroy)
{
  g_autoptr (GError) error = NULL;

  if (self->file == NULL)
    {
      save_as_then (self, then, data, destroy);
      return;
    }
  if (pl_window_save_to_file (self, self->file, &error))
    {
      if (then != NULL)
        then (self, data);
    }
  else
    pl_file_ops_show_error (self, _("The layout could not be saved"), error->message);
  if (destroy != NULL && data != NULL)
    destroy (data);
}

void
pl_file_ops_save (PlWindow *self)
{
  save_then (self, NULL, NULL, NULL);
}

void
pl_file_ops_save_as (PlWindow *self)
{
  save_as_then (self, NULL, NULL, NULL);
}

/* --- confirm discard --- */

static void
confirm_response_cb (GtkDialog *dialog,
                     int        response,
                     gpointer   user_data)
{
  Pending *p = user_data;
  PlWindow *self = p->window;

  gtk_window_destroy (GTK_WINDOW (dialog));
  self->in_dialog = FALSE;
  switch (response)
    {
    case GTK_RESPONSE_REJECT:      /* discard */
      pending_run (p);
      pending_free (p);
      break;
    case GTK_RESPONSE_ACCEPT:      /* save first */
      /* The pending step moves on to the save. */
      save_then (self, p->then, p->data, p->destroy);
      p->data = NULL;
      pending_free (p);
      break;
    default:                       /* cancel, closed */
      pending_free (p);
      break;
    }
}

void
pl_file_ops_confirm_discard (PlWindow       *self,
                             PlWindowThen    then,
                             gpointer        data,
                             GDestroyNotify  destroy)
{
  GtkWidget *dialog;
  g_autofree char *name = NULL;

  if (!pl_window_get_dirty (self))
    {
      if (then != NULL)
        then (self, data);
      if (destroy != NULL && data != NULL)
        destroy (data);
      return;
    }
  if (self->file != NULL)
    {
      g_autofree char *path = g_file_get_path (self->file);
      name = path != NULL ? g_filename_display_basename (path)
                          : g_file_get_basename (self->file);
    }
  else
    name = g_strdup (_("Untitled layout"));
  dialog = gtk_message_dialog_new (GTK_WINDOW (self),
                                   GTK_DIALOG_MODAL | GTK_DIALOG_DESTROY_WITH_PARENT,
                                   GTK_MESSAGE_QUESTION, GTK_BUTTONS_NONE,
                                   _("Save the changes to “%s”?"), name);
  gtk_message_dialog_format_secondary_text (GTK_MESSAGE_DIALOG (dialog), "%s",
                                            _("Unsaved changes are lost if you go on "
                                              "without saving."));
  gtk_dialog_add_buttons (GTK_DIALOG (dialog), _("_Cancel"), GTK_RESPONSE_CANCEL,
                          _("_Discard Changes"), GTK_RESPONSE_REJECT, _("_Save"),
                          GTK_RESPONSE_ACCEPT, NULL);
  gtk_dialog_set_default_response (GTK_DIALOG (dialog), GTK_RESPONSE_ACCEPT);
  gtk_widget_add_css_class (gtk_dialog_get_widget_for_response (GTK_DIALOG (dialog),
                                                                GTK_RESPONSE_REJECT),
                            "destructive-action");
  g_signal_connect (dialog, "response", G_CALLBACK (confirm_response_cb),
                    pending_new (self, then, data, destroy));
  self->in_dialog = TRUE;
  gtk_window_present (GTK_WINDOW (dialog));
}

/* --- new, open --- */

static void
new_then (PlWindow *self, gpointer data)
{
  g_autoptr (PlDocument) doc = pl_document_new ();

  g_clear_object (&self->file);
  pl_window_set_document (self, doc, NULL);
}

void
pl_file_ops_new (PlWindow *self)
{
  pl_file_ops_confirm_discard (self, new_then, NULL, NULL);
}

static void
open_response_cb (GtkNativeDialog *native,
                  int              response,
                  gpointer         user_data)
{
  PlWindow *self = PL_WINDOW (user_data);

  self->in_dialog = FALSE;
  if (response == GTK_RESPONSE_ACCEPT)
    {
      g_autoptr (GFile) file = gtk_file_chooser_get_file (GTK_FILE_CHOOSER (native));
      if (file != NULL)
        pl_window_open_file (self, file);
    }
  g_object_unref (native);
  g_object_unref (self);
}

static void
open_then (PlWindow *self, gpointer data)
{
  GtkFileChooserNative *native;
  g_autoptr (GtkFileFilter) filter = layout_filter ();

  native = gtk_file_chooser_native_new (_("Open Layout"), GTK_WINDOW (self),
                                        GTK_FILE_CHOOSER_ACTION_OPEN, _("_Open"),
                                        _("_Cancel"));
  gtk_native_dialog_set_modal (GTK_NATIVE_DIALOG (native), TRUE);
  gtk_file_chooser_add_filter (GTK_FILE_CHOOSER (native), filter);
  g_signal_connect (native, "response", G_CALLBACK (open_response_cb), g_object_ref (self));
  self->in_dialog = TRUE;
  gtk_native_dialog_show (GTK_NATIVE_DIALOG (native));
}

void
pl_file_ops_open (PlWindow *self)
{
  pl_file_ops_confirm_discard (self, open_then, NULL, NULL);
}

static void
open_uri_then (PlWindow *self, gpointer data)
{
  g_autoptr (GFile) file = g_file_new_for_uri (data);

  pl_window_open_file (self, file);
}

void
pl_file_ops_open_uri (PlWindow   *self,
                      const char *uri)
{
  pl_file_ops_confirm_discard (self, open_uri_then, g_strdup (uri), g_free);
}

/* --- recent files --- */

void
pl_file_ops_add_recent (PlWindow *self,
                        GFile    *file)
{
  g_autofree char *uri = g_file_get_uri (file);
  g_auto (GStrv) old = NULL;
  g_autoptr (GStrvBuilder) builder = NULL;
  g_auto (GStrv) list = NULL;
  guint n = 1;

  if (self->settings == NULL)
    return;
  old = g_settings_get_strv (self->settings, "recent-files");
  builder = g_strv_builder_new ();
  g_strv_builder_add (builder, uri);
  for (guint i = 0; old[i] != NULL && n < PL_RECENT_MAX; i++)
    if (g_strcmp0 (old[i], uri) != 0)
      {
        g_strv_builder_add (builder, old[i]);
        n++;
      }
  list = g_strv_builder_end (builder);
  g_settings_set_strv (self->settings, "recent-files", (const char *const *) list);
}

void
pl_file_ops_rebuild_recent (PlWindow *self)
{
  g_auto (GStrv) list = NULL;

  g_menu_remove_all (self->recent_section);
  if (self->settings == NULL)
    return;
  list = g_settings_get_strv (self->settings, "recent-files");
  for (guint i = 0; list[i] != NULL && i < PL_RECENT_MAX; i++)
    {
      g_autoptr (GFile) file = g_file_new_for_uri (list[i]);
      g_autofree char *path = g_file_get_path (file);
      g_autofree char *label = path != NULL ? g_filename_display_basename (path)
                                            : g_file_get_basename (file);
      g_autoptr (GMenuItem) item = g_menu_item_new (label, NULL);

      /* Underscores in file names are not mnemonics. */
      g_menu_item_set_attribute (item, "use-markup", "b", FALSE);
      g_menu_item_set_action_and_target_value (item, "win.open-recent",
                                               g_variant_new_string (list[i]));
      g_menu_append_item (self->recent_section, item);
    }
}
