/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-report.c: text, CSV and JSON reports of a results snapshot.
 *
 * JSON report, format version 1 (PL_REPORT_JSON_VERSION).  Every number is
 * in SI base units: pressures Pa gauge, flows m^3/s, velocities m/s, masses
 * kg, volumes m^3, energies J, times s, shear rates 1/s; Reynolds numbers,
 * friction factors and deviations are plain ratios.  A figure that is not
 * available is null.  Keys never change meaning within a format version;
 * new keys may be added.  app/data/report-json.md is the reader's copy.
 *
 * {
 *   "format": "pressline-report",   "format_version": 1,
 *   "generator": "pressline 0.1.0", "source": "FILE" | null,
 *   "revision": <document revision>,
 *   "solves": {
 *     "idle":        { "converged": bool, "iterations": int | null },
 *     "steady_open": { "converged": bool, "iterations": int | null },
 *     "cycle":    { "state": "done" | "failed" | "pending" | "skipped",
 *                   "periodic": bool | null, "cycles": int | null,
 *                   "period": s | null, "pumped_volume": m^3 | null,
 *                   "shot_volume": m^3 | null },
 *     "shutdown": { "state": ..., "time_to_safe": s | null,
 *                   "reached_safe": bool | null, "gas_energy": J | null,
 *                   "fluid_energy": J | null }
 *   },
 *   "parts": {                         (object keyed by part id, in document order)
 *     "<id>": {
 *       "tag": "H1", "type": "hose", "compiled": bool,
 *       "ports": { "<port>": { "idle", "steady_open", "cycle_min", "cycle_max",
 *                              "cycle_mean": Pa | null, "recovery_time": s | null } },
 *       hose, pipe:  "line": { "idle" | "steady_open": { "flow", "velocity",
 *                    "reynolds", "wall_shear_rate", "wall_shear_stress",
 *                    "darcy_friction", "regime": "laminar" | "transition" |
 *                    "turbulent" } | null }
 *       tee:         "legs": { "a" | "b" | "branch": { "idle", "steady_open":
 *                    m^3/s | null } }   (flow from the centre out of that port)
 *       valves, applicator: "flow": { "idle", "steady_open": m^3/s | null }
 *       pump:        "pump": { "idle" | "steady_open": { "running": bool, "flow",
 *                    "outlet_pressure", "stall_pressure", "free_flow" } | null,
 *                    "cycle": { "volume", "mean_flow", "min_flow", "max_flow" } | null }
 *       applicator:  "shot": { "mass", "deviation", "first_mass" } | null
 *       accumulator: "accumulator": { "idle": { "fluid_volume", "precharge",
 *                    "gas_energy" } | null, "swing": { "min_pressure",
 *                    "max_pressure", "min_fluid_volume", "max_fluid_volume" } | null }
 *     }
 *   },
 *   "findings": [ { "severity": "info" | "warning" | "error", "code": "...",
 *                   "part": "<id>" | null, "tag": "H1" | null, "port": "b" | null,
 *                   "message": "...", "value": number | null, "limit": number | null } ]
 * }
 */

#include "config.h"

#include "pl-report.h"

#include <glib/gi18n.h>
#include <math.h>
#include <string.h>

#include "pl-finding-text.h"
#include "pl-json-writer.h"
#include "pl-part-type.h"

static const char *const tee_legs[3] = { "a", "b", "branch" };

const char *
pl_report_format_get_key (PlReportFormat format)
{
  static const char *const keys[PL_N_REPORT_FORMATS] = { "text", "csv", "json" };

  return (guint) format < PL_N_REPORT_FORMATS ? keys[format] : NULL;
}

PlReportFormat
pl_report_format_from_key (const char *key)
{
  for (guint f = 0; f < PL_N_REPORT_FORMATS; f++)
    if (key != NULL && g_str_equal (key, pl_report_format_get_key (f)))
      return f;
  return PL_N_REPORT_FORMATS;
}

static const char *
pl_report_regime_key (pls_flow_regime regime)
{
  switch (regime)
    {
    case PLS_FLOW_LAMINAR:
      return "laminar";
    case PLS_FLOW_TRANSITION:
      return "transition";
    case PLS_FLOW_TURBULENT:
      return "turbulent";
    default:
      return "laminar";
    }
}

/* What kind of per-part figures a type has. */
static gboolean
pl_report_is_line (const PlCompiledPart *p)
{
  return p->type->kind == PL_PART_HOSE || p->type->kind == PL_PART_PIPE;
}

