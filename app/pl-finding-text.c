/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-finding-text.c: translated, unit-aware sentences for findings, shared
 * by the results panel and the work order.
 */

#include "config.h"

#include "pl-finding-text.h"

#include <glib/gi18n.h>
#include <string.h>

#include "pl-part-type.h"

static char *
fmt (double si, PlQuantity q, const PlUnitPrefs *prefs)
{
  return pl_unit_format (si, q, prefs, 3, PL_UNIT_DECIMAL_FROM_LOCALE);
}

static char *
fmt_percent (double fraction)
{
  /* Translators: a percentage, "7.5 %". */
  return g_strdup_printf (_("%.1f %%"), 100.0 * fraction);
}

char *
pl_finding_format_sentence (const PlFinding *f, const PlResults *results,
                            const PlUnitPrefs *prefs)
{
  const PlCompiled *compiled;
  const PlCompiledPart *part = NULL;
  const pls_steady_options *opts;
  const char *tag;
  const char *code;
  g_autofree char *v = NULL;
  g_autofree char *l = NULL;

  g_return_val_if_fail (f != NULL, NULL);
  g_return_val_if_fail (results != NULL, NULL);

  compiled = pl_results_get_compiled (results);
  opts = pl_compiled_get_steady_options (compiled);
  code = f->code != NULL ? f->code : "";
  if (f->part_id != NULL)
    part = pl_compiled_find_part (compiled, f->part_id);
  tag = part != NULL ? part->tag : NULL;

  /* Whole-line findings first: they name no part. */
  if (strcmp (code, "not-periodic") == 0)
    return g_strdup_printf (_("The firing cycle did not settle into a repeating pattern "
                              "(last change %.3g, tolerance %.3g)."), f->value, f->limit);
  if (strcmp (code, "shutdown-slow") == 0)
    {
      v = fmt (f->value, PL_QUANTITY_TIME, prefs);
      return g_strdup_printf (_("The line is not below the safe pressure within %s of the "
                                "air going off."), v);
    }
  if (tag == NULL)
    return g_strdup (f->message != NULL ? f->message : "");

  if (strcmp (code, "pump-stall-short") == 0)
    {
      /* The same code covers both halves of the demand check; the limit
       * tells which: the demand pressure, or else the demand flow. */
      if (opts->demand_pressure > 0.0 && f->limit == opts->demand_pressure)
        {
          v = fmt (f->value, PL_QUANTITY_PRESSURE, prefs);
          l = fmt (f->limit, PL_QUANTITY_PRESSURE, prefs);
          return g_strdup_printf (_("%s stalls at %s with this air supply, below the %s the "
                                    "applicators need."), tag, v, l);
        }
      v = fmt (f->value, PL_QUANTITY_FLOW, prefs);
      l = fmt (f->limit, PL_QUANTITY_FLOW, prefs);
      return g_strdup_printf (_("The pumps deliver at most %s at free flow, short of the %s "
                                "the applicators need (%s)."), v, l, tag);
    }
  if (strcmp (code, "manifold-spread") == 0)
    {
      v = fmt_percent (f->value);
      l = fmt_percent (f->limit);
      return g_strdup_printf (_("The open applicators' pressures spread by %s, more than the "
                                "%s allowed; %s gets the least."), v, l, tag);
    }
  if (strcmp (code, "rating-exceeded") == 0)
    {
      v = fmt (f->value, PL_QUANTITY_PRESSURE, prefs);
      l = fmt (f->limit, PL_QUANTITY_PRESSURE, prefs);
      return g_strdup_printf (_("%s is rated for %s but can see %s."), tag, l, v);
    }
  if (strcmp (code, "gauge-range-low") == 0)
    {
      v = fmt (f->value, PL_QUANTITY_PRESSURE, prefs);
      l = fmt (f->limit, PL_QUANTITY_PRESSURE, prefs);
      return g_strdup_printf (_("The %s full scale of %s is too low for its readings; fit a "
                                "gauge of at least %s."), v, tag, l);
    }
  if (strcmp (code, "gauge-range-high") == 0)
    {
      double reading = opts->gauge_high_factor > 0.0 ? f->limit / opts->gauge_high_factor
                       : f->limit;

      v = fmt (f->value, PL_QUANTITY_PRESSURE, prefs);
      l = fmt (reading, PL_QUANTITY_PRESSURE, prefs);
      return g_strdup_printf (_("%s reads at most %s, low on its %s scale: a smaller gauge "
                                "reads closer."), tag, l, v);
    }
  if (strcmp (code, "precharge-too-high") == 0)
    {
      v = fmt (f->value, PL_QUANTITY_PRESSURE, prefs);
      l = fmt (f->limit, PL_QUANTITY_PRESSURE, prefs);
      return g_strdup_printf (_("%s is precharged to %s, at or above the %s it sees at idle: "
                                "it never fills."), tag, v, l);
    }
  if (strcmp (code, "precharge-too-low") == 0)
    {
      v = fmt (f->value, PL_QUANTITY_PRESSURE, prefs);
      l = fmt (f->limit, PL_QUANTITY_PRESSURE, prefs);
      return g_strdup_printf (_("%s is precharged to %s, below the %s its working pressure "
                                "calls for."), tag, v, l);
    }
  if (strcmp (code, "velocity-high") == 0)
    {
      v = fmt (f->value, PL_QUANTITY_VELOCITY, prefs);
      l = fmt (f->limit, PL_QUANTITY_VELOCITY, prefs);
      return g_strdup_printf (_("%s runs at %s, above the %s limit."), tag, v, l);
    }
  if (strcmp (code, "shear-high") == 0)
    {
      v = fmt (f->value, PL_QUANTITY_SHEAR_RATE, prefs);
      l = fmt (f->limit, PL_QUANTITY_SHEAR_RATE, prefs);
      return g_strdup_printf (_("%s shears the fluid at its wall at %s, above the %s limit."),
                              tag, v, l);
    }
  if (strcmp (code, "unreached") == 0)
    return g_strdup_printf (_("No pump, tank or drain reaches %s; it is left out of the "
                              "solve."), tag);
  if (strcmp (code, "no-reference") == 0)
    return g_strdup_printf (_("%s has a running pump but no tank, drain or open applicator "
                              "to hold its pressure; it is left out of the solve."), tag);
  if (strcmp (code, "open-port") == 0)
    {
      const PlPortSpec *port = f->port_key != NULL
                               ? pl_part_type_find_port (part->type, f->port_key, NULL) : NULL;

      if (port != NULL)
        return g_strdup_printf (_("%s of %s is connected to nothing; it is treated as "
                                  "capped."), _(port->label), tag);
      return g_strdup_printf (_("An end of %s is connected to nothing; it is treated as "
                                "capped."), tag);
    }
  if (strcmp (code, "nozzle-unfed") == 0)
    return g_strdup_printf (_("No running pump feeds %s: there is no open path to it."), tag);
  if (strcmp (code, "no-recovery") == 0)
    {
      v = fmt (f->value, PL_QUANTITY_PRESSURE, prefs);
      l = fmt (f->limit, PL_QUANTITY_PRESSURE, prefs);
      return g_strdup_printf (_("%s is not back near its idle pressure of %s before the next "
                                "shot (it stands at %s)."), tag, l, v);
    }
  if (strcmp (code, "shot-uniformity") == 0)
    {
      /* Translators: a signed percentage, "+3.1 %". */
      v = g_strdup_printf (_("%+.1f %%"), 100.0 * f->value);
      l = fmt_percent (f->limit);
      return g_strdup_printf (_("The shot of %s is %s off the mean along the manifold "
                                "(tolerance %s)."), tag, v, l);
    }
  if (strcmp (code, "trapped-pressure") == 0)
    {
      v = fmt (f->value, PL_QUANTITY_PRESSURE, prefs);
      return g_strdup_printf (_("%s stays at %s after the air goes off: a closed valve or a "
                                "check valve keeps it from every drain."), tag, v);
    }
  if (strcmp (code, "cycle-cavitation") == 0 || strcmp (code, "shutdown-cavitation") == 0)
    {
      v = fmt (f->value, PL_QUANTITY_VOLUME, prefs);
      if (code[0] == 'c')
        return g_strdup_printf (_("The liquid parts (cavitates) at %s in the firing cycle: a "
                                  "cavity of up to %s opens near vacuum, and the columns meet "
                                  "again with a pressure spike. Expect noise, wear and worse "
                                  "dosing there."), tag, v);
      return g_strdup_printf (_("The liquid parts (cavitates) at %s after the air goes off: "
                                "the wave from the opening dump valve opens a cavity of up to "
                                "%s near vacuum, and the columns meet again with a pressure "
                                "spike. A slower dump valve or a restrictor in its line "
                                "softens it."), tag, v);
    }
  /* part-invalid, scenario-invalid, elevation-mismatch, solve-failed are
   * written translated by app/; anything else keeps the solver's words. */
  return g_strdup (f->message != NULL ? f->message : "");
}

const char *
pl_finding_get_severity_label (pls_severity severity)
{
  switch (severity)
    {
    case PLS_SEVERITY_ERROR:
      return _("Error");
    case PLS_SEVERITY_WARNING:
      return _("Warning");
    case PLS_SEVERITY_INFO:
    default:
      return C_("severity", "Note");
    }
}
