/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-units.h: units of measure at the edges of the program.
 *
 * Inside, every value is SI: Pa (gauge), m^3/s, m, Pa s, m^3, kg, K, J, s,
 * Hz, kg/m^3, m^2, m/s, 1/s, m^2/Pa.  This module turns those numbers into
 * text in the unit a person wants to read (psi, gal/min, inch, ...) and reads
 * back what a person types ("7/8 in", "1-1/2 in", "2500 psi", "12,5 mm").
 * Conversion factors are those of NIST Special Publication 811 (2008
 * edition), Appendix B.8 and B.9; the table in pl-units.c names the entry of
 * each one.
 *
 * Words used here:
 *  - a quantity (PlQuantity) is what a field holds: a pressure, the bore of
 *    a hose, the length of a hose, a bulk modulus.  Several quantities may
 *    share one set of units: a bore and a hose length are both measured in
 *    units of length but default to mm and m.  pl_quantity_get_unit_kind()
 *    names the quantity whose units a quantity uses.
 *  - a unit (PlUnitId, described by a PlUnit) belongs to exactly one such
 *    unit kind.
 *  - a unit system (PlUnitSystem) picks a default unit for every quantity;
 *    PlUnitPrefs adds per-quantity overrides on top of it.
 *
 * Everything here is immutable tables plus pure functions: no global state,
 * safe from any thread (the locale's decimal separator is read with
 * localeconv() only when the caller asks for it).
 */
#pragma once

#include <glib.h>

G_BEGIN_DECLS

/* What a value means.  The order is stable only within one build: files and
 * settings store pl_quantity_get_key(), never the number. */
typedef enum
{
  PL_QUANTITY_PRESSURE,       /* gauge pressure, Pa */
  PL_QUANTITY_MODULUS,        /* bulk or elastic modulus, Pa (pressure units) */
  PL_QUANTITY_FLOW,           /* volumetric flow rate, m^3/s */
  PL_QUANTITY_LENGTH,         /* small lengths: bores, walls, roughness, m */
  PL_QUANTITY_LINE_LENGTH,    /* hose and pipe lengths, heights, m (length units) */
  PL_QUANTITY_VISCOSITY,      /* dynamic viscosity, Pa s */
  PL_QUANTITY_VOLUME,         /* m^3 */
  PL_QUANTITY_MASS,           /* kg */
  PL_QUANTITY_TEMPERATURE,    /* thermodynamic temperature, K */
  PL_QUANTITY_ENERGY,         /* J */
  PL_QUANTITY_TIME,           /* s */
  PL_QUANTITY_FREQUENCY,      /* cycle or firing rate, Hz = 1/s */
  PL_QUANTITY_DENSITY,        /* kg/m^3 */
  PL_QUANTITY_RATIO,          /* dimensionless: pump ratio, Cd, n; 1 */
  PL_QUANTITY_AREA,           /* m^2 */
  PL_QUANTITY_VELOCITY,       /* m/s */
  PL_QUANTITY_SHEAR_RATE,     /* wall shear rate, 1/s */
  PL_QUANTITY_HOSE_EXPANSION, /* volume per hose length and pressure, m^3/(m Pa) */
  PL_QUANTITY_CONSISTENCY,    /* power-law consistency K, Pa s^n (n: the flow index);
                               * viscosity units are accepted too (n = 1) */
  PL_N_QUANTITIES
} PlQuantity;

/* Every unit the program knows.  PL_UNIT_NONE (0) means "no unit chosen" in
 * PlUnitPrefs and "not found" from the look-ups.  Like PlQuantity the
 * numbers are not stable across versions: store pl_unit_get()->key. */