static gboolean
pl_report_has_flow (const PlCompiledPart *p)
{
  return p->type->kind == PL_PART_BALL_VALVE || p->type->kind == PL_PART_DUMP_VALVE
         || p->type->kind == PL_PART_APPLICATOR;
}

/* Cycle period from the scenario's firing rate, or NaN. */
static double
pl_report_period (const PlResults *r)
{
  const pls_transient_options *o =
    pl_compiled_get_transient_options (pl_results_get_compiled (r));

  return o->cycle_rate > 0.0 ? 1.0 / o->cycle_rate : NAN;
}

/* "done" with a result, "failed" when the worker ran it without one. */
static const char *
pl_report_run_state (const PlResults *r, gboolean have)
{
  PlTransientState s = pl_results_get_transient_state (r);

  if (s == PL_TRANSIENT_DONE && !have)
    return "failed";
  return pl_transient_state_get_key (s);
}

/* ------------------------------------------------------------------------
 * JSON
 * ------------------------------------------------------------------------ */

static void
json_opt (PlJsonWriter *w, const char *key, gboolean ok, double value)
{
  pl_json_writer_key (w, key);
  if (ok)
    pl_json_writer_number (w, value);
  else
    pl_json_writer_null (w);
}

static void
json_line (PlJsonWriter *w, const PlResults *r, const PlCompiledPart *p)
{
  pl_json_writer_key (w, "line");
  pl_json_writer_begin_object (w);
  for (guint c = 0; c < PL_N_CASES; c++)
    {
      pls_line_result l;

      pl_json_writer_key (w, pl_steady_case_get_key (c));
      if (!pl_results_get_line (r, p->id, c, &l))
        {
          pl_json_writer_null (w);
          continue;
        }
      pl_json_writer_begin_object (w);
      pl_json_writer_member_number (w, "flow", l.flow);
      pl_json_writer_member_number (w, "velocity", l.velocity);
      pl_json_writer_member_number (w, "reynolds", l.reynolds);
      pl_json_writer_member_number (w, "wall_shear_rate", l.wall_shear_rate);
      pl_json_writer_member_number (w, "wall_shear_stress", l.wall_shear_stress);
      pl_json_writer_member_number (w, "darcy_friction", l.darcy_friction);
      pl_json_writer_member_string (w, "regime", pl_report_regime_key (l.regime));
      pl_json_writer_end_object (w);
    }
  pl_json_writer_end_object (w);
}

static void
json_flows (PlJsonWriter *w, const PlResults *r, const PlCompiledPart *p, guint slot)
{
  pl_json_writer_begin_object (w);
  for (guint c = 0; c < PL_N_CASES; c++)
    {
      double q = 0.0;
      gboolean ok = pl_results_get_flow (r, p->id, slot, c, &q);

      json_opt (w, pl_steady_case_get_key (c), ok, q);
    }
  pl_json_writer_end_object (w);
}

static void
json_pump (PlJsonWriter *w, const PlResults *r, const PlCompiledPart *p)
{
  pls_cycle_pump cp;

  pl_json_writer_key (w, "pump");
  pl_json_writer_begin_object (w);
  for (guint c = 0; c < PL_N_CASES; c++)
    {
      pls_pump_result pr;

      pl_json_writer_key (w, pl_steady_case_get_key (c));
      if (!pl_results_get_pump (r, p->id, c, &pr))
        {
          pl_json_writer_null (w);
          continue;
        }
      pl_json_writer_begin_object (w);
      pl_json_writer_member_boolean (w, "running", pr.running);
      pl_json_writer_member_number (w, "flow", pr.flow);
      pl_json_writer_member_number (w, "outlet_pressure", pr.outlet_pressure);
      pl_json_writer_member_number (w, "stall_pressure", pr.stall_pressure);
      pl_json_writer_member_number (w, "free_flow", pr.free_flow);
      pl_json_writer_end_object (w);
    }
  pl_json_writer_key (w, "cycle");
  if (pl_results_get_pump_cycle (r, p->id, &cp))
    {
      pl_json_writer_begin_object (w);
      pl_json_writer_member_number (w, "volume", cp.volume);
      pl_json_writer_member_number (w, "mean_flow", cp.mean_flow);
      pl_json_writer_member_number (w, "min_flow", cp.min_flow);
      pl_json_writer_member_number (w, "max_flow", cp.max_flow);
      pl_json_writer_end_object (w);
    }
  else
    pl_json_writer_null (w);
  pl_json_writer_end_object (w);
}

