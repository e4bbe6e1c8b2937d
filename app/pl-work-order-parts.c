/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-work-order-parts.c: the parts list: every part with the sizes and
 * settings a fitter needs to pick it from the shelf and set it up, and its
 * rated working pressure.
 */
#include "config.h"

#include "pl-work-order-private.h"

#include <glib/gi18n.h>
#include <math.h>

/* The parameters shown for each kind, in this order (the rest -- wall
 * roughness, curve shapes, discharge models -- are the designer's, not
 * the fitter's). */
static const char *const *
shown_params (PlPartKind kind)
{
  static const char *const pump[] = { "ratio", "displacement", "max-cycle-rate", NULL };
  static const char *const hose[] = { "bore", "length", "rise", NULL };
  static const char *const pipe[] = { "bore", "length", "wall-thickness", "rise", NULL };
  static const char *const bore[] = { "bore", NULL };
  static const char *const accumulator[] = { "gas-volume", "precharge",
                                             "precharge-temperature", NULL };
  static const char *const dump[] = { "kv", "bore", NULL };
  static const char *const ball[] = { "open", "kv", "bore", NULL };
  static const char *const applicator[] = { "orifice-diameter", "orifice-length",
                                            "firing-delay", NULL };
  static const char *const gauge[] = { "full-scale", NULL };
  static const char *const drain[] = { "kind", "elevation", NULL };
  static const char *const none[] = { NULL };

  switch (kind)
    {
    case PL_PART_PUMP:
      return pump;
    case PL_PART_HOSE:
      return hose;
    case PL_PART_PIPE:
      return pipe;
    case PL_PART_TEE:
      return bore;
    case PL_PART_ACCUMULATOR:
      return accumulator;
    case PL_PART_DUMP_VALVE:
      return dump;
    case PL_PART_BALL_VALVE:
      return ball;
    case PL_PART_APPLICATOR:
      return applicator;
    case PL_PART_GAUGE:
      return gauge;
    case PL_PART_DRAIN:
      return drain;
    case PL_PART_SCENARIO:
    case PL_PART_TITLE:
    case PL_N_PART_KINDS:
    default:
      return none;
    }
}

/* "Bore 9.53 mm": a parameter's label and value in the sheet's units. */
static char *
param_text (PlWorkOrder *wo, const PlPart *part, const char *key)
{
  const PlParamSpec *spec = pl_part_type_find_param (pl_part_get_part_type (part), key, NULL);
  const PlValue *value = pl_part_get_value (part, key);
  g_autofree char *v = NULL;

  if (spec == NULL || value == NULL)
    return NULL;
  switch (spec->kind)
    {
    case PL_PARAM_NUMBER:
      /* A rise or a delay of nothing is not worth a word. */
      if ((g_str_equal (key, "rise") || g_str_equal (key, "firing-delay"))
          && value->number == 0.0)
        return NULL;
      if (g_str_equal (key, "ratio"))
        {
          g_autofree char *n = pl_unit_format_number (value->number, PL_QUANTITY_RATIO, NULL,
                                                      4, PL_UNIT_DECIMAL_FROM_LOCALE);

          /* Translators: a pump's pressure ratio, "30:1". */
          v = g_strdup_printf (_("%s:1"), n);
        }
      else
        v = pl_unit_format (value->number, spec->quantity, &wo->opts.units, 4,
                            PL_UNIT_DECIMAL_FROM_LOCALE);
      break;
    case PL_PARAM_CHOICE:
      v = g_strdup (value->choice < spec->n_choices ? _(spec->choices[value->choice].label)
                                                    : "");
      break;
    case PL_PARAM_BOOLEAN:
      v = g_strdup (value->boolean ? _("yes") : _("no"));
      break;
    case PL_PARAM_TEXT:
    default:
      v = g_strdup (value->text);
      break;
    }
  /* Translators: one setting in the parts list, "Bore 9.53 mm". */
  return g_strdup_printf (_("%s %s"), _(spec->label), v);
}

static char *
part_settings (PlWorkOrder *wo, const PlPart *part)
{
  const char *const *keys = shown_params (pl_part_get_part_type (part)->kind);
  g_autoptr (GPtrArray) items = g_ptr_array_new_with_free_func (g_free);

  for (guint i = 0; keys[i] != NULL; i++)
    {
      char *text = param_text (wo, part, keys[i]);

      if (text != NULL)
        g_ptr_array_add (items, text);
    }
  g_ptr_array_add (items, NULL);
  /* Translators: the separator between settings in the parts list. */
  return g_strjoinv (_("; "), (char **) items->pdata);
}

static char *
rated_pressure (PlWorkOrder *wo, const PlPart *part)
{
  const PlParamSpec *spec = pl_part_type_find_param (pl_part_get_part_type (part),
                                                     "rated-pressure", NULL);
  double p = pl_part_get_number (part, "rated-pressure");

  if (spec == NULL)
    return g_strdup ("–");
  if (!(isfinite (p) && p > 0.0))
    return g_strdup (_("not given"));
  return pl_unit_format (p, PL_QUANTITY_PRESSURE, &wo->opts.units, 4,
                         PL_UNIT_DECIMAL_FROM_LOCALE);
}

PlWoTable *
pl_wo_parts_table (PlWorkOrder *wo)
{
  const char *headers[] = { _("Tag"), _("Part"), _("Sizes and settings"),
                            _("Rated working pressure") };
  static const double widths[] = { 0.08, 0.15, 0.57, 0.20 };
  PlWoTable *t = pl_wo_table_new (_("Parts list"), 4, headers, widths,
                                  _("The layout has no parts."));

  for (guint i = 0; i < pl_document_get_n_parts (wo->doc); i++)
    {
      const PlPart *part = pl_document_get_part (wo->doc, i);
      char **cells = g_new0 (char *, 5);

      cells[0] = g_strdup (pl_part_get_tag (part));
      cells[1] = g_strdup (_(pl_part_get_part_type (part)->name));
      cells[2] = part_settings (wo, part);
      cells[3] = rated_pressure (wo, part);
      pl_wo_table_add_row (t, cells);
    }
  return t;
}
