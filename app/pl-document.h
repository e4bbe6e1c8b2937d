/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-document.h: a layout: parts, wires, free notes, the title block and the
 * scenario.
 *
 * Read-only from outside: every change is a PlCommand (pl-command.h),
 * applied through a PlUndoStack (or pl_command_apply() by a file reader
 * before the history starts).  After each applied or reverted command the
 * document emits "changed" once and its revision grows by one.
 *
 * Items:
 *  - a part has a stable id ("p1", "p2", ...; never reused within the
 *    document's life), a type, a tag the user sees (unique, "H3"), a
 *    position (world units, mm on the drawing), a rotation in quarter turns
 *    clockwise on the drawing (0..3), a mirror flag (mirrored across the
 *    part's vertical axis, applied before the rotation) and one value per
 *    parameter of its type;
 *  - a wire ("w1", ...) joins two ports of two different parts and keeps its
 *    bend points (world units) from the first end to the second;
 *  - a note ("n1", ...) is free text at a position;
 *  - the scenario (id "scenario") and the title block (id "title") are
 *    parts of the pseudo types of the same names: their values are read and
 *    edited like any part's (pl_part_get_number, pl_command_new_set_number).
 * Lists keep insertion order (files and equality depend on it).
 *
 * Pointers to items stay valid until the next change of the document.
 */
#pragma once

#include <glib-object.h>

#include "pl-part-type.h"
#include "pl-types.h"
#include "pressline-solver.h"

G_BEGIN_DECLS

#define PL_TYPE_DOCUMENT (pl_document_get_type ())
G_DECLARE_FINAL_TYPE (PlDocument, pl_document, PL, DOCUMENT, GObject)

/* What a change touched, the detail of "changed" (flags, or-ed over the
 * commands of a group).  A solve scheduler can skip GEOMETRY and ANNOTATION. */
typedef enum
{
  PL_CHANGE_NONE = 0,
  PL_CHANGE_TOPOLOGY = 1 << 0,    /* parts or wires added or removed */
  PL_CHANGE_PARAMETERS = 1 << 1,  /* a part's or the scenario's values */
  PL_CHANGE_GEOMETRY = 1 << 2,    /* positions, rotation, mirror, bend points */
  PL_CHANGE_ANNOTATION = 1 << 3,  /* tags, notes, title block */
  PL_CHANGE_ALL = 0xf,
} PlChange;

/* Signal "changed" (PlDocument *doc, guint change, gpointer user_data):
 * emitted once per applied or reverted command (once per group), after the
 * revision has grown; change holds PlChange flags. */

/* Limits of what a command accepts (refused beyond them, never truncated). */
#define PL_TAG_MAX_LENGTH 32          /* characters */
#define PL_NOTE_MAX_LENGTH 4000       /* characters */
#define PL_WIRE_MAX_BENDS 1000
#define PL_COORDINATE_MAX 1.0e7       /* |x|, |y| in world units (10 km of drawing) */

/* An empty layout: no parts, default scenario and title block. */
PlDocument *pl_document_new (void);
/* A deep copy with the same items, ids, id counters and values (not the
 * signal handlers; the revision is copied).  For workers: hand the copy to
 * a thread and never change it there. */
PlDocument *pl_document_copy (PlDocument *doc);
/* Whether two documents hold the same content: parts, wires and notes in
 * the same order with the same ids and fields, numbers bit-for-bit equal,
 * same scenario and title block.  Revisions and id counters are ignored. */
gboolean pl_document_equal (PlDocument *a, PlDocument *b);

/* Grows by one with every emitted "changed"; a new document has 0. */
guint64 pl_document_get_revision (PlDocument *doc);

/* --- parts --- */

guint pl_document_get_n_parts (PlDocument *doc);
/* NULL if index >= n_parts. */
const PlPart *pl_document_get_part (PlDocument *doc, guint index);
/* By id ("p3"), or "scenario" / "title"; NULL if none. */
const PlPart *pl_document_find_part (PlDocument *doc, const char *id);
/* By tag ("H3"); NULL if none. */
const PlPart *pl_document_find_part_by_tag (PlDocument *doc, const char *tag);
/* The tag a new part of this type would get: prefix + lowest number >= 1
 * that no part uses.  Newly allocated. */
char *pl_document_next_tag (PlDocument *doc, const PlPartType *type);

const PlPart *pl_document_get_scenario (PlDocument *doc);
const PlPart *pl_document_get_title (PlDocument *doc);

/* --- wires --- */

guint pl_document_get_n_wires (PlDocument *doc);
const PlWire *pl_document_get_wire (PlDocument *doc, guint index);
const PlWire *pl_document_find_wire (PlDocument *doc, const char *id);
/* The wires at one port, in document order, as a new array of borrowed
 * pointers (free the array with g_ptr_array_unref; may be empty). */
GPtrArray *pl_document_get_port_wires (PlDocument *doc, const char *part_id,
                                       const char *port_key);

/* --- notes --- */

guint pl_document_get_n_notes (PlDocument *doc);
const PlNote *pl_document_get_note (PlDocument *doc, guint index);
const PlNote *pl_document_find_note (PlDocument *doc, const char *id);

/* --- id counters (for the file format) ---
 * The number the next generated id of each kind will carry ("p<N>").
 * Explicit ids given to commands raise the counter past them. */
guint pl_document_get_next_part_number (PlDocument *doc);
guint pl_document_get_next_wire_number (PlDocument *doc);
guint pl_document_get_next_note_number (PlDocument *doc);

/* --- checks --- */

/* Cross-field rules that each value's own range cannot express (roughness
 * below half the bore, changeover shorter than half a stroke, mu_inf <= mu0,
 * on-time shorter than a cycle, a tee's branch constants above half its run
 * constants, ...): commands accept values one at a time so the user can
 * edit in any order, and this check reports what is still inconsistent.
 * FALSE with PL_DOCUMENT_ERROR_INCONSISTENT naming the part's tag and the
 * field.  prefs (may be NULL) picks the units of the message. */
gboolean pl_document_check_part (PlDocument *doc, const PlPart *part,
                                 const PlUnitPrefs *prefs, GError **error);

/* --- parts: accessors --- */

const char *pl_part_get_id (const PlPart *part);
const PlPartType *pl_part_get_part_type (const PlPart *part);
const char *pl_part_get_tag (const PlPart *part);     /* "" for scenario / title */
double pl_part_get_x (const PlPart *part);
double pl_part_get_y (const PlPart *part);
guint pl_part_get_rotation (const PlPart *part);      /* quarter turns, 0..3 */
gboolean pl_part_get_mirrored (const PlPart *part);

/* The value of a parameter (owned by the document), by key or by index
 * into the type's params; NULL if there is none. */
const PlValue *pl_part_get_value (const PlPart *part, const char *key);
const PlValue *pl_part_get_nth_value (const PlPart *part, guint index);
/* Typed shortcuts: NaN, 0, FALSE, NULL or "" when the key is unknown or
 * of another kind. */
double pl_part_get_number (const PlPart *part, const char *key);
guint pl_part_get_choice (const PlPart *part, const char *key);
const char *pl_part_get_choice_key (const PlPart *part, const char *key);  /* NULL */
gboolean pl_part_get_boolean (const PlPart *part, const char *key);
const char *pl_part_get_text (const PlPart *part, const char *key);        /* "" */
/* Whether the spec matters for the part's current choices (see depends_on). */
gboolean pl_part_param_is_relevant (const PlPart *part, const PlParamSpec *spec);

/* Where a port is on the drawing after the part's mirror, rotation and
 * position: FALSE if the type has no such port. */
gboolean pl_part_get_port_position (const PlPart *part, const char *port_key, PlPoint *out);
/* The side the port faces on the drawing after mirror and rotation. */
PlSide pl_part_get_port_side (const PlPart *part, const char *port_key);
/* Elevation of a port (m): the part's "elevation", plus the "rise" of a
 * hose or pipe at port "b". */
double pl_part_get_port_elevation (const PlPart *part, const char *port_key);

/* --- wires and notes: accessors --- */

const char *pl_wire_get_id (const PlWire *wire);
/* end is 0 or 1. */
const char *pl_wire_get_part_id (const PlWire *wire, guint end);
const char *pl_wire_get_port_key (const PlWire *wire, guint end);
/* Bend points from end 0 to end 1; *n_points may not be NULL. */
const PlPoint *pl_wire_get_bends (const PlWire *wire, guint *n_points);

const char *pl_note_get_id (const PlNote *note);
double pl_note_get_x (const PlNote *note);
double pl_note_get_y (const PlNote *note);
const char *pl_note_get_text (const PlNote *note);

/* --- solver parameters of a part ---
 * Fill the solver's structs from a part's values (SI to SI, no unit
 * conversion), checking the cross-field rules (pl_document_check_part's
 * sentence on failure, PL_DOCUMENT_ERROR_INCONSISTENT; _WRONG_KIND for a
 * part of another type).  The structs then pass the solver's validators. */
gboolean pl_part_get_line_params (const PlPart *part, pls_line_params *out, GError **error);
/* A tee's three legs, centre -> "a", centre -> "b", centre -> "branch" (see
 * pl-part-type.h for the split). */
gboolean pl_part_get_tee_legs (const PlPart *part, pls_fitting_params legs[3], GError **error);
gboolean pl_part_get_valve_params (const PlPart *part, pls_valve_params *out, GError **error);
gboolean pl_part_get_pump_params (const PlPart *part, pls_pump_params *out, GError **error);
gboolean pl_part_get_nozzle_params (const PlPart *part, pls_nozzle_params *out,
                                    GError **error);
gboolean pl_part_get_accumulator_params (const PlPart *part, pls_accumulator_params *out,
                                         GError **error);
gboolean pl_part_get_gauge_params (const PlPart *part, pls_gauge_params *out, GError **error);
/* The applicator's firing delay (s), or 0 for other parts. */
double pl_part_get_firing_delay (const PlPart *part);

/* From the scenario part: the fluid, the steady options (air state from
 * "air-on", applicators as given by the caller afterwards) and the time-
 * domain options (delays left NULL: the compile step knows the element
 * indices).  Options not in the scenario keep the solver's defaults. */
gboolean pl_scenario_get_fluid_params (const PlPart *scenario, pls_fluid_params *out,
                                       GError **error);
gboolean pl_scenario_get_steady_options (const PlPart *scenario, pls_steady_options *out,
                                         GError **error);
gboolean pl_scenario_get_transient_options (const PlPart *scenario,
                                            pls_transient_options *out, GError **error);

G_END_DECLS
