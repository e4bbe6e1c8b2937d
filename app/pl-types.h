/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-types.h: forward declarations of app/'s types and its error domain.
 *
 * Headers of app/ include this one instead of each other where a pointer is
 * all they need, so the model, the file format, the compile step and the
 * UI can name each other's types without include cycles.
 */
#pragma once

#include <glib.h>

G_BEGIN_DECLS

/* GObjects (declared with G_DECLARE_FINAL_TYPE in their own headers, which
 * repeat these typedefs; C11 allows an identical typedef twice). */
typedef struct _PlDocument PlDocument;     /* pl-document.h   */
typedef struct _PlUndoStack PlUndoStack;   /* pl-undo-stack.h */

/* Plain structures owned by a document; read through accessors. */
typedef struct _PlPart PlPart;             /* a placed part, or the scenario / title */
typedef struct _PlWire PlWire;             /* joins two ports, keeps its bend points */
typedef struct _PlNote PlNote;             /* free text on the drawing */

/* Reference-counted reversible edit (pl-command.h). */
typedef struct _PlCommand PlCommand;

/* Static tables (pl-part-type.h): never freed, safe from any thread. */
typedef struct _PlPartType PlPartType;
typedef struct _PlPortSpec PlPortSpec;
typedef struct _PlParamSpec PlParamSpec;
typedef struct _PlChoice PlChoice;

/* Values (pl-part-type.h). */
typedef struct _PlValue PlValue;

/* A point in world units: millimetres on the drawing, x to the right and y
 * downwards (the orientation of cairo and of a printed sheet). */
typedef struct
{
  double x;
  double y;
} PlPoint;

/* Errors of the document model: refused commands, bad values, unknown
 * items.  Every message is a translated sentence that names the part (by its
 * tag), the wire or note (by its id) and the field concerned. */
#define PL_DOCUMENT_ERROR (pl_document_error_quark ())
typedef enum
{
  PL_DOCUMENT_ERROR_UNKNOWN_TYPE,      /* no part type with that key */
  PL_DOCUMENT_ERROR_UNKNOWN_ITEM,      /* no part, wire or note with that id */
  PL_DOCUMENT_ERROR_UNKNOWN_PARAM,     /* the part type has no such parameter */
  PL_DOCUMENT_ERROR_UNKNOWN_PORT,      /* the part type has no such port */
  PL_DOCUMENT_ERROR_WRONG_KIND,        /* e.g. a number given for a choice */
  PL_DOCUMENT_ERROR_OUT_OF_RANGE,      /* a number outside its spec's range */
  PL_DOCUMENT_ERROR_INVALID_VALUE,     /* NaN, bad UTF-8, text too long, bad choice */
  PL_DOCUMENT_ERROR_INCONSISTENT,      /* fields that are fine alone but not
                                        * together (roughness vs. bore, ...) */
  PL_DOCUMENT_ERROR_INVALID_TAG,       /* empty, too long, control characters */
  PL_DOCUMENT_ERROR_DUPLICATE_TAG,     /* another part has that tag */
  PL_DOCUMENT_ERROR_DUPLICATE_ID,      /* an explicit id already in use */
  PL_DOCUMENT_ERROR_INVALID_ID,        /* an explicit id of the wrong form */
  PL_DOCUMENT_ERROR_SELF_WIRE,         /* a wire from a part to itself */
  PL_DOCUMENT_ERROR_DUPLICATE_WIRE,    /* the two ports are already joined */
  PL_DOCUMENT_ERROR_INVALID_GEOMETRY,  /* a non-finite or huge coordinate */
  PL_DOCUMENT_ERROR_NOT_PLACEABLE,     /* scenario / title cannot be added or removed */
  PL_DOCUMENT_ERROR_EMPTY,             /* a command with nothing to do */
  PL_DOCUMENT_ERROR_BUSY,              /* undo/redo/barrier inside an open group */
} PlDocumentError;

GQuark pl_document_error_quark (void);

G_END_DECLS
