/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-layout-writer.h: writing a document as a layout file (*.pline).
 *
 * The output is stable and diff-friendly: a fixed order of sections,
 * elements and attributes, two spaces of indent, one parameter a line,
 * every parameter of every item written (defaults too), numbers in the C
 * locale whatever the process locale.  Each number is written in one of
 * three units of its quantity (the SI system's default: mm, bar, L/min;
 * the US system's: in, psi, gal/min; or the coherent SI unit: m, Pa,
 * m3/s), the one in which the fewest significant digits read back to the
 * very same double (the first on a tie).  So a value typed as 3/8 in stays
 * "0.375" in, 9.53 mm stays "9.53" mm, and a value no conversion
 * reproduces exactly goes in the coherent unit, where 17 digits always
 * do.  Load then save therefore gives back the same document (bit for bit
 * in every number), and save, load and save gives back the same bytes.
 *
 * Comments of a file that was loaded are not kept (the document does not
 * hold them).
 */
#pragma once

#include <glib.h>

#include "pl-layout-reader.h"
#include "pl-types.h"

G_BEGIN_DECLS

/* The layout as UTF-8 XML (newly allocated, NUL-terminated; its length in
 * *length if not NULL).  NULL with PL_LAYOUT_ERROR_UNSAVABLE if a text holds
 * a character that XML 1.0 cannot carry (U+FFFE, U+FFFF or a control
 * character other than tab and line breaks), naming the item and field. */
char *pl_layout_write_data (PlDocument *doc, gsize *length, GError **error);

/* Saves the layout to filename atomically: the bytes go to a new temporary
 * file in the same folder, which is flushed to the disk (fsync) and then
 * renamed over filename, and the folder is synced so that the rename
 * lasts.  A save that fails at any step removes the temporary file and
 * leaves the old file as it was; the error (PL_LAYOUT_ERROR_IO, or
 * _UNSAVABLE) names the file.  An existing file keeps its permissions; a
 * symbolic link is followed, so the link stays and its target is
 * replaced. */
gboolean pl_layout_write_file (PlDocument *doc, const char *filename, GError **error);

G_END_DECLS