typedef enum
{
  PL_UNIT_NONE = 0,
  /* pressure */
  PL_UNIT_PA, PL_UNIT_KPA, PL_UNIT_MPA, PL_UNIT_GPA, PL_UNIT_BAR, PL_UNIT_PSI, PL_UNIT_KSI,
  /* flow */
  PL_UNIT_M3_PER_S, PL_UNIT_L_PER_MIN, PL_UNIT_ML_PER_S, PL_UNIT_ML_PER_MIN,
  PL_UNIT_GAL_PER_MIN,
  /* length */
  PL_UNIT_M, PL_UNIT_CM, PL_UNIT_MM, PL_UNIT_UM, PL_UNIT_IN, PL_UNIT_FT,
  /* viscosity */
  PL_UNIT_PA_S, PL_UNIT_MPA_S, PL_UNIT_CP, PL_UNIT_POISE,
  /* volume */
  PL_UNIT_M3, PL_UNIT_L, PL_UNIT_ML, PL_UNIT_GAL, PL_UNIT_IN3,
  /* mass */
  PL_UNIT_KG, PL_UNIT_G, PL_UNIT_OZ, PL_UNIT_LB,
  /* temperature */
  PL_UNIT_K, PL_UNIT_DEG_C, PL_UNIT_DEG_F,
  /* energy */
  PL_UNIT_J, PL_UNIT_KJ, PL_UNIT_FT_LBF,
  /* time */
  PL_UNIT_S, PL_UNIT_MS, PL_UNIT_MIN,
  /* frequency */
  PL_UNIT_HZ, PL_UNIT_PER_MIN,
  /* density */
  PL_UNIT_KG_PER_M3, PL_UNIT_G_PER_CM3, PL_UNIT_LB_PER_FT3,
  /* ratio */
  PL_UNIT_ONE, PL_UNIT_PERCENT,
  /* area */
  PL_UNIT_M2, PL_UNIT_MM2, PL_UNIT_IN2,
  /* velocity */
  PL_UNIT_M_PER_S, PL_UNIT_FT_PER_S,
  /* shear rate */
  PL_UNIT_PER_S,
  /* hose expansion */
  PL_UNIT_M3_PER_M_PA, PL_UNIT_ML_PER_M_BAR, PL_UNIT_CC_PER_FT_KSI,
  /* power-law consistency */
  PL_UNIT_PA_S_N, PL_UNIT_MPA_S_N,
  PL_N_UNITS
} PlUnitId;

/* One unit.  The value in SI is (value + offset) * factor; offset is zero
 * for every unit but the temperatures (degC: 273.15, degF: 459.67). */
typedef struct
{
  PlUnitId id;
  const char *key;      /* stable ASCII name for files and settings: "psi",
                         * "L/min", "mPa.s", "degC" */
  const char *symbol;   /* UTF-8 symbol to display: "mPa·s", "°C", "in³"; the
                         * empty string for PL_UNIT_ONE */
  const char *name;     /* English name, marked N_(): show it through _() */
  PlQuantity kind;      /* the unit kind: the quantity whose unit this is */
  double factor;        /* SI per unit (see above), > 0 */
  double offset;        /* added before scaling, in this unit */
} PlUnit;

typedef enum
{
  PL_UNIT_SYSTEM_SI,    /* bar, L/min, mm, mPa·s, mL, g, °C, J, ... */
  PL_UNIT_SYSTEM_US,    /* psi, gal/min, in, cP, in³, oz, °F, J, ... */
  PL_N_UNIT_SYSTEMS
} PlUnitSystem;

/* What the user chose: a system, and for any quantity a unit that replaces
 * the system's default (PL_UNIT_NONE: keep the default).  Plain data, so the
 * UI can copy it by value and keep it in GSettings through
 * pl_unit_prefs_to_string() and pl_unit_prefs_from_string(). */
typedef struct
{
  PlUnitSystem system;
  PlUnitId override[PL_N_QUANTITIES];
} PlUnitPrefs;

/* Errors of pl_unit_parse() and pl_unit_prefs_from_string().  Every message
 * is a translated sentence naming what was typed and what was expected. */
#define PL_UNIT_ERROR (pl_unit_error_quark ())
typedef enum
{
  PL_UNIT_ERROR_EMPTY,            /* nothing but white space */
  PL_UNIT_ERROR_INVALID_NUMBER,   /* no number, a malformed one, not UTF-8, too long */
  PL_UNIT_ERROR_UNKNOWN_UNIT,     /* a unit that no quantity knows */
  PL_UNIT_ERROR_WRONG_QUANTITY,   /* a known unit of another quantity */
  PL_UNIT_ERROR_DIVISION_BY_ZERO, /* a fraction over zero: "7/0 in" */
  PL_UNIT_ERROR_OUT_OF_RANGE,     /* overflow, underflow, below absolute zero */
  PL_UNIT_ERROR_NEGATIVE,         /* a sign the quantity does not allow */
} PlUnitError;

