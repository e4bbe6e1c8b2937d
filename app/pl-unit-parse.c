/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-unit-parse.c: reading values with units as people type them.
 * The grammar and the rules for ',' and '.' are documented at
 * pl_unit_parse() in pl-units.h.
 */

#include "config.h"

#include "pl-units.h"
#include "pl-units-private.h"

#include <errno.h>
#include <float.h>
#include <glib/gi18n.h>
#include <math.h>
#include <string.h>

/* Longest key, symbol or alias in the tables, in bytes, with room to spare;
 * pl_unit_lookup() normalises table strings into a buffer of this size. */
#define PL_UNIT_TABLE_TEXT_MAX 64

/* --- normalising unit text --- */

/* Appends the normal form of text (see pl_unit_lookup() in pl-units.h) to
 * out, which has room for cap bytes including the NUL.  No character maps
 * to more bytes than it has in UTF-8, so strlen (text) + 1 bytes always
 * suffice.  text must be valid UTF-8. */
static void
pl_unit_normalize_into (char *out, gsize cap, const char *text)
{
  gsize n = 0;

  for (const char *p = text; *p != '\0' && n + 1 < cap; p = g_utf8_next_char (p))
    {
      gunichar c = g_utf8_get_char (p);
      const char *repl = NULL;
      gsize len;

      switch (c)
        {
        case ' ': case '\t': case '\n': case '\r': case '\v': case '\f':
        case 0x00A0: case 0x2007: case 0x2009: case 0x200A: case 0x202F:
        case '.': case '*': case '^':
        case 0x00B7: case 0x22C5:             /* middle dot, dot operator */
        case 0x00B0: case 0x00BA: case 0x02DA: /* degree and look-alikes */
          continue;
        case 0x00B2: repl = "2"; break;       /* superscripts */
        case 0x00B3: repl = "3"; break;
        case 0x00B9: repl = "1"; break;
        case 0x207B: case 0x2212: repl = "-"; break;
        case 0x00B5: case 0x03BC: repl = "u"; break;  /* micro sign, mu */
        case 0x2033: repl = "\""; break;      /* double prime: inch */
        case 0x2032: repl = "'"; break;       /* prime: foot */
        case 0x2103: repl = "C"; break;       /* degree Celsius sign */
        case 0x2109: repl = "F"; break;       /* degree Fahrenheit sign */
        case 0x2044: case 0x2215: repl = "/"; break;
        default:
          break;
        }
      if (repl == NULL)
        {
          repl = p;
          len = (gsize) (g_utf8_next_char (p) - p);
        }
      else
        len = strlen (repl);
      if (n + len + 1 > cap)
        break;
      memcpy (out + n, repl, len);
      n += len;
    }
  out[n] = '\0';
}

char *
pl_unit_normalize (const char *text)
{
  gsize cap;
  char *out;

  g_return_val_if_fail (text != NULL, NULL);
  cap = strlen (text) + 1;
  out = g_malloc (cap);
  pl_unit_normalize_into (out, cap, text);
  return out;
}

static gboolean
pl_unit_text_matches (const char *typed_normal, const char *candidate, gboolean caseless)
{
  char normal[PL_UNIT_TABLE_TEXT_MAX];

  if (candidate[0] == '\0')
    return FALSE;
  pl_unit_normalize_into (normal, sizeof normal, candidate);
  return caseless ? g_ascii_strcasecmp (typed_normal, normal) == 0
                  : strcmp (typed_normal, normal) == 0;
}

/* One pass over keys, symbols and aliases of the units that fit kind. */
static PlUnitId
pl_unit_lookup_pass (const char *typed_normal, int kind, gboolean caseless)
{
  gsize n_aliases;
  const PlUnitAlias *aliases = pl_unit_get_aliases (&n_aliases);

  for (int u = PL_UNIT_NONE + 1; u < PL_N_UNITS; u++)
    {
      const PlUnit *unit = pl_unit_get ((PlUnitId) u);

      if (kind >= 0 && !pl_unit_fits ((PlUnitId) u, (PlQuantity) kind))
        continue;
      if (pl_unit_text_matches (typed_normal, unit->key, caseless)
          || pl_unit_text_matches (typed_normal, unit->symbol, caseless))
        return (PlUnitId) u;
    }
  for (gsize i = 0; i < n_aliases; i++)
    {
      if (kind >= 0 && !pl_unit_fits (aliases[i].unit, (PlQuantity) kind))
        continue;
      if (pl_unit_text_matches (typed_normal, aliases[i].text, caseless))
        return aliases[i].unit;
    }
  return PL_UNIT_NONE;
}

