/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-label-text.h: setting a label's text only when it changes.  A new
 * text is a new size request and a relayout of the window; labels that
 * follow a replay frame by frame would otherwise pay for one each frame.
 */
#pragma once

#include <gtk/gtk.h>

static inline void
pl_label_set_text_if_changed (GtkWidget *label, const char *text)
{
  if (g_strcmp0 (gtk_label_get_text (GTK_LABEL (label)), text) != 0)
    gtk_label_set_text (GTK_LABEL (label), text);
}
