/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-work-order-gauges.c: the gauges to fit, each with the readings to
 * expect at idle, at the lowest while firing and after recovery; and the
 * dose each applicator gives.  Figures come from the results snapshot as
 * they are; a figure the snapshot lacks (the cycle failed or did not run)
 * is printed as such, never estimated.
 */
#include "config.h"

#include "pl-work-order-private.h"

#include <glib/gi18n.h>
#include <math.h>

/* Four significant figures, as the text report prints them. */
char *
pl_wo_format (PlWorkOrder *wo, PlQuantity quantity, gboolean ok, double si)
{
  if (!ok || !isfinite (si))
    return g_strdup ("–");
  return pl_unit_format (si, quantity, &wo->opts.units, 4, PL_UNIT_DECIMAL_FROM_LOCALE);
}

/* Whether the firing cycle's figures exist; else why not, for the cells. */
static gboolean
cycle_known (PlWorkOrder *wo, const char **why)
{
  if (wo->results != NULL && pl_results_get_cycle (wo->results) != NULL)
    return TRUE;
  if (wo->results != NULL
      && pl_results_get_transient_state (wo->results) == PL_TRANSIENT_PENDING)
    *why = _("not solved yet");
  else
    *why = _("not solved");
  return FALSE;
}

/* "A1 Connection": where the gauge's connection is wired to. */
static char *
gauge_place (PlWorkOrder *wo, const PlPart *gauge)
{
  g_autoptr (GPtrArray) wires = pl_document_get_port_wires (wo->doc, pl_part_get_id (gauge),
                                                            "p");

  for (guint i = 0; i < wires->len; i++)
    {
      const PlWire *wire = g_ptr_array_index (wires, i);
      guint end = g_str_equal (pl_wire_get_part_id (wire, 0), pl_part_get_id (gauge)) ? 1 : 0;
      const PlPart *other = pl_document_find_part (wo->doc, pl_wire_get_part_id (wire, end));
      const PlPortSpec *port;

      if (other == NULL)
        continue;
      port = pl_part_type_find_port (pl_part_get_part_type (other),
                                     pl_wire_get_port_key (wire, end), NULL);
      /* Translators: where a gauge is fitted: a part's tag and its port,
       * "A1 Connection". */
      return g_strdup_printf (_("%s %s"), pl_part_get_tag (other),
                              port != NULL ? _(port->label) : "");
    }
  return g_strdup (_("not connected"));
}

static char **
gauge_row (PlWorkOrder *wo, const PlPart *gauge)
{
  const char *id = pl_part_get_id (gauge), *why = NULL;
  char **cells = g_new0 (char *, 8);
  double idle = 0, low = 0, high = 0, rec = 0;
  gboolean have_cycle = cycle_known (wo, &why), ok;
  PlResults *r = wo->results;

  cells[0] = g_strdup (pl_part_get_tag (gauge));
  cells[1] = gauge_place (wo, gauge);
  cells[2] = pl_wo_format (wo, PL_QUANTITY_PRESSURE, TRUE,
                           pl_part_get_number (gauge, "full-scale"));
  /* Each lookup before its use: argument order is unspecified in C. */
  ok = r != NULL && pl_results_get_port_pressure (r, id, "p", PL_PRESSURE_IDLE, &idle);
  cells[3] = pl_wo_format (wo, PL_QUANTITY_PRESSURE, ok, idle);
  if (!have_cycle)
    {
      cells[4] = g_strdup (why);
      cells[5] = g_strdup (why);
      cells[6] = g_strdup (why);
      return cells;
    }
  ok = pl_results_get_port_pressure (r, id, "p", PL_PRESSURE_CYCLE_MIN, &low);
  cells[4] = pl_wo_format (wo, PL_QUANTITY_PRESSURE, ok, low);
  ok = pl_results_get_port_pressure (r, id, "p", PL_PRESSURE_CYCLE_MAX, &high);
  cells[5] = pl_wo_format (wo, PL_QUANTITY_PRESSURE, ok, high);
  if (!pl_results_get_port_recovery (r, id, "p", &rec))
    cells[6] = g_strdup ("–");
  else if (rec < 0.0)
    cells[6] = g_strdup (_("not before the next shot"));
  else
    cells[6] = pl_wo_format (wo, PL_QUANTITY_TIME, TRUE, rec);
  return cells;
}

