/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-json-writer.h: a small streaming JSON (RFC 8259) writer for reports.
 *
 * The writer keeps the nesting itself, so callers never place commas or
 * colons.  What it guarantees, whatever the caller hands it:
 *  - strings are valid UTF-8 (invalid bytes become U+FFFD) with '"', '\\'
 *    and every control character escaped;
 *  - numbers never depend on the process locale ('.' always) and are the
 *    shortest of %.15g / %.17g that reads back to the same double;
 *  - NaN and infinities, which JSON cannot hold, are written as null.
 * A misuse (a value where a key is due, an end without a begin) is a
 * programming error caught by g_return_if_fail and leaves the text as it
 * was; pl_json_writer_finish() then returns NULL.
 */
#pragma once

#include <glib.h>

G_BEGIN_DECLS

typedef struct _PlJsonWriter PlJsonWriter;

/* pretty: two-space indentation and a line per member; else compact. */
PlJsonWriter *pl_json_writer_new (gboolean pretty);
void pl_json_writer_free (PlJsonWriter *writer);
G_DEFINE_AUTOPTR_CLEANUP_FUNC (PlJsonWriter, pl_json_writer_free)

void pl_json_writer_begin_object (PlJsonWriter *writer);
void pl_json_writer_end_object (PlJsonWriter *writer);
void pl_json_writer_begin_array (PlJsonWriter *writer);
void pl_json_writer_end_array (PlJsonWriter *writer);

/* The name of the next member; only inside an object, before each value. */
void pl_json_writer_key (PlJsonWriter *writer, const char *key);

void pl_json_writer_string (PlJsonWriter *writer, const char *value); /* NULL: null */
void pl_json_writer_number (PlJsonWriter *writer, double value);      /* non-finite: null */
void pl_json_writer_integer (PlJsonWriter *writer, gint64 value);
void pl_json_writer_boolean (PlJsonWriter *writer, gboolean value);
void pl_json_writer_null (PlJsonWriter *writer);

/* Shortcuts: key then value. */
void pl_json_writer_member_string (PlJsonWriter *writer, const char *key, const char *value);
void pl_json_writer_member_number (PlJsonWriter *writer, const char *key, double value);
void pl_json_writer_member_integer (PlJsonWriter *writer, const char *key, gint64 value);
void pl_json_writer_member_boolean (PlJsonWriter *writer, const char *key, gboolean value);

/* The finished text (newly allocated, ends with a newline) once every
 * object and array is closed and one top-level value was written; NULL if
 * the document is incomplete or was misused.  The writer is spent. */
char *pl_json_writer_finish (PlJsonWriter *writer);

/* Appends value as a JSON string literal (quotes included) to out. */
void pl_json_append_string (GString *out, const char *value);
/* Appends value as a JSON number, or null if it is not finite. */
void pl_json_append_number (GString *out, double value);

G_END_DECLS