static void
json_accumulator (PlJsonWriter *w, const PlResults *r, const PlCompiledPart *p)
{
  pls_accumulator_result a;
  pls_cycle_accumulator s;

  pl_json_writer_key (w, "accumulator");
  pl_json_writer_begin_object (w);
  pl_json_writer_key (w, "idle");
  if (pl_results_get_accumulator (r, p->id, PL_CASE_IDLE, &a))
    {
      pl_json_writer_begin_object (w);
      pl_json_writer_member_number (w, "fluid_volume", a.fluid_volume);
      pl_json_writer_member_number (w, "precharge", a.precharge);
      pl_json_writer_member_number (w, "gas_energy", a.gas_energy);
      pl_json_writer_end_object (w);
    }
  else
    pl_json_writer_null (w);
  pl_json_writer_key (w, "swing");
  if (pl_results_get_accumulator_swing (r, p->id, &s))
    {
      pl_json_writer_begin_object (w);
      pl_json_writer_member_number (w, "min_pressure", s.min_pressure);
      pl_json_writer_member_number (w, "max_pressure", s.max_pressure);
      pl_json_writer_member_number (w, "min_fluid_volume", s.min_fluid_volume);
      pl_json_writer_member_number (w, "max_fluid_volume", s.max_fluid_volume);
      pl_json_writer_end_object (w);
    }
  else
    pl_json_writer_null (w);
  pl_json_writer_end_object (w);
}

static void
json_part (PlJsonWriter *w, const PlResults *r, const PlCompiledPart *p)
{
  pl_json_writer_key (w, p->id);
  pl_json_writer_begin_object (w);
  pl_json_writer_member_string (w, "tag", p->tag);
  pl_json_writer_member_string (w, "type", p->type->key);
  pl_json_writer_member_boolean (w, "compiled", p->compiled);

  pl_json_writer_key (w, "ports");
  pl_json_writer_begin_object (w);
  for (guint k = 0; k < p->n_ports; k++)
    {
      const char *port = p->type->ports[k].key;
      double v = 0.0;
      gboolean ok;

      pl_json_writer_key (w, port);
      pl_json_writer_begin_object (w);
      for (guint kind = 0; kind < PL_N_PRESSURES; kind++)
        {
          ok = pl_results_get_port_pressure (r, p->id, port, kind, &v);
          json_opt (w, pl_pressure_kind_get_key (kind), ok, v);
        }
      ok = pl_results_get_port_recovery (r, p->id, port, &v) && v >= 0.0;
      json_opt (w, "recovery_time", ok, v);
      pl_json_writer_end_object (w);
    }
  pl_json_writer_end_object (w);

  if (pl_report_is_line (p))
    json_line (w, r, p);
  else if (p->type->kind == PL_PART_TEE)
    {
      pl_json_writer_key (w, "legs");
      pl_json_writer_begin_object (w);
      for (guint k = 0; k < 3; k++)
        {
          pl_json_writer_key (w, tee_legs[k]);
          json_flows (w, r, p, k);
        }
      pl_json_writer_end_object (w);
    }
  else if (pl_report_has_flow (p))
    {
      pl_json_writer_key (w, "flow");
      json_flows (w, r, p, 0);
    }

  if (p->type->kind == PL_PART_PUMP)
    json_pump (w, r, p);
  else if (p->type->kind == PL_PART_ACCUMULATOR)
    json_accumulator (w, r, p);
  else if (p->type->kind == PL_PART_APPLICATOR)
    {
      double mass, dev, first;

      pl_json_writer_key (w, "shot");
      if (pl_results_get_shot (r, p->id, &mass, &dev, &first))
        {
          pl_json_writer_begin_object (w);
          pl_json_writer_member_number (w, "mass", mass);
          pl_json_writer_member_number (w, "deviation", dev);
          pl_json_writer_member_number (w, "first_mass", first);
          pl_json_writer_end_object (w);
        }
      else
        pl_json_writer_null (w);
    }
  pl_json_writer_end_object (w);
}

