/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-results-wait.c: a work order waits for the worker's full results
 * instead of solving them on the main thread.
 */
#include "config.h"

#include "pl-results-wait.h"

#include <glib/gi18n.h>

#include "pl-solve-scheduler.h"

#define WAIT_DIALOG_KEY "pl-results-wait-dialog"

typedef struct
{
  PlWindow *window;              /* a reference */
  PlSolveScheduler *scheduler;   /* a reference */
  GtkWidget *dialog;
  gulong results_id;
  gulong destroy_id;
  PlResultsReadyFunc func;
  gpointer data;
  GDestroyNotify destroy;
} Wait;

/* Full results that belong to the document as it is now, or NULL. */
static PlResults *
fresh_full (PlWindow *window)
{
  PlResults *full = pl_solve_scheduler_get_full_results (pl_window_get_scheduler (window));
  PlDocument *doc = pl_window_get_document (window);

  if (full != NULL && pl_results_get_revision (full) == pl_document_get_revision (doc)
      && pl_results_get_transient_state (full) != PL_TRANSIENT_PENDING)
    return full;
  return NULL;
}

/* Ends the wait: the dialog goes, then func runs once with results. */
static void
wait_finish (Wait *w, PlResults *results)
{
  g_autoptr (PlResults) keep = results != NULL ? pl_results_ref (results) : NULL;

  g_clear_signal_handler (&w->results_id, w->scheduler);
  if (w->dialog != NULL)
    {
      GtkWidget *dialog = g_steal_pointer (&w->dialog);

      g_clear_signal_handler (&w->destroy_id, dialog);
      g_object_set_data (G_OBJECT (w->window), WAIT_DIALOG_KEY, NULL);
      gtk_window_destroy (GTK_WINDOW (dialog));
    }
  w->func (w->window, keep, w->data);
  if (w->destroy != NULL)
    w->destroy (w->data);
  g_object_unref (w->scheduler);
  g_object_unref (w->window);
  g_free (w);
}

static void
full_results_cb (PlSolveScheduler *scheduler, PlResults *results, gpointer data)
{
  Wait *w = data;
  PlResults *full = fresh_full (w->window);

  if (full != NULL)
    wait_finish (w, full);
}

static void
response_cb (GtkDialog *dialog, int response, gpointer data)
{
  wait_finish (data, NULL);
}

/* The window closed under the dialog (destroy with parent). */
static void
dialog_destroy_cb (GtkWidget *dialog, gpointer data)
{
  Wait *w = data;

  w->destroy_id = 0;
  w->dialog = NULL;
  wait_finish (w, NULL);
}

void
pl_results_wait (PlWindow *window, const char *title, PlResultsReadyFunc func, gpointer data,
                 GDestroyNotify destroy)
{
  Wait *w;
  GtkWidget *box, *spinner, *label;
  PlResults *full;

  g_return_if_fail (PL_IS_WINDOW (window));
  g_return_if_fail (func != NULL);

  full = fresh_full (window);
  if (full != NULL)
    {
      g_autoptr (PlResults) keep = pl_results_ref (full);

      func (window, keep, data);
      if (destroy != NULL)
        destroy (data);
      return;
    }

  w = g_new0 (Wait, 1);
  w->window = g_object_ref (window);
  w->scheduler = g_object_ref (pl_window_get_scheduler (window));
  w->func = func;
  w->data = data;
  w->destroy = destroy;
  w->dialog = gtk_dialog_new_with_buttons (title, GTK_WINDOW (window),
                                           GTK_DIALOG_MODAL | GTK_DIALOG_DESTROY_WITH_PARENT,
                                           _("_Cancel"), GTK_RESPONSE_CANCEL, NULL);
  gtk_window_set_resizable (GTK_WINDOW (w->dialog), FALSE);
  box = gtk_box_new (GTK_ORIENTATION_HORIZONTAL, 12);
  gtk_widget_set_margin_start (box, 18);
  gtk_widget_set_margin_end (box, 18);
  gtk_widget_set_margin_top (box, 18);
  gtk_widget_set_margin_bottom (box, 18);
  spinner = gtk_spinner_new ();
  gtk_spinner_start (GTK_SPINNER (spinner));
  label = gtk_label_new (_("Waiting for the firing cycle and the shutdown to be solved, so "
                           "the sheets give every reading…"));
  gtk_label_set_wrap (GTK_LABEL (label), TRUE);
  gtk_label_set_max_width_chars (GTK_LABEL (label), 40);
  gtk_label_set_xalign (GTK_LABEL (label), 0.0);
  gtk_box_append (GTK_BOX (box), spinner);
  gtk_box_append (GTK_BOX (box), label);
  gtk_box_append (GTK_BOX (gtk_dialog_get_content_area (GTK_DIALOG (w->dialog))), box);
  g_signal_connect (w->dialog, "response", G_CALLBACK (response_cb), w);
  w->destroy_id = g_signal_connect (w->dialog, "destroy", G_CALLBACK (dialog_destroy_cb), w);
  w->results_id = g_signal_connect (w->scheduler, "full-results",
                                    G_CALLBACK (full_results_cb), w);
  g_object_set_data (G_OBJECT (window), WAIT_DIALOG_KEY, w->dialog);
  gtk_window_present (GTK_WINDOW (w->dialog));
}

GtkWindow *
pl_results_wait_get_dialog (PlWindow *window)
{
  g_return_val_if_fail (PL_IS_WINDOW (window), NULL);
  return g_object_get_data (G_OBJECT (window), WAIT_DIALOG_KEY);
}
