/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-shelf.h: the parts shelf.
 *
 * One entry per placeable part type, in the order of pl-part-type.h, each
 * with the type's symbol (pl_render_type_icon) and its name, the type's
 * description as tooltip.  An entry is a drag source carrying the type key
 * as a G_TYPE_STRING; activating it (a click, Enter) arms the type.
 *
 * Signal "type-armed" (PlShelf *, const char *type_key): an entry was
 * activated (or pl_shelf_arm was called); NULL when disarmed.
 */
#pragma once

#include <gtk/gtk.h>

#include "pl-palette.h"

G_BEGIN_DECLS

#define PL_TYPE_SHELF (pl_shelf_get_type ())
G_DECLARE_FINAL_TYPE (PlShelf, pl_shelf, PL, SHELF, GtkWidget)

GtkWidget *pl_shelf_new (void);
/* Arms the type with that key (NULL: clears the choice); emits
 * "type-armed" when the choice changes.  FALSE for an unknown key. */
gboolean pl_shelf_arm (PlShelf *self, const char *type_key);
/* The armed key or NULL. */
const char *pl_shelf_get_armed (PlShelf *self);
/* How many entries the shelf shows. */
guint pl_shelf_get_n_entries (PlShelf *self);

G_END_DECLS