/* The note under the gauges: what each reading means, and why some are
 * missing. */
static char *
gauges_note (PlWorkOrder *wo)
{
  const char *why = NULL;
  GString *note = g_string_new (_("At idle: air on, every applicator shut. Lowest while "
                                  "firing: the lowest reading over a firing cycle once the "
                                  "cycles repeat. After recovery: the highest reading "
                                  "between shots. Recovery time: from the end of a shot "
                                  "until the reading is back near its idle value."));

  if (!cycle_known (wo, &why))
    {
      g_string_append_c (note, ' ');
      g_string_append (note, _("The firing cycle was not solved (see the findings), so "
                               "this sheet gives no reading while firing."));
    }
  return g_string_free (note, FALSE);
}

PlWoTable *
pl_wo_gauges_table (PlWorkOrder *wo)
{
  const char *headers[] = { _("Gauge"), _("Fit at"), _("Full scale"), _("At idle"),
                            _("Lowest while firing"), _("After recovery"),
                            _("Recovery time") };
  static const double widths[] = { 0.08, 0.16, 0.13, 0.14, 0.17, 0.15, 0.17 };
  PlWoTable *t = pl_wo_table_new (_("Gauges to fit and the readings to expect"), 7, headers,
                                  widths, _("The layout has no gauges."));

  for (guint i = 0; i < pl_document_get_n_parts (wo->doc); i++)
    {
      const PlPart *part = pl_document_get_part (wo->doc, i);

      if (pl_part_get_part_type (part)->kind == PL_PART_GAUGE)
        pl_wo_table_add_row (t, gauge_row (wo, part));
    }
  /* The readings' meaning, where there are readings. */
  if (t->rows->len > 0)
    t->note = gauges_note (wo);
  return t;
}

static char **
dose_row (PlWorkOrder *wo, const PlPart *part)
{
  const char *id = pl_part_get_id (part), *why = NULL;
  char **cells = g_new0 (char *, 6);
  PlResults *r = wo->results;
  double q = 0, mass = 0, dev = 0, first = 0;
  gboolean shot;

  cells[0] = g_strdup (pl_part_get_tag (part));
  shot = r != NULL && pl_results_get_flow (r, id, 0, PL_CASE_STEADY_OPEN, &q);
  cells[1] = pl_wo_format (wo, PL_QUANTITY_FLOW, shot, q);
  if (!cycle_known (wo, &why))
    {
      cells[2] = g_strdup (why);
      cells[3] = g_strdup (why);
      cells[4] = g_strdup (why);
      return cells;
    }
  shot = pl_results_get_shot (r, id, &mass, &dev, &first);
  cells[2] = pl_wo_format (wo, PL_QUANTITY_MASS, shot, mass);
  /* Translators: a shot's deviation from the mean of all shots, in %. */
  cells[3] = shot && isfinite (dev) ? g_strdup_printf (_("%+.1f %%"), 100.0 * dev)
                                    : g_strdup ("–");
  cells[4] = pl_wo_format (wo, PL_QUANTITY_MASS, shot, first);
  return cells;
}

PlWoTable *
pl_wo_doses_table (PlWorkOrder *wo)
{
  const char *headers[] = { _("Applicator"), _("Flow held open"), _("Shot"),
                            _("From the mean"), _("First shot from idle") };
  static const double widths[] = { 0.14, 0.22, 0.20, 0.18, 0.26 };
  PlWoTable *t = pl_wo_table_new (_("Dose per applicator"), 5, headers, widths,
                                  _("The layout has no applicators."));

  for (guint i = 0; i < pl_document_get_n_parts (wo->doc); i++)
    {
      const PlPart *part = pl_document_get_part (wo->doc, i);

      if (pl_part_get_part_type (part)->kind == PL_PART_APPLICATOR)
        pl_wo_table_add_row (t, dose_row (wo, part));
    }
  if (t->rows->len > 0)
    t->note = g_strdup (_("Shot: the mass of one shot once the firing cycles repeat; from "
                          "the mean: its difference from the mean shot of all applicators."));
  return t;
}
