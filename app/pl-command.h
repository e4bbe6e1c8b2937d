/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-command.h: reversible edits of a PlDocument.
 *
 * A command is made from its arguments alone (no document) and checked in
 * full against the document when it is applied: a refused command sets a
 * GError, changes nothing and emits nothing.  Once applied it remembers
 * what it replaced, so revert restores the document exactly (equal by
 * pl_document_equal(), numbers bit for bit) and a later apply (redo) gives
 * the same result as the first, with the same generated ids.
 *
 * Commands are reference counted.  PlUndoStack takes its own reference, so
 * the caller may keep one to read pl_command_get_created_id() after a push.
 * A command belongs to one document once applied; apply and revert must
 * alternate, starting with apply.
 *
 * Item ids: parts "p<N>", wires "w<N>", notes "n<N>", the pseudo parts
 * "scenario" and "title".  Where a constructor takes an explicit id (file
 * readers keep the ids of the file), NULL asks for a generated one.
 */
#pragma once

#include <glib.h>

#include "pl-types.h"

G_BEGIN_DECLS

PlCommand *pl_command_ref (PlCommand *cmd);
void pl_command_unref (PlCommand *cmd);
G_DEFINE_AUTOPTR_CLEANUP_FUNC (PlCommand, pl_command_unref)

/* Applies (or re-applies after a revert) to doc; emits "changed" once.
 * FALSE with error set and the document untouched if refused. */
gboolean pl_command_apply (PlCommand *cmd, PlDocument *doc, GError **error);
/* Undoes an applied command on the same document; emits "changed" once.
 * Cannot fail for a command that was applied and not reverted since. */
void pl_command_revert (PlCommand *cmd, PlDocument *doc);

/* Translated name of the edit for menus: "Add Hose", "Move", "Set Bore". */
const char *pl_command_get_label (PlCommand *cmd);
/* For naming an edit in menus and tooltips: adds to subjects (a table
 * from item id to the part's tag, both strings it then owns; made with
 * g_hash_table_new_full (g_str_hash, g_str_equal, g_free, g_free)) every
 * item cmd acts on.  A placed part maps to its tag as shown now (or as it
 * was when the command took it out or before it was made), a wire or a
 * note to NULL; the pseudo parts are left out. */
void pl_command_add_subjects (PlCommand *cmd, GHashTable *subjects);
/* The id the last apply created (add part / wire / note), or NULL. */
const char *pl_command_get_created_id (PlCommand *cmd);

/* Whether next may be folded into cmd (both applied, in this order): moves
 * of the same set of items, or a set of the same field of the same item.
 * Used by pl_undo_stack_push_merge(); on TRUE, cmd now stands for both and
 * next must not be reverted on its own. */
gboolean pl_command_merge (PlCommand *cmd, PlCommand *next);

/* A sequence applied in order and reverted in reverse, all or nothing: if
 * one is refused the ones before it are reverted again.  Takes a reference
 * to each of the n_commands commands. */
PlCommand *pl_command_new_sequence (const char *label, PlCommand *const *commands,
                                    guint n_commands);

/* --- parts --- */

/* A part of a placeable type at (x, y) with its type's defaults, rotation 0,
 * not mirrored, the next free tag (pl_document_next_tag).  id: NULL or an
 * unused "p<N>". */
PlCommand *pl_command_new_add_part (const char *type_key, const char *id, double x,
                                    double y);
/* The same with a tag (NULL: the next free one), rotation and mirror flag,
 * for file readers. */
PlCommand *pl_command_new_add_part_full (const char *type_key, const char *id,
                                         const char *tag, double x, double y,
                                         guint rotation, gboolean mirrored);
/* Removes parts, wires and notes by id (a part takes its wires with it);
 * revert puts every item back at its place in the lists.  Duplicates in
 * ids are ignored; an unknown id refuses the whole command. */
PlCommand *pl_command_new_remove (const char *const *ids, guint n_ids);
/* Shifts parts and notes by (dx, dy) and the bend points of wires in ids;
 * wires keep their ends on the ports of parts that move. */
PlCommand *pl_command_new_move (const char *const *ids, guint n_ids, double dx, double dy);
/* Sets a part's rotation (0..3 quarter turns clockwise) and mirror flag. */
PlCommand *pl_command_new_set_orientation (const char *part_id, guint rotation,
                                           gboolean mirrored);
/* Turns a part by quarter_turns clockwise (negative: counter-clockwise). */
PlCommand *pl_command_new_rotate (const char *part_id, int quarter_turns);
/* Flips the mirror flag of a part. */
PlCommand *pl_command_new_flip (const char *part_id);
/* A unique tag: 1 to PL_TAG_MAX_LENGTH characters of valid UTF-8, no
 * control characters, no leading or trailing white space. */
PlCommand *pl_command_new_set_tag (const char *part_id, const char *tag);

/* --- values (parts, "scenario", "title") ---
 * Refused unless the item exists, its type has the key, the kind matches
 * and the value passes pl_param_spec_check_*(). */
PlCommand *pl_command_new_set_number (const char *item_id, const char *key, double value);
PlCommand *pl_command_new_set_choice (const char *item_id, const char *key,
                                      const char *choice_key);
PlCommand *pl_command_new_set_boolean (const char *item_id, const char *key,
                                       gboolean value);
PlCommand *pl_command_new_set_text (const char *item_id, const char *key, const char *text);
/* Any kind at once (a copy of value is kept). */
PlCommand *pl_command_new_set_value (const char *item_id, const char *key,
                                     const PlValue *value);
/* Shortcuts for the two pseudo parts. */
PlCommand *pl_command_new_set_title_field (const char *key, const char *text);
PlCommand *pl_command_new_set_scenario_number (const char *key, double value);

/* --- wires --- */

/* Joins (part_a, port_a) to (part_b, port_b) with n_bends bend points
 * (copied; may be NULL when 0).  Refused for unknown parts or ports, for a
 * wire from a part to itself, and when the two ports are already joined
 * directly (in either direction).  id: NULL or an unused "w<N>". */
PlCommand *pl_command_new_add_wire (const char *id, const char *part_a, const char *port_a,
                                    const char *part_b, const char *port_b,
                                    const PlPoint *bends, guint n_bends);
/* Replaces a wire's bend points (finite, at most PL_WIRE_MAX_BENDS). */
PlCommand *pl_command_new_set_wire_bends (const char *wire_id, const PlPoint *bends,
                                          guint n_bends);

/* --- notes --- */

/* Text: valid UTF-8, at most PL_NOTE_MAX_LENGTH characters, line breaks
 * and tabs allowed, no other control characters.  id: NULL or "n<N>". */
PlCommand *pl_command_new_add_note (const char *id, double x, double y, const char *text);
PlCommand *pl_command_new_set_note_text (const char *note_id, const char *text);

G_END_DECLS