GQuark pl_unit_error_quark (void);

/* Longest text pl_unit_parse() reads, in bytes; longer text is an error
 * (nobody types a value that long, and the error names no 10 MB string). */
#define PL_UNIT_PARSE_MAX_LENGTH 256

/* The decimal_separator arguments below take '.', ',' or this value, which
 * means "the separator of the current LC_NUMERIC locale" (for what the user
 * sees and types).  Files always pass '.'. */
#define PL_UNIT_DECIMAL_FROM_LOCALE '\0'

/* Default number of significant digits of the formatters. */
#define PL_UNIT_DEFAULT_DIGITS 4

/* --- quantities --- */

/* Stable ASCII key ("pressure", "line-length", ...), or NULL if out of range. */
const char *pl_quantity_get_key (PlQuantity quantity);
/* PL_N_QUANTITIES if no quantity has that key. */
PlQuantity pl_quantity_from_key (const char *key);
/* Translated name for a label: "Pressure", "Hose or pipe length". */
const char *pl_quantity_get_name (PlQuantity quantity);
/* Translated noun phrase for sentences: "a pressure", "a length". */
const char *pl_quantity_get_phrase (PlQuantity quantity);
/* The quantity whose units this one uses (LINE_LENGTH -> LENGTH,
 * MODULUS -> PRESSURE, others -> themselves). */
PlQuantity pl_quantity_get_unit_kind (PlQuantity quantity);
/* Whether a typed value may carry a minus sign: pressures (gauge, may be
 * below atmosphere), temperatures, lengths of heights, flows (direction),
 * velocities, energies.  Sizes, volumes, masses, times and such may not. */
gboolean pl_quantity_may_be_negative (PlQuantity quantity);
/* The symbols of the units a quantity accepts, "m, cm, mm, µm, in, ft",
 * newly allocated. */
char *pl_quantity_list_units (PlQuantity quantity);

/* --- units --- */

/* The unit's description, or NULL for PL_UNIT_NONE or out of range. */
const PlUnit *pl_unit_get (PlUnitId unit);
/* The unit whose key is exactly key (as stored in files), or PL_UNIT_NONE. */
PlUnitId pl_unit_from_key (const char *key);
/* The unit that matches what a user typed ("PSI", "lbf/in²", "gpm", "\"",
 * "mPa s", "°C", ...).  Spaces, '·', '*', '.', '^' and '°' are ignored,
 * '²'/'³' read as 2/3, 'µ' as u; an exact match wins over one that differs
 * only in ASCII case.  With kind >= 0 (a PlQuantity) only units that the
 * quantity accepts are searched; with kind = -1 all.  PL_UNIT_NONE if none. */
PlUnitId pl_unit_lookup (const char *typed, int kind);
/* Whether unit is one of the units that quantity accepts. */
gboolean pl_unit_fits (PlUnitId unit, PlQuantity quantity);
/* value in unit -> SI, and SI -> unit.  NaN for PL_UNIT_NONE. */
double pl_unit_to_si (PlUnitId unit, double value);
double pl_unit_from_si (PlUnitId unit, double value_si);

/* --- systems and preferences --- */

/* "si" or "us"; NULL out of range. */
const char *pl_unit_system_get_key (PlUnitSystem system);
/* PL_N_UNIT_SYSTEMS if unknown. */
PlUnitSystem pl_unit_system_from_key (const char *key);
PlUnitId pl_unit_system_get_default (PlUnitSystem system, PlQuantity quantity);

/* A system with no overrides. */
void pl_unit_prefs_init (PlUnitPrefs *prefs, PlUnitSystem system);
/* Sets (or with PL_UNIT_NONE clears) an override; FALSE, and no change, if
 * the unit does not fit the quantity. */
gboolean pl_unit_prefs_set_unit (PlUnitPrefs *prefs, PlQuantity quantity, PlUnitId unit);
/* The unit to show a quantity in: the override, else the system's default.
 * prefs may be NULL: SI defaults. */