static void
json_solves (PlJsonWriter *w, const PlResults *r)
{
  const pls_cycle_result *cy = pl_results_get_cycle (r);
  const pls_shutdown_result *sd = pl_results_get_shutdown (r);

  pl_json_writer_key (w, "solves");
  pl_json_writer_begin_object (w);
  for (guint c = 0; c < PL_N_CASES; c++)
    {
      const pls_steady_result *s = pl_results_get_steady (r, c);

      pl_json_writer_key (w, pl_steady_case_get_key (c));
      pl_json_writer_begin_object (w);
      pl_json_writer_member_boolean (w, "converged", pl_results_get_converged (r, c));
      json_opt (w, "iterations", s != NULL, s != NULL ? pls_steady_result_iterations (s) : 0);
      pl_json_writer_end_object (w);
    }

  pl_json_writer_key (w, "cycle");
  pl_json_writer_begin_object (w);
  pl_json_writer_member_string (w, "state", pl_report_run_state (r, cy != NULL));
  pl_json_writer_key (w, "periodic");
  if (cy != NULL)
    pl_json_writer_boolean (w, pls_cycle_result_periodic (cy));
  else
    pl_json_writer_null (w);
  json_opt (w, "cycles", cy != NULL, cy != NULL ? pls_cycle_result_cycles (cy) : 0);
  json_opt (w, "period", TRUE, pl_report_period (r));
  {
    double pumped = NAN, shot = NAN, stored = NAN;

    if (cy != NULL)
      pls_cycle_result_volumes (cy, &pumped, &shot, &stored);
    json_opt (w, "pumped_volume", cy != NULL, pumped);
    json_opt (w, "shot_volume", cy != NULL, shot);
  }
  pl_json_writer_end_object (w);

  pl_json_writer_key (w, "shutdown");
  pl_json_writer_begin_object (w);
  pl_json_writer_member_string (w, "state", pl_report_run_state (r, sd != NULL));
  {
    double t = sd != NULL ? pls_shutdown_safe_time (sd) : NAN;

    json_opt (w, "time_to_safe", sd != NULL && t >= 0.0, t);
    pl_json_writer_key (w, "reached_safe");
    if (sd != NULL)
      pl_json_writer_boolean (w, t >= 0.0);
    else
      pl_json_writer_null (w);
    json_opt (w, "gas_energy", sd != NULL, sd != NULL ? pls_shutdown_gas_energy (sd) : 0);
    json_opt (w, "fluid_energy", sd != NULL, sd != NULL ? pls_shutdown_fluid_energy (sd) : 0);
  }
  pl_json_writer_end_object (w);
  pl_json_writer_end_object (w);
}

char *
pl_report_write_json (const PlResults *results, const char *source)
{
  g_autoptr (PlJsonWriter) w = pl_json_writer_new (TRUE);
  PlCompiled *c;

  g_return_val_if_fail (results != NULL, NULL);
  c = pl_results_get_compiled (results);

  pl_json_writer_begin_object (w);
  pl_json_writer_member_string (w, "format", "pressline-report");
  pl_json_writer_member_integer (w, "format_version", PL_REPORT_JSON_VERSION);
  pl_json_writer_member_string (w, "generator", "pressline " PACKAGE_VERSION);
  pl_json_writer_member_string (w, "source", source);
  pl_json_writer_member_integer (w, "revision", (gint64) pl_results_get_revision (results));
  json_solves (w, results);

  pl_json_writer_key (w, "parts");
  pl_json_writer_begin_object (w);
  for (guint i = 0; i < pl_compiled_get_n_parts (c); i++)
    json_part (w, results, pl_compiled_get_part (c, i));
  pl_json_writer_end_object (w);

  pl_json_writer_key (w, "findings");
  pl_json_writer_begin_array (w);
  for (guint i = 0; i < pl_results_get_n_findings (results); i++)
    {
      const PlFinding *f = pl_results_get_finding (results, i);
      const PlCompiledPart *p = pl_compiled_find_part (c, f->part_id);

      pl_json_writer_begin_object (w);
      pl_json_writer_member_string (w, "severity", pl_severity_get_key (f->severity));
      pl_json_writer_member_string (w, "code", f->code);
      pl_json_writer_member_string (w, "part", f->part_id);
      pl_json_writer_member_string (w, "tag", p != NULL ? p->tag : NULL);
      pl_json_writer_member_string (w, "port", f->port_key);
      pl_json_writer_member_string (w, "message", f->message);
      json_opt (w, "value", f->value != 0.0 || f->limit != 0.0, f->value);
      json_opt (w, "limit", f->value != 0.0 || f->limit != 0.0, f->limit);
      pl_json_writer_end_object (w);
    }
  pl_json_writer_end_array (w);
  pl_json_writer_end_object (w);
  return pl_json_writer_finish (w);
}