PlUnitId
pl_unit_lookup (const char *typed, int kind)
{
  g_autofree char *normal = NULL;
  PlUnitId unit = PL_UNIT_NONE;

  if (typed == NULL || !g_utf8_validate (typed, -1, NULL))
    return PL_UNIT_NONE;
  if (kind >= PL_N_QUANTITIES)
    return PL_UNIT_NONE;
  normal = pl_unit_normalize (typed);
  if (normal[0] == '\0')
    return PL_UNIT_NONE;
  unit = pl_unit_lookup_pass (normal, kind, FALSE);
  if (unit == PL_UNIT_NONE)
    unit = pl_unit_lookup_pass (normal, kind, TRUE);
  return unit;
}

/* --- the number --- */

/* Rewrites what may stand for ASCII in typed text: white space of every
 * kind becomes ' ', the minus sign and en dash '-', fraction slashes '/',
 * and the vulgar fractions "½" ... "⅞" " 1/2" ... " 7/8" (with a space, so
 * "1½" reads as the mixed number "1 1/2").  Everything else is copied. */
static char *
pl_unit_canonicalize (const char *text)
{
  GString *out = g_string_sized_new (strlen (text) + 8);

  for (const char *p = text; *p != '\0'; p = g_utf8_next_char (p))
    {
      gunichar c = g_utf8_get_char (p);

      switch (c)
        {
        case '\t': case '\n': case '\r': case '\v': case '\f':
        case 0x00A0: case 0x2007: case 0x2009: case 0x200A: case 0x202F:
          g_string_append_c (out, ' ');
          break;
        case 0x2212: case 0x2013:
          g_string_append_c (out, '-');
          break;
        case 0x2044: case 0x2215:
          g_string_append_c (out, '/');
          break;
        case 0x00BC: g_string_append (out, " 1/4"); break;
        case 0x00BD: g_string_append (out, " 1/2"); break;
        case 0x00BE: g_string_append (out, " 3/4"); break;
        case 0x215B: g_string_append (out, " 1/8"); break;
        case 0x215C: g_string_append (out, " 3/8"); break;
        case 0x215D: g_string_append (out, " 5/8"); break;
        case 0x215E: g_string_append (out, " 7/8"); break;
        default:
          g_string_append_len (out, p, g_utf8_next_char (p) - p);
          break;
        }
    }
  return g_string_free (out, FALSE);
}

static const char *
pl_unit_skip_spaces (const char *p)
{
  while (*p == ' ')
    p++;
  return p;
}

/* Whether p starts "digits / digits" (spaces allowed around the '/'): the
 * fraction of a mixed number "1 1/2", as opposed to a unit such as "1/min"
 * after "60 ". */
static gboolean
pl_unit_looks_like_fraction (const char *p)
{
  if (!g_ascii_isdigit (*p))
    return FALSE;
  while (g_ascii_isdigit (*p))
    p++;
  p = pl_unit_skip_spaces (p);
  if (*p != '/')
    return FALSE;
  return g_ascii_isdigit (*pl_unit_skip_spaces (p + 1));
}

typedef enum
{
  PL_SCAN_OK,
  PL_SCAN_NONE,      /* no digit where a number must start */
  PL_SCAN_GROUPING,  /* a ',' that is neither a decimal mark nor a thousands group */
  PL_SCAN_RANGE,     /* overflow or underflow */
} PlScanResult;

/* Scans an unsigned decimal at *pp ("12", "12.5", ".5", "1,234.5",
 * "1.5e3") with the ',' rule of pl_unit_parse().  On PL_SCAN_OK stores the
 * value, whether it was a bare integer (digits only), and moves *pp past
 * it.  With integer_only, stops after the digits. */
