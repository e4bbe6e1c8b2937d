/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-part-type.c: look-ups in the part type tables, parameter checks and
 * values.  The tables themselves are in pl-part-types.c.
 */
#include "config.h"

#include "pl-part-type.h"

#include <glib/gi18n.h>
#include <math.h>
#include <string.h>

const PlParamSpec *
pl_part_type_find_param (const PlPartType *type, const char *key, guint *index)
{
  g_return_val_if_fail (type != NULL, NULL);
  if (key == NULL)
    return NULL;
  /* Called for every value of every part on each compile: the first
   * letter settles most mismatches without a call. */
  for (guint i = 0; i < type->n_params; i++)
    if (type->params[i].key[0] == key[0] && strcmp (type->params[i].key, key) == 0)
      {
        if (index != NULL)
          *index = i;
        return &type->params[i];
      }
  return NULL;
}

const PlPortSpec *
pl_part_type_find_port (const PlPartType *type, const char *key, guint *index)
{
  g_return_val_if_fail (type != NULL, NULL);
  if (key == NULL)
    return NULL;
  for (guint i = 0; i < type->n_ports; i++)
    if (type->ports[i].key[0] == key[0] && strcmp (type->ports[i].key, key) == 0)
      {
        if (index != NULL)
          *index = i;
        return &type->ports[i];
      }
  return NULL;
}

int
pl_param_spec_find_choice (const PlParamSpec *spec, const char *key)
{
  g_return_val_if_fail (spec != NULL, -1);
  if (key == NULL || spec->kind != PL_PARAM_CHOICE)
    return -1;
  for (guint i = 0; i < spec->n_choices; i++)
    if (g_str_equal (spec->choices[i].key, key))
      return (int) i;
  return -1;
}

void
pl_param_spec_default_value (const PlParamSpec *spec, PlValue *value)
{
  g_return_if_fail (spec != NULL && value != NULL);
  memset (value, 0, sizeof *value);
  value->kind = spec->kind;
  switch (spec->kind)
    {
    case PL_PARAM_NUMBER:
      value->number = spec->default_number;
      break;
    case PL_PARAM_CHOICE:
      value->choice = spec->default_choice;
      break;
    case PL_PARAM_BOOLEAN:
      value->boolean = spec->default_boolean;
      break;
    case PL_PARAM_TEXT:
      value->text = g_strdup (spec->default_text != NULL ? spec->default_text : "");
      break;
    default:
      break;
    }
}

/* Sets the refusal: the sentence, then the spec's range note if it has one. */
static void
set_range_error (GError **error, const PlParamSpec *spec, const char *sentence)
{
  if (spec->range_note != NULL)
    g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_OUT_OF_RANGE, "%s %s",
                 sentence, _(spec->range_note));
  else
    g_set_error_literal (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_OUT_OF_RANGE,
                         sentence);
}

gboolean
pl_param_spec_check_number (const PlParamSpec *spec, double value,
                            const PlUnitPrefs *prefs, GError **error)
{
  g_autofree char *limit = NULL;
  g_autofree char *sentence = NULL;
  const char *label;

  g_return_val_if_fail (spec != NULL, FALSE);
  label = _(spec->label);
  if (spec->kind != PL_PARAM_NUMBER)
    {
      /* Translators: %s is the label of a field, such as "Bore". */
      g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_WRONG_KIND,
                   _("%s does not take a number."), label);
      return FALSE;
    }
  if (!isfinite (value))
    {
      g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INVALID_VALUE,
                   _("%s must be a finite number."), label);
      return FALSE;
    }
  if ((spec->min_bound == PL_BOUND_OPEN && !(value > spec->min))
      || (spec->min_bound == PL_BOUND_CLOSED && !(value >= spec->min)))
    {
      limit = pl_unit_format (spec->min, spec->quantity, prefs, 0,
                              PL_UNIT_DECIMAL_FROM_LOCALE);
      if (spec->min_bound == PL_BOUND_OPEN)
        /* Translators: "Bore must be more than 0 mm." */
        sentence = g_strdup_printf (_("%s must be more than %s."), label, limit);
      else
        sentence = g_strdup_printf (_("%s must be at least %s."), label, limit);
      set_range_error (error, spec, sentence);
      return FALSE;
    }
  if ((spec->max_bound == PL_BOUND_OPEN && !(value < spec->max))
      || (spec->max_bound == PL_BOUND_CLOSED && !(value <= spec->max)))
    {
      limit = pl_unit_format (spec->max, spec->quantity, prefs, 0,
                              PL_UNIT_DECIMAL_FROM_LOCALE);
      if (spec->max_bound == PL_BOUND_OPEN)
        sentence = g_strdup_printf (_("%s must be less than %s."), label, limit);
      else
        sentence = g_strdup_printf (_("%s must be at most %s."), label, limit);
      set_range_error (error, spec, sentence);
      return FALSE;
    }
  return TRUE;
}