/* ------------------------------------------------------------------------
 * CSV: part_id,tag,type,item,quantity,case,value,unit,note
 * ------------------------------------------------------------------------ */

/* RFC 4180 sec. 2: a field with a comma, quote or line break is quoted,
 * quotes doubled. */
static void
csv_field (GString *out, const char *text, gboolean last)
{
  if (text == NULL)
    text = "";
  if (strpbrk (text, ",\"\r\n") != NULL)
    {
      g_string_append_c (out, '"');
      for (const char *p = text; *p != '\0'; p++)
        {
          if (*p == '"')
            g_string_append_c (out, '"');
          g_string_append_c (out, *p);
        }
      g_string_append_c (out, '"');
    }
  else
    g_string_append (out, text);
  g_string_append (out, last ? "\r\n" : ",");
}

typedef struct
{
  GString *out;
  const PlUnitPrefs *prefs;
} CsvWriter;

static void
csv_row (CsvWriter *cw, const PlCompiledPart *p, const char *item, const char *quantity,
         const char *cs, gboolean ok, double value_si, PlQuantity q, const char *note)
{
  PlUnitId unit = pl_unit_prefs_get_unit (cw->prefs, q);
  const PlUnit *u = pl_unit_get (unit);
  g_autofree char *number = NULL;

  /* Six digits: enough to compare runs, short enough to read. */
  if (ok && isfinite (value_si))
    number = pl_unit_format_number_in (value_si, unit, 6, '.');
  csv_field (cw->out, p != NULL ? p->id : "", FALSE);
  csv_field (cw->out, p != NULL ? p->tag : "", FALSE);
  csv_field (cw->out, p != NULL ? p->type->key : "system", FALSE);
  csv_field (cw->out, item, FALSE);
  csv_field (cw->out, quantity, FALSE);
  csv_field (cw->out, cs, FALSE);
  csv_field (cw->out, number, FALSE);
  csv_field (cw->out, u != NULL ? u->key : "", FALSE);
  csv_field (cw->out, note, TRUE);
}

static void
csv_part (CsvWriter *cw, const PlResults *r, const PlCompiledPart *p)
{
  double v = 0.0, mass = 0.0, dev = 0.0, first = 0.0;

  for (guint k = 0; k < p->n_ports; k++)
    {
      const char *port = p->type->ports[k].key;
      gboolean ok;

      for (guint kind = 0; kind < PL_N_PRESSURES; kind++)
        {
          ok = pl_results_get_port_pressure (r, p->id, port, kind, &v);
          csv_row (cw, p, port, "pressure", pl_pressure_kind_get_key (kind), ok, v,
                   PL_QUANTITY_PRESSURE, NULL);
        }
      ok = pl_results_get_port_recovery (r, p->id, port, &v) && v >= 0.0;
      csv_row (cw, p, port, "recovery_time", "cycle", ok, v, PL_QUANTITY_TIME, NULL);
    }
  for (guint c = 0; c < PL_N_CASES; c++)
    {
      const char *cs = pl_steady_case_get_key (c);
      pls_line_result l = { 0 };
      pls_pump_result pr = { 0 };
      gboolean ok;

      if (pl_report_is_line (p))
        {
          ok = pl_results_get_line (r, p->id, c, &l);
          csv_row (cw, p, "", "flow", cs, ok, l.flow, PL_QUANTITY_FLOW, NULL);
          csv_row (cw, p, "", "velocity", cs, ok, l.velocity, PL_QUANTITY_VELOCITY, NULL);
          csv_row (cw, p, "", "reynolds", cs, ok, l.reynolds, PL_QUANTITY_RATIO,
                   ok ? pl_report_regime_key (l.regime) : NULL);
          csv_row (cw, p, "", "wall_shear_rate", cs, ok, l.wall_shear_rate,
                   PL_QUANTITY_SHEAR_RATE, NULL);
        }
      else if (p->type->kind == PL_PART_TEE)
        for (guint k = 0; k < 3; k++)
          {
            ok = pl_results_get_flow (r, p->id, k, c, &v);
            csv_row (cw, p, tee_legs[k], "flow", cs, ok, v, PL_QUANTITY_FLOW, NULL);
          }
      else if (pl_report_has_flow (p))
        {
          ok = pl_results_get_flow (r, p->id, 0, c, &v);
          csv_row (cw, p, "", "flow", cs, ok, v, PL_QUANTITY_FLOW, NULL);
        }
      else if (p->type->kind == PL_PART_PUMP)
        {
          ok = pl_results_get_pump (r, p->id, c, &pr);
          csv_row (cw, p, "", "flow", cs, ok, pr.flow, PL_QUANTITY_FLOW, NULL);
          csv_row (cw, p, "", "stall_pressure", cs, ok, pr.stall_pressure,
                   PL_QUANTITY_PRESSURE, NULL);
          csv_row (cw, p, "", "free_flow", cs, ok, pr.free_flow, PL_QUANTITY_FLOW, NULL);
        }
    }
  if (p->type->kind == PL_PART_APPLICATOR)
    {
      gboolean ok = pl_results_get_shot (r, p->id, &mass, &dev, &first);

      csv_row (cw, p, "", "shot_mass", "cycle", ok, mass, PL_QUANTITY_MASS, NULL);
      csv_row (cw, p, "", "shot_deviation", "cycle", ok, dev, PL_QUANTITY_RATIO, NULL);
      csv_row (cw, p, "", "first_shot_mass", "cycle", ok, first, PL_QUANTITY_MASS, NULL);
    }
  else if (p->type->kind == PL_PART_ACCUMULATOR)
    {
      pls_cycle_accumulator s = { 0 };
      gboolean ok = pl_results_get_accumulator_swing (r, p->id, &s);

      csv_row (cw, p, "", "swing_min_pressure", "cycle", ok, s.min_pressure,
               PL_QUANTITY_PRESSURE, NULL);
      csv_row (cw, p, "", "swing_max_pressure", "cycle", ok, s.max_pressure,
               PL_QUANTITY_PRESSURE, NULL);
      csv_row (cw, p, "", "swing_min_fluid_volume", "cycle", ok, s.min_fluid_volume,
               PL_QUANTITY_VOLUME, NULL);
      csv_row (cw, p, "", "swing_max_fluid_volume", "cycle", ok, s.max_fluid_volume,
               PL_QUANTITY_VOLUME, NULL);
    }
}