static PlScanResult
pl_unit_scan_decimal (const char **pp, char sep, gboolean integer_only, double *value,
                      gboolean *plain_integer)
{
  /* The ASCII copy handed to g_ascii_strtod: digits, '.', 'e', sign; the
   * text is at most PL_UNIT_PARSE_MAX_LENGTH bytes and the canonical form
   * adds at most 4 bytes per 2-byte character, so this is ample. */
  char buf[4 * PL_UNIT_PARSE_MAX_LENGTH + 8];
  gsize n = 0;
  const char *p = *pp;
  int n_digits = 0;
  int group_len = 0;
  gboolean grouped = FALSE;
  gboolean plain = TRUE;
  char *end = NULL;
  double v;

  for (;;)
    {
      if (g_ascii_isdigit (*p))
        {
          buf[n++] = *p++;
          n_digits++;
          group_len++;
        }
      else if (!integer_only && sep == '.' && *p == ',' && n_digits > 0)
        {
          /* A thousands group: 1 to 3 digits before the first ',', exactly
           * 3 after each.  p[1..4] are read only while they are digits, so
           * the NUL stops the test before the end of the string. */
          if ((!grouped && group_len > 3)
              || !(g_ascii_isdigit (p[1]) && g_ascii_isdigit (p[2]) && g_ascii_isdigit (p[3])
                   && !g_ascii_isdigit (p[4])))
            return PL_SCAN_GROUPING;
          grouped = TRUE;
          plain = FALSE;
          group_len = 0;
          p++;
        }
      else
        break;
    }
  if (!integer_only && (*p == '.' || (sep == ',' && *p == ',')))
    {
      p++;
      plain = FALSE;
      buf[n++] = '.';
      while (g_ascii_isdigit (*p))
        {
          buf[n++] = *p++;
          n_digits++;
        }
    }
  if (n_digits == 0)
    return PL_SCAN_NONE;
  if (!integer_only && (*p == 'e' || *p == 'E'))
    {
      const char *q = p + 1;

      if (*q == '+' || *q == '-')
        q++;
      /* Only an 'e' followed by digits is an exponent; otherwise it starts
       * the unit text and fails there. */
      if (g_ascii_isdigit (*q))
        {
          plain = FALSE;
          buf[n++] = 'e';
          if (p[1] == '-')
            buf[n++] = '-';
          p = q;
          while (g_ascii_isdigit (*p))
            buf[n++] = *p++;
        }
    }
  buf[n] = '\0';

  errno = 0;
  v = g_ascii_strtod (buf, &end);
  if (errno == ERANGE || !isfinite (v))
    return PL_SCAN_RANGE;
  g_assert (end != NULL && *end == '\0');
  *value = v;
  *plain_integer = plain;
  *pp = p;
  return PL_SCAN_OK;
}

/* --- parsing --- */

typedef enum
{
  PL_PARSE_MSG_NOT_A_NUMBER,
  PL_PARSE_MSG_GROUPING,
} PlParseMessage;

static void
pl_unit_set_number_error (GError **error, PlParseMessage which, const char *shown,
                          PlQuantity quantity)
{
  g_autofree char *units = pl_quantity_list_units (quantity);

  if (which == PL_PARSE_MSG_GROUPING)
    g_set_error (error, PL_UNIT_ERROR, PL_UNIT_ERROR_INVALID_NUMBER,
                 /* Translators: %s is what was typed, e.g. "12,5 mm" in a locale whose
                  * decimal mark is '.'. */
                 _("“%s” is not a number here: the decimal mark is “.”, and “,” only "
                   "separates thousands, as in “2,500”."), shown);
  else
    g_set_error (error, PL_UNIT_ERROR, PL_UNIT_ERROR_INVALID_NUMBER,
                 /* Translators: the first %s is what was typed, the second a phrase such
                  * as "a length", the third a list of unit symbols. */
                 _("“%s” is not a number; %s is expected (%s)."), shown,
                 pl_quantity_get_phrase (quantity), units);
}

/* Scans a value (sign, number, fraction or mixed number) and the unit text
 * after it.  The work of pl_unit_parse() and pl_unit_parse_unit(). */