gboolean
pl_param_spec_check_text (const PlParamSpec *spec, const char *text, GError **error)
{
  const char *label;

  g_return_val_if_fail (spec != NULL, FALSE);
  label = _(spec->label);
  if (spec->kind != PL_PARAM_TEXT)
    {
      g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_WRONG_KIND,
                   _("%s does not take text."), label);
      return FALSE;
    }
  if (text == NULL || !g_utf8_validate (text, -1, NULL))
    {
      g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INVALID_VALUE,
                   _("%s must be valid UTF-8 text."), label);
      return FALSE;
    }
  if (g_utf8_strlen (text, -1) > (glong) spec->max_length)
    {
      g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INVALID_VALUE,
                   _("%s must be at most %u characters long."), label, spec->max_length);
      return FALSE;
    }
  for (const char *p = text; *p != '\0'; p = g_utf8_next_char (p))
    {
      gunichar c = g_utf8_get_char (p);

      if (spec->multiline && (c == '\n' || c == '\t'))
        continue;
      if (g_unichar_iscntrl (c) || c == 0x2028 || c == 0x2029)
        {
          if (spec->multiline)
            g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INVALID_VALUE,
                         _("%s must not contain control characters."), label);
          else
            g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INVALID_VALUE,
                         _("%s must be one line without control characters."), label);
          return FALSE;
        }
    }
  return TRUE;
}

gboolean
pl_param_spec_check_value (const PlParamSpec *spec, const PlValue *value,
                           const PlUnitPrefs *prefs, GError **error)
{
  g_return_val_if_fail (spec != NULL && value != NULL, FALSE);
  if (value->kind != spec->kind)
    {
      g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_WRONG_KIND,
                   _("%s does not take a value of this kind."), _(spec->label));
      return FALSE;
    }
  switch (spec->kind)
    {
    case PL_PARAM_NUMBER:
      return pl_param_spec_check_number (spec, value->number, prefs, error);
    case PL_PARAM_TEXT:
      return pl_param_spec_check_text (spec, value->text, error);
    case PL_PARAM_CHOICE:
      if (value->choice >= spec->n_choices)
        {
          g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INVALID_VALUE,
                       _("%s has no such choice."), _(spec->label));
          return FALSE;
        }
      return TRUE;
    case PL_PARAM_BOOLEAN:
      if (value->boolean != TRUE && value->boolean != FALSE)
        {
          g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INVALID_VALUE,
                       _("%s must be yes or no."), _(spec->label));
          return FALSE;
        }
      return TRUE;
    default:
      g_set_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_WRONG_KIND,
                   _("%s does not take a value of this kind."), _(spec->label));
      return FALSE;
    }
}

void
pl_value_copy (const PlValue *src, PlValue *dest)
{
  g_return_if_fail (src != NULL && dest != NULL);
  *dest = *src;
  dest->text = src->kind == PL_PARAM_TEXT ? g_strdup (src->text != NULL ? src->text : "")
                                          : NULL;
}

void
pl_value_clear (PlValue *value)
{
  if (value == NULL)
    return;
  g_clear_pointer (&value->text, g_free);
}

gboolean
pl_value_equal (const PlValue *a, const PlValue *b)
{
  g_return_val_if_fail (a != NULL && b != NULL, FALSE);
  if (a->kind != b->kind)
    return FALSE;
  switch (a->kind)
    {
    case PL_PARAM_NUMBER:
      return a->number == b->number;
    case PL_PARAM_CHOICE:
      return a->choice == b->choice;
    case PL_PARAM_BOOLEAN:
      return !a->boolean == !b->boolean;
    case PL_PARAM_TEXT:
      return g_strcmp0 (a->text, b->text) == 0;
    default:
      return FALSE;
    }
}