char *
pl_report_write_csv (const PlResults *results, const PlUnitPrefs *prefs)
{
  CsvWriter cw;
  PlCompiled *c;
  double t = NAN;
  gboolean ok;

  g_return_val_if_fail (results != NULL, NULL);
  c = pl_results_get_compiled (results);
  cw.out = g_string_new ("part_id,tag,type,item,quantity,case,value,unit,note\r\n");
  cw.prefs = prefs;
  for (guint i = 0; i < pl_compiled_get_n_parts (c); i++)
    csv_part (&cw, results, pl_compiled_get_part (c, i));
  ok = pl_results_get_shutdown_safe_time (results, &t) && t >= 0.0;
  csv_row (&cw, NULL, "", "time_to_safe", "shutdown", ok, t, PL_QUANTITY_TIME, NULL);
  for (guint i = 0; i < pl_results_get_n_findings (results); i++)
    {
      const PlFinding *f = pl_results_get_finding (results, i);
      const PlCompiledPart *p = pl_compiled_find_part (c, f->part_id);
      g_autofree char *quantity = g_strconcat ("finding:", f->code, NULL);

      csv_field (cw.out, f->part_id, FALSE);
      csv_field (cw.out, p != NULL ? p->tag : "", FALSE);
      csv_field (cw.out, p != NULL ? p->type->key : "system", FALSE);
      csv_field (cw.out, f->port_key, FALSE);
      csv_field (cw.out, quantity, FALSE);
      csv_field (cw.out, pl_severity_get_key (f->severity), FALSE);
      csv_field (cw.out, "", FALSE);
      csv_field (cw.out, "", FALSE);
      csv_field (cw.out, f->message, TRUE);
    }
  return g_string_free (cw.out, FALSE);
}

/* ------------------------------------------------------------------------
 * Text
 * ------------------------------------------------------------------------ */

static char *
fmt (const PlUnitPrefs *prefs, PlQuantity q, gboolean ok, double v)
{
  if (!ok || !isfinite (v))
    return g_strdup ("–");
  return pl_unit_format (v, q, prefs, 4, PL_UNIT_DECIMAL_FROM_LOCALE);
}

static const char *
pl_report_severity_label (pls_severity s)
{
  switch (s)
    {
    case PLS_SEVERITY_INFO:
      return _("info");
    case PLS_SEVERITY_WARNING:
      return _("warning");
    case PLS_SEVERITY_ERROR:
      return _("error");
    default:
      return _("error");
    }
}