static gboolean
pl_unit_parse_internal (const char *text, PlQuantity quantity, const PlUnitPrefs *prefs,
                        char decimal_separator, double *value_si, PlUnitId *unit_out,
                        GError **error)
{
  g_autofree char *canonical = NULL;
  g_autofree char *shown = NULL;
  g_autofree char *units = NULL;
  g_autofree char *unit_text = NULL;
  const char *p;
  const char *q;
  const char *phrase;
  char sep = pl_unit_resolve_decimal (decimal_separator);
  gboolean negative = FALSE;
  gboolean plain = FALSE;
  gboolean spaced;
  double value = 0.0;
  double si;
  PlUnitId unit;
  PlScanResult scan;
  gboolean ok = FALSE;

  units = pl_quantity_list_units (quantity);
  phrase = pl_quantity_get_phrase (quantity);

  if (text == NULL || text[0] == '\0')
    goto empty;
  if (strnlen (text, PL_UNIT_PARSE_MAX_LENGTH + 1) > PL_UNIT_PARSE_MAX_LENGTH)
    {
      g_set_error (error, PL_UNIT_ERROR, PL_UNIT_ERROR_INVALID_NUMBER,
                   /* Translators: %s is a phrase such as "a length". */
                   _("The text is too long to be a value; %s is expected."), phrase);
      goto out;
    }
  if (!g_utf8_validate (text, -1, NULL))
    {
      g_set_error (error, PL_UNIT_ERROR, PL_UNIT_ERROR_INVALID_NUMBER,
                   /* Translators: %s is a phrase such as "a length". */
                   _("The text holds bytes that are not characters; %s is expected."),
                   phrase);
      goto out;
    }
  shown = g_strstrip (g_strdup (text));
  canonical = pl_unit_canonicalize (text);

  p = pl_unit_skip_spaces (canonical);
  if (*p == '\0')
    goto empty;
  if (*p == '-' || *p == '+')
    {
      negative = *p == '-';
      p = pl_unit_skip_spaces (p + 1);
    }

  scan = pl_unit_scan_decimal (&p, sep, FALSE, &value, &plain);
  if (scan != PL_SCAN_OK)
    goto bad_scan;

  q = pl_unit_skip_spaces (p);
  spaced = q != p;
  /* '/' starts a fraction only before a digit: "60 1/min" and "3 /s" end
   * in units. */
  if (*q == '/' && g_ascii_isdigit (*pl_unit_skip_spaces (q + 1)))
    {
      /* A fraction: integer over integer. */
      double denominator;
      gboolean plain_den;

      if (!plain)
        goto not_a_number;
      q = pl_unit_skip_spaces (q + 1);
      scan = pl_unit_scan_decimal (&q, sep, TRUE, &denominator, &plain_den);
      if (scan != PL_SCAN_OK)
        goto bad_scan;
      if (denominator == 0.0)
        goto division_by_zero;
      value /= denominator;
      p = q;
    }
  else if (plain && ((*q == '-' && g_ascii_isdigit (*pl_unit_skip_spaces (q + 1)))
                     || (spaced && pl_unit_looks_like_fraction (q))))
    {
      /* A mixed number, "1-1/2" or "1 1/2": whole, then a fraction. */
      double numerator;
      double denominator;
      gboolean plain_part;

      if (*q == '-')
        q = pl_unit_skip_spaces (q + 1);
      scan = pl_unit_scan_decimal (&q, sep, TRUE, &numerator, &plain_part);
      if (scan != PL_SCAN_OK)
        goto bad_scan;
      q = pl_unit_skip_spaces (q);
      if (*q != '/')
        goto not_a_number;
      q = pl_unit_skip_spaces (q + 1);
      scan = pl_unit_scan_decimal (&q, sep, TRUE, &denominator, &plain_part);
      if (scan != PL_SCAN_OK)
        goto bad_scan;
      if (denominator == 0.0)
        goto division_by_zero;
      value += numerator / denominator;
      p = q;
    }

  /* What is left is the unit.  Unless it is one ("1/min"), it may not
   * start like more of a number ("1/2/3", "1/2 1/2", "3..5", "5-3",
   * "1 500"): that is a malformed number, not an unknown unit. */
  p = pl_unit_skip_spaces (p);
  unit_text = g_strchomp (g_strdup (p));
  if ((g_ascii_isdigit (*p) || (*p != '\0' && strchr ("+-.,/", *p) != NULL))
      && pl_unit_lookup (unit_text, -1) == PL_UNIT_NONE)
    goto not_a_number;

  if (unit_text[0] == '\0')
    unit = pl_unit_prefs_get_unit (prefs, quantity);
  else
    {
      unit = pl_unit_lookup (unit_text, quantity);
      if (unit == PL_UNIT_NONE)
        {
          PlUnitId other = pl_unit_lookup (unit_text, -1);

          if (other != PL_UNIT_NONE)
            g_set_error (error, PL_UNIT_ERROR, PL_UNIT_ERROR_WRONG_QUANTITY,
                         /* Translators: "“22 psi” is a pressure; a length is expected (mm, m,
                          * in, ft)."  The first %s is what was typed, the second and third
                          * phrases such as "a pressure", the fourth a list of symbols. */
                         _("“%s” is %s; %s is expected (%s)."), shown,
                         pl_quantity_get_phrase (pl_unit_get (other)->kind), phrase, units);
          else
            g_set_error (error, PL_UNIT_ERROR, PL_UNIT_ERROR_UNKNOWN_UNIT,
                         /* Translators: "In “3 furlongs”, “furlongs” is not a unit that
                          * Pressline knows; a length is expected (mm, m, in, ft)." */
                         _("In “%s”, “%s” is not a unit that Pressline knows; "
                           "%s is expected (%s)."), shown, unit_text, phrase, units);
          goto out;
        }
    }

  if (negative && value != 0.0 && !pl_quantity_may_be_negative (quantity))
    {
      g_set_error (error, PL_UNIT_ERROR, PL_UNIT_ERROR_NEGATIVE,
                   /* Translators: "“-3 mL” is negative; a volume cannot be negative." */
                   _("“%s” is negative; %s cannot be negative."), shown, phrase);
      goto out;
    }
  if (negative)
    value = -value;

  si = pl_unit_to_si (unit, value);
  if (!isfinite (si)
      || (pl_unit_get (unit)->offset == 0.0 && value != 0.0 && fabs (si) < DBL_MIN))
    goto out_of_range;
  if (pl_unit_get (unit)->kind == PL_QUANTITY_TEMPERATURE && si < 0.0)
    {
      g_set_error (error, PL_UNIT_ERROR, PL_UNIT_ERROR_OUT_OF_RANGE,
                   /* Translators: %s is what was typed, e.g. "-300 °C". */
                   _("“%s” is below absolute zero."), shown);
      goto out;
    }

  if (value_si != NULL)
    *value_si = si + 0.0;  /* + 0.0 turns -0 into 0 */
  if (unit_out != NULL)
    *unit_out = unit;
  ok = TRUE;
  goto out;

bad_scan:
  if (scan == PL_SCAN_RANGE)
    goto out_of_range;
  pl_unit_set_number_error (error, scan == PL_SCAN_GROUPING ? PL_PARSE_MSG_GROUPING
                                                            : PL_PARSE_MSG_NOT_A_NUMBER,
                            shown, quantity);
  goto out;
not_a_number:
  pl_unit_set_number_error (error, PL_PARSE_MSG_NOT_A_NUMBER, shown, quantity);
  goto out;
division_by_zero:
  g_set_error (error, PL_UNIT_ERROR, PL_UNIT_ERROR_DIVISION_BY_ZERO,
               /* Translators: %s is what was typed, e.g. "7/0 in". */
               _("“%s” divides by zero."), shown);
  goto out;
out_of_range:
  g_set_error (error, PL_UNIT_ERROR, PL_UNIT_ERROR_OUT_OF_RANGE,
               /* Translators: %s is what was typed, e.g. "1e999 psi". */
               _("“%s” is too large or too small a number."), shown);
  goto out;
empty:
  g_set_error (error, PL_UNIT_ERROR, PL_UNIT_ERROR_EMPTY,
               /* Translators: the first %s is a phrase such as "a length", the second a
                * list of unit symbols. */
               _("No value was typed; %s is expected (%s)."), phrase, units);
out:
  return ok;
}

gboolean
pl_unit_parse (const char *text, PlQuantity quantity, const PlUnitPrefs *prefs,
               char decimal_separator, double *value_si, GError **error)
{
  g_return_val_if_fail ((int) quantity >= 0 && quantity < PL_N_QUANTITIES, FALSE);
  g_return_val_if_fail (value_si != NULL, FALSE);
  g_return_val_if_fail (error == NULL || *error == NULL, FALSE);

  return pl_unit_parse_internal (text, quantity, prefs, decimal_separator, value_si, NULL,
                                 error);
}

PlUnitId
pl_unit_parse_unit (const char *text, PlQuantity quantity, const PlUnitPrefs *prefs,
                    char decimal_separator)
{
  PlUnitId unit = PL_UNIT_NONE;

  g_return_val_if_fail ((int) quantity >= 0 && quantity < PL_N_QUANTITIES, PL_UNIT_NONE);
  if (!pl_unit_parse_internal (text, quantity, prefs, decimal_separator, NULL, &unit, NULL))
    return PL_UNIT_NONE;
  return unit;
}
