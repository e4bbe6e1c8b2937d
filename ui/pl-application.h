/* SPDX-License-Identifier: GPL-3.0-or-later */
#pragma once

#include <gtk/gtk.h>

G_BEGIN_DECLS

#define PL_TYPE_APPLICATION (pl_application_get_type ())
G_DECLARE_FINAL_TYPE (PlApplication, pl_application, PL, APPLICATION, GtkApplication)

PlApplication *pl_application_new (void);
GSettings     *pl_application_get_settings (PlApplication *self);

G_END_DECLS