static void
text_part (GString *out, const PlResults *r, const PlCompiledPart *p,
           const PlUnitPrefs *prefs)
{
  double v;

  /* Translators: a part's heading in the report: its tag and type name. */
  g_string_append_printf (out, _("%s (%s)"), p->tag, _(p->type->name));
  if (!p->compiled)
    g_string_append_printf (out, " — %s", _("not solved"));
  g_string_append_c (out, '\n');

  for (guint k = 0; k < p->n_ports; k++)
    {
      const char *port = p->type->ports[k].key;
      double lo = 0, hi = 0, idle = 0, open = 0;
      gboolean ok_idle = pl_results_get_port_pressure (r, p->id, port, PL_PRESSURE_IDLE, &idle);
      gboolean ok_open = pl_results_get_port_pressure (r, p->id, port,
                                                      PL_PRESSURE_STEADY_OPEN, &open);
      gboolean ok_lo = pl_results_get_port_pressure (r, p->id, port, PL_PRESSURE_CYCLE_MIN,
                                                    &lo);
      gboolean ok_hi = pl_results_get_port_pressure (r, p->id, port, PL_PRESSURE_CYCLE_MAX,
                                                    &hi);
      g_autofree char *s_idle = fmt (prefs, PL_QUANTITY_PRESSURE, ok_idle, idle);
      g_autofree char *s_open = fmt (prefs, PL_QUANTITY_PRESSURE, ok_open, open);
      g_autofree char *s_lo = fmt (prefs, PL_QUANTITY_PRESSURE, ok_lo, lo);
      g_autofree char *s_hi = fmt (prefs, PL_QUANTITY_PRESSURE, ok_hi, hi);

      /* Translators: one port's pressures: port name, then the idle, the
       * steady-open, and the lowest and highest over the firing cycle. */
      g_string_append_printf (out, _("  %s: idle %s, all open %s, cycle %s to %s\n"),
                              _(p->type->ports[k].label), s_idle, s_open, s_lo, s_hi);
    }

  if (pl_report_is_line (p))
    {
      pls_line_result l;

      if (pl_results_get_line (r, p->id, PL_CASE_STEADY_OPEN, &l))
        {
          g_autofree char *q = fmt (prefs, PL_QUANTITY_FLOW, TRUE, l.flow);
          g_autofree char *vel = fmt (prefs, PL_QUANTITY_VELOCITY, TRUE, l.velocity);
          const char *regime = l.regime == PLS_FLOW_LAMINAR ? _("laminar")
                               : l.regime == PLS_FLOW_TRANSITION ? _("transition")
                               : _("turbulent");

          /* Translators: flow, velocity, Reynolds number and flow regime of a
           * line with every applicator open. */
          g_string_append_printf (out, _("  all open: flow %s, velocity %s, Re %.3g (%s)\n"),
                                  q, vel, l.reynolds, regime);
        }
    }
  else if (p->type->kind == PL_PART_PUMP)
    {
      pls_pump_result pr;

      if (pl_results_get_pump (r, p->id, PL_CASE_STEADY_OPEN, &pr))
        {
          g_autofree char *q = fmt (prefs, PL_QUANTITY_FLOW, TRUE, pr.flow);
          g_autofree char *pp = fmt (prefs, PL_QUANTITY_PRESSURE, TRUE, pr.outlet_pressure);
          g_autofree char *st = fmt (prefs, PL_QUANTITY_PRESSURE, TRUE, pr.stall_pressure);
          g_autofree char *qf = fmt (prefs, PL_QUANTITY_FLOW, TRUE, pr.free_flow);

          /* Translators: the pump's operating point with every applicator
           * open, then its stall pressure and free flow. */
          g_string_append_printf (out, _("  operating point: %s at %s (stall %s, free flow %s)\n"),
                                  q, pp, st, qf);
        }
    }
  else if (p->type->kind == PL_PART_APPLICATOR)
    {
      double mass, dev;

      if (pl_results_get_flow (r, p->id, 0, PL_CASE_STEADY_OPEN, &v))
        {
          g_autofree char *q = fmt (prefs, PL_QUANTITY_FLOW, TRUE, v);

          g_string_append_printf (out, _("  held open: flow %s\n"), q);
        }
      if (pl_results_get_shot (r, p->id, &mass, &dev, NULL))
        {
          g_autofree char *m = fmt (prefs, PL_QUANTITY_MASS, TRUE, mass);

          /* Translators: mass per shot and its deviation from the mean, in %. */
          g_string_append_printf (out, _("  shot: %s (%+.2f %% from the mean)\n"), m,
                                  100.0 * dev);
        }
    }
  else if (p->type->kind == PL_PART_ACCUMULATOR)
    {
      pls_cycle_accumulator s;

      if (pl_results_get_accumulator_swing (r, p->id, &s))
        {
          g_autofree char *lo = fmt (prefs, PL_QUANTITY_PRESSURE, TRUE, s.min_pressure);
          g_autofree char *hi = fmt (prefs, PL_QUANTITY_PRESSURE, TRUE, s.max_pressure);
          g_autofree char *vlo = fmt (prefs, PL_QUANTITY_VOLUME, TRUE, s.min_fluid_volume);
          g_autofree char *vhi = fmt (prefs, PL_QUANTITY_VOLUME, TRUE, s.max_fluid_volume);

          /* Translators: pressure and stored-volume swing over the cycle. */
          g_string_append_printf (out, _("  swing: %s to %s, stored %s to %s\n"), lo, hi, vlo,
                                  vhi);
        }
    }
}

