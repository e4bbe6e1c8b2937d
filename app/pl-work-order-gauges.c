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

/* A row of the gauges table: the readings at one port (a gauge's own, or
 * a suggested point's), after the three cells that say which gauge, where
 * and its full scale (taken over). */
static char **
readings_row (PlWorkOrder *wo, char *name, char *place, char *full_scale, const char *id,
              const char *port)
{
  const char *why = NULL;
  char **cells = g_new0 (char *, 8);
  double idle = 0, low = 0, high = 0, rec = 0;
  gboolean have_cycle = cycle_known (wo, &why), ok;
  PlResults *r = wo->results;

  cells[0] = name;
  cells[1] = place;
  cells[2] = full_scale;
  /* Each lookup before its use: argument order is unspecified in C. */
  ok = r != NULL && pl_results_get_port_pressure (r, id, port, PL_PRESSURE_IDLE, &idle);
  cells[3] = pl_wo_format (wo, PL_QUANTITY_PRESSURE, ok, idle);
  if (!have_cycle)
    {
      cells[4] = g_strdup (why);
      cells[5] = g_strdup (why);
      cells[6] = g_strdup (why);
      return cells;
    }
  ok = pl_results_get_port_pressure (r, id, port, PL_PRESSURE_CYCLE_MIN, &low);
  cells[4] = pl_wo_format (wo, PL_QUANTITY_PRESSURE, ok, low);
  ok = pl_results_get_port_pressure (r, id, port, PL_PRESSURE_CYCLE_MAX, &high);
  cells[5] = pl_wo_format (wo, PL_QUANTITY_PRESSURE, ok, high);
  if (!pl_results_get_port_recovery (r, id, port, &rec))
    cells[6] = g_strdup ("–");
  else if (rec < 0.0)
    cells[6] = g_strdup (_("not before the next shot"));
  else
    cells[6] = pl_wo_format (wo, PL_QUANTITY_TIME, TRUE, rec);
  return cells;
}

static char **
gauge_row (PlWorkOrder *wo, const PlPart *gauge)
{
  return readings_row (wo, g_strdup (pl_part_get_tag (gauge)), gauge_place (wo, gauge),
                       pl_wo_format (wo, PL_QUANTITY_PRESSURE, TRUE,
                                     pl_part_get_number (gauge, "full-scale")),
                       pl_part_get_id (gauge), "p");
}

/* The smallest standard dial range (Pa) at least factor times the highest
 * reading: the design check's own rule for a gauge's full scale (the
 * scenario's gauge_low_factor, 1.5 unless changed), so that a suggested
 * gauge passes it.  The ranges are the 1, 1.6, 2.5, 4, 6 series of bar
 * and its decades (EN 837-1; from memory). */
static double
suggested_full_scale (double reading, double factor)
{
  static const double steps[] = { 1.0, 1.6, 2.5, 4.0, 6.0 };
  double need = MAX (factor, 1.0) * MAX (reading, 1e5);

  for (double decade = 1e5; decade < 1e10; decade *= 10.0)
    for (guint i = 0; i < G_N_ELEMENTS (steps); i++)
      if (steps[i] * decade >= need)
        return steps[i] * decade;
  return need;
}

static void
add_suggestion (PlWorkOrder *wo, PlWoTable *t, const PlPart *part, const char *port)
{
  PlResults *r = wo->results;
  const PlPortSpec *spec = pl_part_type_find_port (pl_part_get_part_type (part), port, NULL);
  double idle = 0.0, high = 0.0, factor;
  gboolean ok = r != NULL && pl_results_get_port_pressure (r, pl_part_get_id (part), port,
                                                           PL_PRESSURE_IDLE, &idle);

  /* The highest reading: idle, or a surge of the cycle above it. */
  if (ok && pl_results_get_port_pressure (r, pl_part_get_id (part), port,
                                          PL_PRESSURE_CYCLE_MAX, &high))
    idle = MAX (idle, high);
  factor = r != NULL
           ? pl_compiled_get_steady_options (pl_results_get_compiled (r))->gauge_low_factor
           : 1.5;

  pl_wo_table_add_row (t, readings_row (wo,
                                        /* Translators: the name of a gauge the sheet
                                         * suggests fitting (a narrow column). */
                                        g_strdup (C_("gauge", "new")),
                                        /* Translators: "P1 Outlet", as in gauge_place. */
                                        g_strdup_printf (_("%s %s"), pl_part_get_tag (part),
                                                         spec != NULL ? _(spec->label) : port),
                                        pl_wo_format (wo, PL_QUANTITY_PRESSURE, ok,
                                                      suggested_full_scale (idle, factor)),
                                        pl_part_get_id (part), port));
}

/* Where to fit gauges on a line that has none: every pump's outlet (what
 * the pump makes) and the inlet of the applicator that sees the lowest
 * pressure while firing, or held open when the cycle is unknown (what the
 * line's worst station gets).  The two readings apart tell a technician
 * what the line loses. */
static void
add_suggestions (PlWorkOrder *wo, PlWoTable *t)
{
  const PlPart *worst = NULL;
  double worst_p = INFINITY;
  PlPressureKind kind = wo->results != NULL && pl_results_get_cycle (wo->results) != NULL
                        ? PL_PRESSURE_CYCLE_MIN : PL_PRESSURE_STEADY_OPEN;

  for (guint i = 0; i < pl_document_get_n_parts (wo->doc); i++)
    {
      const PlPart *part = pl_document_get_part (wo->doc, i);
      PlPartKind k = pl_part_get_part_type (part)->kind;
      double p;

      if (k == PL_PART_PUMP)
        add_suggestion (wo, t, part, "out");
      else if (k == PL_PART_APPLICATOR && wo->results != NULL
               && pl_results_get_port_pressure (wo->results, pl_part_get_id (part), "in",
                                                kind, &p)
               && p < worst_p)
        {
          worst = part;
          worst_p = p;
        }
    }
  if (worst != NULL)
    add_suggestion (wo, t, worst, "in");
}

/* The note under the gauges: what each reading means, and why some are
 * missing. */
static char *
gauges_note (PlWorkOrder *wo, gboolean suggested)
{
  const char *why = NULL;
  GString *note = g_string_new (NULL);

  if (suggested)
    g_string_append (note, _("The layout has no gauges; the new ones are suggested: the "
                             "pump outlet shows what the pump makes, the applicator that "
                             "sees the lowest pressure shows what the line delivers, and "
                             "the two apart show what the line loses. Full scale: the "
                             "smallest standard range that the design check accepts for "
                             "the highest reading. "));
  g_string_append (note, _("At idle: air on, every applicator shut. Lowest while "
                           "firing: the lowest reading over a firing cycle once the "
                           "cycles repeat. After recovery: the highest reading between "
                           "shots. Recovery time: from the end of a shot until the reading "
                           "is back near its idle value."));

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

  gboolean suggested = FALSE;

  for (guint i = 0; i < pl_document_get_n_parts (wo->doc); i++)
    {
      const PlPart *part = pl_document_get_part (wo->doc, i);

      if (pl_part_get_part_type (part)->kind == PL_PART_GAUGE)
        pl_wo_table_add_row (t, gauge_row (wo, part));
    }
  if (t->rows->len == 0)
    {
      add_suggestions (wo, t);
      suggested = t->rows->len > 0;
    }
  /* The readings' meaning, where there are readings. */
  if (t->rows->len > 0)
    t->note = gauges_note (wo, suggested);
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
