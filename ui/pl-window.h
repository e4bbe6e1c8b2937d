/* SPDX-License-Identifier: GPL-3.0-or-later */
#pragma once

#include <gtk/gtk.h>

#include "pl-application.h"

G_BEGIN_DECLS

#define PL_TYPE_WINDOW (pl_window_get_type ())
G_DECLARE_FINAL_TYPE (PlWindow, pl_window, PL, WINDOW, GtkApplicationWindow)

PlWindow *pl_window_new (PlApplication *app);
void      pl_window_open_file (PlWindow *self,
                               GFile    *file);

G_END_DECLS