char *
pl_report_write_text (const PlResults *results, const PlUnitPrefs *prefs, const char *source)
{
  GString *out = g_string_new (NULL);
  PlCompiled *c;
  const pls_cycle_result *cy;
  double t;

  g_return_val_if_fail (results != NULL, NULL);
  c = pl_results_get_compiled (results);
  cy = pl_results_get_cycle (results);

  if (source != NULL)
    /* Translators: report heading: the layout's file name. */
    g_string_append_printf (out, _("Pressline report for %s\n"), source);
  else
    g_string_append_printf (out, "%s\n", _("Pressline report"));

  g_string_append_printf (out, "%s %s, %s %s\n", _("Idle solve:"),
                          pl_results_get_converged (results, PL_CASE_IDLE) ? _("converged")
                                                                           : _("not solved"),
                          _("all-open solve:"),
                          pl_results_get_converged (results, PL_CASE_STEADY_OPEN)
                          ? _("converged") : _("not solved"));
  if (cy != NULL)
    g_string_append_printf (out, pls_cycle_result_periodic (cy)
                                 ? _("Firing cycle: periodic after %d cycles\n")
                                 : _("Firing cycle: not periodic after %d cycles\n"),
                            pls_cycle_result_cycles (cy));
  else
    g_string_append_printf (out, "%s\n", _("Firing cycle: not available"));
  if (pl_results_get_shutdown_safe_time (results, &t))
    {
      if (t >= 0.0)
        {
          g_autofree char *s = fmt (prefs, PL_QUANTITY_TIME, TRUE, t);

          g_string_append_printf (out, _("Shutdown: safe after %s\n"), s);
        }
      else
        g_string_append_printf (out, "%s\n", _("Shutdown: not safe within the time followed"));
    }
  else
    g_string_append_printf (out, "%s\n", _("Shutdown: not available"));

  g_string_append_printf (out, "\n%s\n", _("Parts"));
  for (guint i = 0; i < pl_compiled_get_n_parts (c); i++)
    text_part (out, results, pl_compiled_get_part (c, i), prefs);

  g_string_append_printf (out, "\n%s\n", _("Findings"));
  if (pl_results_get_n_findings (results) == 0)
    g_string_append_printf (out, "  %s\n", _("none"));
  for (guint i = 0; i < pl_results_get_n_findings (results); i++)
    {
      const PlFinding *f = pl_results_get_finding (results, i);
      g_autofree char *sentence = pl_finding_format_sentence (f, results, prefs);

      /* The sentence people read, in their units (the solver's own
       * message, in fixed units, stays in the JSON and CSV). */
      g_string_append_printf (out, "  %-8s %-20s %s\n", pl_report_severity_label (f->severity),
                              f->code, sentence);
    }
  return g_string_free (out, FALSE);
}

char *
pl_report_write (const PlResults *results, PlReportFormat format, const PlUnitPrefs *prefs,
                 const char *source)
{
  switch (format)
    {
    case PL_REPORT_TEXT:
      return pl_report_write_text (results, prefs, source);
    case PL_REPORT_CSV:
      return pl_report_write_csv (results, prefs);
    case PL_REPORT_JSON:
      return pl_report_write_json (results, source);
    case PL_N_REPORT_FORMATS:
    default:
      g_return_val_if_reached (NULL);
    }
}
