/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-part-type.h: the kinds of part a layout is drawn from, their ports and
 * their typed parameters.
 *
 * Every table here is static and immutable (safe from any thread).  Keys
 * (type, port, parameter and choice keys) are stable ASCII strings: files
 * store them, never an index or an enum value.  Labels, names and help
 * sentences are English marked with N_(): show them through _().
 *
 * Numbers are SI (the unit of their PlQuantity, see pl-units.h) and every
 * numeric parameter names its quantity, so the inspector shows it in the
 * user's units and pl_unit_parse() reads what the user types.
 *
 * The hydraulic model of each type (what the compile step turns it into):
 *  - pump: air-driven ratio pump with an outlet check valve.  One port,
 *    "out": the pump draws from its own supply drum, a fixed node at 0 Pa
 *    gauge at the pump's elevation (a drum under a ratio pump is open to
 *    the air; modelling the suction side would add a free node that the
 *    pump could pull below vacuum, which the steady law does not describe).
 *  - hose and pipe: a line from port "a" (at the part's elevation) to port
 *    "b" (at elevation + rise).
 *  - tee: three ports "a", "b" (the run) and "branch", joined at an internal
 *    centre node by three Hooper 2-K fittings: each run leg gets half the
 *    run constants, the branch leg the branch constants less half the run
 *    constants, so a path a -> b sees K_run and a -> branch sees K_branch
 *    (a star split of the published through-run and branch figures).
 *  - accumulator, gauge, applicator, drain: one port ("p", "p", "in", "p").
 *    A drain or tank is a fixed node at 0 Pa gauge; its elevation is that of
 *    the free surface.  An applicator discharges to the atmosphere.
 *  - ball valve "a" -> "b", dump valve "in" -> "out" (normally open,
 *    air-piloted shut).  A dump valve whose "out" port carries no wire
 *    returns to the supply drum: a fixed 0 Pa node at its elevation.
 *  - Ports joined by wires, directly or through other ports, form one
 *    hydraulic node (an ideal junction with no loss); a port may carry
 *    several wires.  A port with no wire is capped.
 */
#pragma once

#include <glib.h>

#include "pl-types.h"
#include "pl-units.h"

G_BEGIN_DECLS

/* The kinds of part.  Switch on this, store the type's key. */
typedef enum
{
  PL_PART_PUMP,
  PL_PART_HOSE,
  PL_PART_PIPE,
  PL_PART_TEE,
  PL_PART_ACCUMULATOR,
  PL_PART_DUMP_VALVE,
  PL_PART_BALL_VALVE,
  PL_PART_APPLICATOR,
  PL_PART_GAUGE,
  PL_PART_DRAIN,
  /* Not placeable: one of each in every document, edited like a part. */
  PL_PART_SCENARIO,
  PL_PART_TITLE,
  PL_N_PART_KINDS
} PlPartKind;

/* The side of a part's symbol a port faces, before rotation and mirroring. */
typedef enum
{
  PL_SIDE_EAST,   /* +x */
  PL_SIDE_SOUTH,  /* +y (down on the drawing) */
  PL_SIDE_WEST,   /* -x */
  PL_SIDE_NORTH,  /* -y */
} PlSide;

struct _PlPortSpec
{
  const char *key;     /* "in", "out", "a", "b", "branch", "p" */
  const char *label;   /* N_(): "Inlet", "End A", ... */
  double x, y;         /* position relative to the part's origin, world units
                        * (mm on the drawing), before rotation and mirror */
  PlSide side;         /* where a wire leaves the port */
};

typedef enum
{
  PL_PARAM_NUMBER,     /* double, SI, in a range */
  PL_PARAM_CHOICE,     /* one of a list of keys */
  PL_PARAM_BOOLEAN,
  PL_PARAM_TEXT,       /* UTF-8 */
} PlParamKind;

/* How a number may meet one end of its range. */
typedef enum
{
  PL_BOUND_NONE,       /* unbounded on this side (but always finite) */
  PL_BOUND_CLOSED,     /* the limit itself is allowed */
  PL_BOUND_OPEN,       /* strictly beyond the limit */
} PlBound;

struct _PlChoice
{
  const char *key;     /* stable ASCII: "newtonian", "power-law" */
  const char *label;   /* N_() */
};

struct _PlParamSpec
{
  const char *key;     /* stable ASCII, used in files: "bore", "rated-pressure" */
  const char *label;   /* N_(): "Bore" (capitalised, no unit: the unit follows
                        * the user's preferences) */
  const char *help;    /* N_(): one sentence for a tooltip */
  PlParamKind kind;

  /* PL_PARAM_NUMBER */
  PlQuantity quantity;
  double default_number;     /* SI, inside the range */
  PlBound min_bound;
  double min;                /* SI, read unless min_bound is NONE */
  PlBound max_bound;
  double max;                /* SI, read unless max_bound is NONE */
  const char *range_note;    /* N_() or NULL: why the range is what it is,
                              * appended to a refusal ("0 means not rated.") */

  /* PL_PARAM_CHOICE */
  const PlChoice *choices;
  guint n_choices;
  guint default_choice;      /* index into choices */

  /* PL_PARAM_BOOLEAN */
  gboolean default_boolean;

  /* PL_PARAM_TEXT */
  const char *default_text;  /* never NULL for a text parameter */
  guint max_length;          /* in characters, > 0 */
  gboolean multiline;        /* whether line breaks are allowed */

  /* Relevance for the inspector: when depends_on names a choice parameter
   * of the same type, this one matters only while that choice's index i has
   * bit (1 << i) set in depends_mask (e.g. the consistency K only for the
   * power law).  NULL: always relevant.  Irrelevant values are still kept,
   * validated and saved. */
  const char *depends_on;
  guint depends_mask;
};

/* A parameter's value.  text is owned by whoever owns the PlValue (the
 * document for values read from a part; the caller otherwise). */
struct _PlValue
{
  PlParamKind kind;
  double number;       /* NUMBER: SI */
  guint choice;        /* CHOICE: index into the spec's choices */
  gboolean boolean;    /* BOOLEAN */
  char *text;          /* TEXT: UTF-8, never NULL in a part */
};

struct _PlPartType
{
  PlPartKind kind;
  const char *key;           /* stable ASCII: "pump", "hose", "pipe", "tee",
                              * "accumulator", "dump-valve", "ball-valve",
                              * "applicator", "gauge", "drain"; "scenario",
                              * "title" for the two pseudo types */
  const char *name;          /* N_(): "Pump" */
  const char *description;   /* N_(): one sentence for the parts shelf */
  const char *tag_prefix;    /* ASCII letters: tags are prefix + number */
  gboolean placeable;        /* FALSE for the scenario and the title block */
  const PlPortSpec *ports;
  guint n_ports;
  const PlParamSpec *params;
  guint n_params;
  /* Extent of the symbol around the origin, world units (mm), before
   * rotation: a box from (-half_width, -half_height) to (+, +). */
  double half_width, half_height;
};

/* Tag prefixes (distinct; a tag is the prefix and a number, so "D1" and
 * "DV1" cannot be confused):
 *   pump P, hose H, pipe R (rigid), tee T, accumulator A, dump valve DV,
 *   ball valve BV, applicator N (nozzle), gauge G, drain D. */

/* --- types --- */

/* The placeable types in shelf order: 0 <= index < pl_part_type_get_n_placeable(). */
guint pl_part_type_get_n_placeable (void);
const PlPartType *pl_part_type_get_placeable (guint index);
/* Any type (placeable or not) by kind; NULL out of range. */
const PlPartType *pl_part_type_get (PlPartKind kind);
/* By key; NULL for an unknown key or NULL. */
const PlPartType *pl_part_type_lookup (const char *key);

/* The parameter with that key and its index (may be NULL), or NULL. */
const PlParamSpec *pl_part_type_find_param (const PlPartType *type, const char *key,
                                            guint *index);
/* The port with that key and its index (may be NULL), or NULL. */
const PlPortSpec *pl_part_type_find_port (const PlPartType *type, const char *key,
                                          guint *index);

/* --- parameter specs --- */

/* Index of the choice with that key, or -1. */
int pl_param_spec_find_choice (const PlParamSpec *spec, const char *key);

/* The spec's default into *value (text newly allocated: clear with
 * pl_value_clear()). */
void pl_param_spec_default_value (const PlParamSpec *spec, PlValue *value);

/* Whether a number is finite and inside the spec's range.  On refusal a
 * translated sentence naming the field and the limit in the units that
 * prefs give the quantity (prefs may be NULL: SI defaults), for example
 * "Bore must be more than 0 mm.", followed by the range note if any.
 * PL_DOCUMENT_ERROR_OUT_OF_RANGE, or _INVALID_VALUE for NaN or infinity,
 * or _WRONG_KIND if the spec is no number. */
gboolean pl_param_spec_check_number (const PlParamSpec *spec, double value,
                                     const PlUnitPrefs *prefs, GError **error);
/* Whether text is valid UTF-8, within max_length characters, without
 * control characters (line breaks allowed only if multiline). */
gboolean pl_param_spec_check_text (const PlParamSpec *spec, const char *text, GError **error);
/* Any kind: the value has the spec's kind and passes the checks above (a
 * choice index below n_choices). */
gboolean pl_param_spec_check_value (const PlParamSpec *spec, const PlValue *value,
                                    const PlUnitPrefs *prefs, GError **error);

/* --- values --- */

void pl_value_copy (const PlValue *src, PlValue *dest);   /* dest uninitialised */
void pl_value_clear (PlValue *value);                      /* frees text */
/* Same kind and same value; numbers compare exactly with == (values in a
 * document are never NaN), which is what undo and a file round trip must
 * reproduce. */
gboolean pl_value_equal (const PlValue *a, const PlValue *b);

G_END_DECLS
