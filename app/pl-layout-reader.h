/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-layout-reader.h: reading a layout file (*.pline) into a document.
 *
 * The format is XML of the project's own design (namespace
 * PL_LAYOUT_NAMESPACE, a "version" attribute on the root), described by the
 * RELAX NG schema app/data/pressline-layout.rng, which is compiled into the
 * program and enforced on every load.  A load goes through these stages,
 * and the first one that fails decides the message:
 *
 *  1. limits on the raw bytes: at most PL_LAYOUT_MAX_FILE_SIZE bytes, no NUL
 *     byte, valid UTF-8 (checked before any parsing);
 *  2. a safe XML parse: no network, no document type declaration at all (so
 *     no entity of any kind can be declared, expanded or fetched; the parse
 *     stops at the "<!DOCTYPE"), no XInclude processing, elements nested at
 *     most PL_LAYOUT_MAX_DEPTH deep, at most PL_LAYOUT_MAX_ELEMENTS
 *     elements, attribute values at most PL_LAYOUT_MAX_ATTRIBUTE_LENGTH
 *     bytes;
 *  3. the root: a <layout> in our namespace, and a format version this
 *     program reads (a higher one gets its own message);
 *  4. the schema;
 *  5. the content: known part types, parameters of that type, units of the
 *     right quantity, values in range, unique ids and tags, wires between
 *     existing ports, and whatever else the document's commands refuse.
 *
 * Every message is "FILE:LINE:COLUMN: sentence" (the column where the XML
 * parser gives one, "FILE:LINE: sentence" otherwise; "FILE: sentence" for
 * the file as a whole) with a translated sentence that says what was
 * expected.  Numbers are read in the C locale whatever the process locale.
 *
 * Thread safety: a load keeps all of its state in its own parser and
 * validation contexts (no global libxml2 error handler, no shared schema
 * object), so the UI and a worker thread may load at the same time.
 */
#pragma once

#include <glib.h>

#include "pl-types.h"

G_BEGIN_DECLS

/* The namespace of every element of a layout file. */
#define PL_LAYOUT_NAMESPACE "https://pressline.org/ns/layout"
/* The format this program writes and the highest it reads. */
#define PL_LAYOUT_FORMAT_VERSION 1
#define PL_LAYOUT_FILE_SUFFIX ".pline"
#define PL_LAYOUT_MIME_TYPE "application/x-pressline-layout+xml"
/* Where the schema is in the app's GResource bundle (pl_app_get_resource). */
#define PL_LAYOUT_SCHEMA_RESOURCE "/org/pressline/Pressline/app/pressline-layout.rng"

/* Limits on what a load accepts.  A real layout is a few hundred parts,
 * some 100 kB of XML and 5 levels deep (layout, parts, part, value); the
 * limits leave two orders of magnitude of room and keep a hostile file
 * from costing more than a moment and some tens of MB. */
#define PL_LAYOUT_MAX_FILE_SIZE (8u * 1024u * 1024u)   /* bytes */
#define PL_LAYOUT_MAX_DEPTH 32                         /* element levels */
#define PL_LAYOUT_MAX_ELEMENTS 100000u
#define PL_LAYOUT_MAX_ATTRIBUTE_LENGTH 1024u           /* bytes */

#define PL_LAYOUT_ERROR (pl_layout_error_quark ())
typedef enum
{
  PL_LAYOUT_ERROR_IO,               /* cannot open, read, write or rename */
  PL_LAYOUT_ERROR_TOO_LARGE,        /* more than PL_LAYOUT_MAX_FILE_SIZE */
  PL_LAYOUT_ERROR_ENCODING,         /* NUL byte, not UTF-8, another encoding */
  PL_LAYOUT_ERROR_REFUSED,          /* DOCTYPE, entities, nesting, element count,
                                     * attribute length: refused for safety */
  PL_LAYOUT_ERROR_NOT_WELL_FORMED,  /* not XML (or bad namespaces) */
  PL_LAYOUT_ERROR_NOT_A_LAYOUT,     /* another root element or namespace */
  PL_LAYOUT_ERROR_NEWER_VERSION,    /* written by a newer Pressline */
  PL_LAYOUT_ERROR_SCHEMA,           /* does not follow the schema */
  PL_LAYOUT_ERROR_CONTENT,          /* valid XML, but the content is refused */
  PL_LAYOUT_ERROR_UNSAVABLE,        /* the document holds what XML cannot */
} PlLayoutError;

GQuark pl_layout_error_quark (void);

/* A new document read from length bytes at data (need not be
 * NUL-terminated; may hold anything).  display_name names the source in
 * messages (UTF-8; NULL: "layout").  NULL with error set on failure.  The
 * document's history has not started: give it a fresh PlUndoStack. */
PlDocument *pl_layout_read_data (const char *data, gsize length, const char *display_name,
                                 GError **error);

/* The same from a file (a path in the GLib file name encoding).  Only a
 * regular file is read (a FIFO or device is refused before it could
 * block); messages name the file as given. */
PlDocument *pl_layout_read_file (const char *filename, GError **error);

/* The schema's text as compiled into the program (a new reference: unref
 * it), for tests and tools that validate with another validator. */
GBytes *pl_layout_get_schema (void);

G_END_DECLS
