/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-units-private.h: what pl-units.c and pl-unit-parse.c share, and what
 * the tests look at; not for the rest of the program.
 */
#pragma once

#include "pl-units.h"

G_BEGIN_DECLS

/* One more spelling of a unit for pl_unit_lookup(). */
typedef struct
{
  PlUnitId unit;
  const char *text;
} PlUnitAlias;

/* The alias table (static storage); *n_aliases receives its length. */
const PlUnitAlias *pl_unit_get_aliases (gsize *n_aliases);

/* '.' or ',': decimal_separator itself, or for PL_UNIT_DECIMAL_FROM_LOCALE
 * (or anything else) the current LC_NUMERIC locale's. */
char pl_unit_resolve_decimal (char decimal_separator);

/* The form in which typed unit text is compared (see pl_unit_lookup()):
 * newly allocated; text must be valid UTF-8. */
char *pl_unit_normalize (const char *text);

G_END_DECLS