PlUnitId pl_unit_prefs_get_unit (const PlUnitPrefs *prefs, PlQuantity quantity);
/* "us;pressure=bar;length=mm": the system key, then one quantity=unit key
 * pair per override, separated by ';'.  Newly allocated, ASCII. */
char *pl_unit_prefs_to_string (const PlUnitPrefs *prefs);
/* Reads what pl_unit_prefs_to_string() wrote.  On error prefs is left
 * unchanged and error names the part that was not understood. */
gboolean pl_unit_prefs_from_string (PlUnitPrefs *prefs, const char *text, GError **error);

/* --- formatting --- */

/* The number alone, in unit, with digits significant digits (0: the default,
 * PL_UNIT_DEFAULT_DIGITS; at most 17), trailing zeros dropped: "172",
 * "0.0125", "2.5e-07".  Exponent form only below 1e-4 or from 1e9 on in
 * magnitude.  decimal_separator: '.', ',' or PL_UNIT_DECIMAL_FROM_LOCALE;
 * the result never depends on the process locale unless asked for it.
 * Non-finite values come out as "–" (no number); newly allocated UTF-8. */
char *pl_unit_format_number_in (double value_si, PlUnitId unit, int digits,
                                char decimal_separator);
/* The number and the unit's symbol, separated by a space ("2500 psi",
 * "20 °C"; NIST SP 811 sec. 7.2 puts a space before every symbol), or the
 * number alone for a unit whose symbol is empty. */
char *pl_unit_format_in (double value_si, PlUnitId unit, int digits, char decimal_separator);
/* The same in the unit that prefs give the quantity (prefs may be NULL). */
char *pl_unit_format_number (double value_si, PlQuantity quantity, const PlUnitPrefs *prefs,
                             int digits, char decimal_separator);
char *pl_unit_format (double value_si, PlQuantity quantity, const PlUnitPrefs *prefs,
                      int digits, char decimal_separator);

/* --- parsing --- */

/* Reads a value that a person typed and stores it in SI in *value_si.
 *
 * text: a number, then optionally a unit (with or without a space
 * between).  With no unit the number is in the unit that prefs give the
 * quantity (prefs may be NULL: SI defaults).  Numbers:
 *   - decimals "12.5", ".5", "5.", with an exponent "1.5e3", "2E-3";
 *   - fractions "7/8" and mixed numbers "1-1/2" or "1 1/2" (integers only;
 *     a mixed number's sign covers the whole: "-1-1/2" is -1.5), also with
 *     the characters "½", "¼", "¾", "⅛", "⅜", "⅝", "⅞" ("1½ in") and the
 *     fraction slash U+2044; a '/' before a non-digit belongs to the unit
 *     ("60 1/min", "120 /min");
 *   - a leading '+', '-' or '−' (U+2212) where the quantity may be negative
 *     (pl_quantity_may_be_negative()); "-0" counts as 0;
 *   - white space around and inside (spaces, tabs, no-break spaces).
 * decimal_separator: '.', ',' or PL_UNIT_DECIMAL_FROM_LOCALE (any locale
 * separator other than ',' counts as '.').  The rule for ',' and '.':
 *   - with ',' both ',' and '.' are decimal marks: "12,5" and "12.5" are
 *     12.5, and there is no thousands separator ("2,500" is 2.5);
 *   - with '.' the only decimal mark is '.', and ',' groups thousands:
 *     "2,500" and "1,234.5" read as 2500 and 1234.5; a ',' not followed by
 *     exactly three digits ("12,5") is an error, never a silent 125.
 * Results that overflow to infinity or underflow to zero in the number or in
 * the conversion are errors, as are temperatures below absolute zero, so
 * *value_si is always finite.  text is read up to its NUL and never past
 * it; bad UTF-8 is an error.  On error *value_si is left unchanged. */
gboolean pl_unit_parse (const char *text, PlQuantity quantity, const PlUnitPrefs *prefs,
                        char decimal_separator, double *value_si, GError **error);

/* The unit that pl_unit_parse() would read the text in (the typed unit or the
 * default), or PL_UNIT_NONE if text would not parse.  For a UI that keeps the
 * unit a person typed. */
PlUnitId pl_unit_parse_unit (const char *text, PlQuantity quantity, const PlUnitPrefs *prefs,
                             char decimal_separator);

G_END_DECLS
