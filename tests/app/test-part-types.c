/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Part types: the tables are complete and consistent, every default lies in
 * its range and maps onto parameter structs that the solver's own
 * validators accept, range refusals name the field and the limit, the
 * cross-field rules match the solver's, and port geometry follows the
 * part's mirror and rotation.
 */

#include "config.h"

#include <glib.h>
#include <math.h>
#include <string.h>

#include "pl-check.h"

/* A GError of the given domain and code (not just any failure). */
#define ck_assert_error(err, dom, cod)                                          \
  ck_assert_msg ((err) != NULL && (err)->domain == (dom) && (err)->code == (int) (cod), \
                 "expected error code %d, got %s", (int) (cod),                 \
                 (err) != NULL ? (err)->message : "none")

#include "pl-command.h"
#include "pl-document.h"
#include "pl-part-type.h"
#include "pls-laws.h"   /* the solver's validators, called as the reference */

/* --- tables ------------------------------------------------------------ */

static const PlPartType *
kind_type (int i)
{
  return pl_part_type_get ((PlPartKind) i);
}

START_TEST (test_type_identity)
{
  const PlPartType *t = kind_type (_i);

  ck_assert_ptr_nonnull (t);
  ck_assert_int_eq (t->kind, _i);
  ck_assert_ptr_eq (pl_part_type_lookup (t->key), t);
  ck_assert_ptr_nonnull (t->name);
  ck_assert_ptr_nonnull (t->description);
  ck_assert_int_gt (strlen (t->name), 0);
  ck_assert_int_gt (strlen (t->description), 0);
  for (const char *k = t->key; *k != '\0'; k++)
    ck_assert_msg (g_ascii_islower (*k) || *k == '-', "type key %s is not lower-case ASCII",
                   t->key);
  if (t->placeable)
    {
      ck_assert_int_gt (strlen (t->tag_prefix), 0);
      for (const char *p = t->tag_prefix; *p != '\0'; p++)
        ck_assert (g_ascii_isupper (*p));
      ck_assert_int_gt (t->n_ports, 0);
      ck_assert (t->half_width > 0.0 && t->half_height > 0.0);
    }
  else
    ck_assert_int_eq (t->n_ports, 0);
}
END_TEST

START_TEST (test_registry)
{
  guint n = pl_part_type_get_n_placeable ();

  /* The ten placeable kinds of the issue, in shelf order, then nothing. */
  ck_assert_uint_eq (n, 10);
  for (guint i = 0; i < n; i++)
    ck_assert (pl_part_type_get_placeable (i)->placeable);
  ck_assert_ptr_null (pl_part_type_get_placeable (n));
  ck_assert_ptr_null (pl_part_type_get (PL_N_PART_KINDS));
  ck_assert_ptr_null (pl_part_type_lookup ("no-such-type"));
  ck_assert_ptr_null (pl_part_type_lookup (NULL));
  ck_assert (!pl_part_type_lookup ("scenario")->placeable);
  ck_assert (!pl_part_type_lookup ("title")->placeable);
  /* Prefixes and keys are distinct. */
  for (int a = 0; a < PL_N_PART_KINDS; a++)
    for (int b = a + 1; b < PL_N_PART_KINDS; b++)
      {
        ck_assert_str_ne (kind_type (a)->key, kind_type (b)->key);
        if (kind_type (a)->placeable && kind_type (b)->placeable)
          ck_assert_str_ne (kind_type (a)->tag_prefix, kind_type (b)->tag_prefix);
      }
}
END_TEST

START_TEST (test_ports)
{
  const PlPartType *t = kind_type (_i);

  for (guint i = 0; i < t->n_ports; i++)
    {
      const PlPortSpec *p = &t->ports[i];
      guint index = G_MAXUINT;

      ck_assert_ptr_eq (pl_part_type_find_port (t, p->key, &index), p);
      ck_assert_uint_eq (index, i);
      ck_assert_ptr_nonnull (p->label);
      for (guint k = i + 1; k < t->n_ports; k++)
        ck_assert_str_ne (p->key, t->ports[k].key);
      /* A port sits on the edge of the symbol's box, on the side it faces,
       * so a wire leaves the symbol rather than crossing it. */
      switch (p->side)
        {
        case PL_SIDE_EAST:
          ck_assert_double_eq (p->x, t->half_width);
          break;
        case PL_SIDE_WEST:
          ck_assert_double_eq (p->x, -t->half_width);
          break;
        case PL_SIDE_SOUTH:
          ck_assert_double_eq (p->y, t->half_height);
          break;
        case PL_SIDE_NORTH:
          ck_assert_double_eq (p->y, -t->half_height);
          break;
        default:
          ck_abort_msg ("port %s of %s faces no side", p->key, t->key);
        }
    }
  ck_assert_ptr_null (pl_part_type_find_port (t, "nope", NULL));
}
END_TEST

START_TEST (test_params)
{
  const PlPartType *t = kind_type (_i);

  ck_assert_int_gt (t->n_params, 0);
  for (guint i = 0; i < t->n_params; i++)
    {
      const PlParamSpec *s = &t->params[i];
      g_autoptr (GError) error = NULL;
      PlValue v;
      guint index = G_MAXUINT;

      ck_assert_ptr_nonnull (s->key);
      ck_assert_ptr_eq (pl_part_type_find_param (t, s->key, &index), s);
      ck_assert_uint_eq (index, i);
      for (const char *k = s->key; *k != '\0'; k++)
        ck_assert_msg (g_ascii_islower (*k) || g_ascii_isdigit (*k) || *k == '-',
                       "param key %s", s->key);
      for (guint k = i + 1; k < t->n_params; k++)
        ck_assert_str_ne (s->key, t->params[k].key);
      ck_assert_msg (s->label != NULL && s->label[0] != '\0', "%s.%s label", t->key, s->key);
      ck_assert_msg (s->help != NULL && s->help[0] != '\0', "%s.%s help", t->key, s->key);
      ck_assert_int_lt (s->quantity, PL_N_QUANTITIES);

      /* The default passes the spec's own check. */
      pl_param_spec_default_value (s, &v);
      ck_assert_msg (pl_param_spec_check_value (s, &v, NULL, &error), "%s.%s default: %s",
                     t->key, s->key, error != NULL ? error->message : "");
      pl_value_clear (&v);

      if (s->kind == PL_PARAM_NUMBER)
        {
          /* Whatever the range allows must be typeable: a range reaching
           * below zero needs a quantity that takes a minus sign. */
          gboolean below_zero = s->min_bound == PL_BOUND_NONE || s->min < 0.0;

          if (below_zero)
            ck_assert_msg (pl_quantity_may_be_negative (s->quantity),
                           "%s.%s allows negative values its quantity refuses", t->key,
                           s->key);
          if (s->min_bound != PL_BOUND_NONE && s->max_bound != PL_BOUND_NONE)
            ck_assert (s->min < s->max);
        }
      else if (s->kind == PL_PARAM_CHOICE)
        {
          ck_assert_int_gt (s->n_choices, 1);
          ck_assert_uint_lt (s->default_choice, s->n_choices);
          for (guint c = 0; c < s->n_choices; c++)
            {
              ck_assert_int_eq (pl_param_spec_find_choice (s, s->choices[c].key), (int) c);
              ck_assert_ptr_nonnull (s->choices[c].label);
            }
          ck_assert_int_eq (pl_param_spec_find_choice (s, "nope"), -1);
        }
      else if (s->kind == PL_PARAM_TEXT)
        ck_assert_uint_gt (s->max_length, 0);

      if (s->depends_on != NULL)
        {
          const PlParamSpec *dep = pl_part_type_find_param (t, s->depends_on, NULL);

          ck_assert_ptr_nonnull (dep);
          ck_assert_int_eq (dep->kind, PL_PARAM_CHOICE);
          ck_assert_uint_ne (s->depends_mask, 0);
          ck_assert_uint_eq (s->depends_mask & ~((1u << dep->n_choices) - 1), 0);
        }
    }
}
END_TEST

/* Every placeable part sits at a height, and every part that holds
 * pressure has a rating (the gauge has its full scale instead, a drain is
 * at atmosphere). */
START_TEST (test_common_params)
{
  const PlPartType *t = kind_type (_i);

  if (!t->placeable)
    return;
  ck_assert_ptr_nonnull (pl_part_type_find_param (t, "elevation", NULL));
  if (t->kind != PL_PART_GAUGE && t->kind != PL_PART_DRAIN)
    ck_assert_msg (pl_part_type_find_param (t, "rated-pressure", NULL) != NULL,
                   "%s has no rated pressure", t->key);
}
END_TEST

/* --- defaults against the solver's validators -------------------------- */

/* A document with one part of each placeable type, at defaults. */
static PlDocument *
one_of_each (void)
{
  PlDocument *doc = pl_document_new ();

  for (guint i = 0; i < pl_part_type_get_n_placeable (); i++)
    {
      g_autoptr (PlCommand) cmd = pl_command_new_add_part (pl_part_type_get_placeable (i)->key,
                                                           NULL, 100.0 * i, 0.0);

      ck_assert (pl_command_apply (cmd, doc, NULL));
    }
  return doc;
}

START_TEST (test_defaults_pass_solver_validators)
{
  g_autoptr (PlDocument) doc = one_of_each ();
  char why[256] = "";

  for (guint i = 0; i < pl_document_get_n_parts (doc); i++)
    {
      const PlPart *part = pl_document_get_part (doc, i);
      g_autoptr (GError) error = NULL;
      pls_line_params line;
      pls_fitting_params legs[3];
      pls_valve_params valve;
      pls_pump_params pump;
      pls_nozzle_params nozzle;
      pls_accumulator_params acc;
      pls_gauge_params gauge;

      ck_assert (pl_document_check_part (doc, part, NULL, &error));
      switch (pl_part_get_part_type (part)->kind)
        {
        case PL_PART_HOSE:
        case PL_PART_PIPE:
          ck_assert (pl_part_get_line_params (part, &line, &error));
          ck_assert_msg (pls_line_params_check (&line, why, sizeof why) == PLS_OK, "%s", why);
          break;
        case PL_PART_TEE:
          ck_assert (pl_part_get_tee_legs (part, legs, &error));
          for (guint k = 0; k < 3; k++)
            ck_assert_msg (pls_fitting_params_check (&legs[k], why, sizeof why) == PLS_OK,
                           "%s", why);
          break;
        case PL_PART_BALL_VALVE:
        case PL_PART_DUMP_VALVE:
          ck_assert (pl_part_get_valve_params (part, &valve, &error));
          ck_assert_msg (pls_valve_params_check (&valve, why, sizeof why) == PLS_OK, "%s", why);
          break;
        case PL_PART_PUMP:
          ck_assert (pl_part_get_pump_params (part, &pump, &error));
          ck_assert_msg (pls_pump_params_check (&pump, why, sizeof why) == PLS_OK, "%s", why);
          break;
        case PL_PART_APPLICATOR:
          ck_assert (pl_part_get_nozzle_params (part, &nozzle, &error));
          ck_assert_msg (pls_nozzle_params_check (&nozzle, why, sizeof why) == PLS_OK, "%s",
                         why);
          break;
        case PL_PART_ACCUMULATOR:
          ck_assert (pl_part_get_accumulator_params (part, &acc, &error));
          ck_assert_msg (pls_accumulator_params_check (&acc, why, sizeof why) == PLS_OK, "%s",
                         why);
          break;
        case PL_PART_GAUGE:
          ck_assert (pl_part_get_gauge_params (part, &gauge, &error));
          ck_assert (gauge.full_scale > 0.0);
          break;
        case PL_PART_DRAIN:
        case PL_PART_SCENARIO:
        case PL_PART_TITLE:
        case PL_N_PART_KINDS:
        default:
          break;
        }
      ck_assert_ptr_null (error);
    }
}
END_TEST

/* The scenario's defaults are accepted by the solver: the fluid by its
 * validator, and the options by a real steady solve of the smallest line
 * (pump -> hose -> applicator, all at defaults), which runs the solver's
 * option checks before it solves. */
START_TEST (test_scenario_defaults_solve)
{
  g_autoptr (PlDocument) doc = pl_document_new ();
  g_autoptr (GError) error = NULL;
  const PlPart *scenario = pl_document_get_scenario (doc);
  pls_fluid_params fluid;
  pls_steady_options steady;
  pls_transient_options transient, defaults;
  pls_line_params line;
  pls_pump_params pump;
  pls_nozzle_params nozzle;
  pls_network *net;
  pls_steady_result *result = NULL;
  pls_error err;
  int drum, n1, n2;
  char why[256] = "";
  const char *keys[] = { "pump", "hose", "applicator" };

  ck_assert (pl_scenario_get_fluid_params (scenario, &fluid, &error));
  ck_assert_msg (pls_fluid_params_check (&fluid, why, sizeof why) == PLS_OK, "%s", why);
  ck_assert (pl_scenario_get_steady_options (scenario, &steady, &error));
  ck_assert (pl_scenario_get_transient_options (scenario, &transient, &error));
  /* The scenario's defaults are the solver's own. */
  pls_transient_options_init (&defaults);
  ck_assert_double_eq (transient.cycle_rate, defaults.cycle_rate);
  ck_assert_double_eq (transient.on_time, defaults.on_time);
  ck_assert_double_eq (transient.safe_pressure, defaults.safe_pressure);
  ck_assert_double_eq (transient.uniformity_tolerance, defaults.uniformity_tolerance);

  for (guint i = 0; i < G_N_ELEMENTS (keys); i++)
    {
      g_autoptr (PlCommand) cmd = pl_command_new_add_part (keys[i], NULL, 0.0, 0.0);

      ck_assert (pl_command_apply (cmd, doc, NULL));
    }
  ck_assert (pl_part_get_pump_params (pl_document_find_part (doc, "p1"), &pump, NULL));
  ck_assert (pl_part_get_line_params (pl_document_find_part (doc, "p2"), &line, NULL));
  ck_assert (pl_part_get_nozzle_params (pl_document_find_part (doc, "p3"), &nozzle, NULL));

  net = pls_network_new (&fluid, NULL, &err);
  ck_assert_ptr_nonnull (net);
  drum = pls_network_add_fixed_node (net, 0.0, 0.0, "drum", &err);
  n1 = pls_network_add_node (net, 0.0, NULL, &err);
  n2 = pls_network_add_node (net, 0.0, NULL, &err);
  ck_assert_int_ge (pls_network_add_pump (net, drum, n1, &pump, "P1", &err), 0);
  ck_assert_int_ge (pls_network_add_line (net, n1, n2, &line, "H1", &err), 0);
  ck_assert_int_ge (pls_network_add_nozzle (net, n2, &nozzle, "N1", &err), 0);
  steady.applicators = PLS_APPLICATORS_ALL;
  ck_assert_msg (pls_solve_steady (net, &steady, &result, &err) == PLS_OK, "%s", err.message);
  ck_assert (pls_steady_result_converged (result));
  /* Open flow is positive and below the pump's free flow (displacement x
   * rate), as the pump curve Q = Q_free (1 - p/p_stall)^m demands. */
  ck_assert (pls_steady_element_flow (result, 2) > 0.0);
  ck_assert (pls_steady_element_flow (result, 2) < pump.displacement * pump.max_cycle_rate);
  pls_steady_result_free (result);
  pls_network_free (net);
}
END_TEST

/* Hooper's 2-K constants for a threaded tee (Hooper, Chem. Eng., Aug. 24
 * 1981, table 1; from memory): through the run K1 200, Kinf 0.10; used as an
 * elbow (through the branch) K1 500, Kinf 0.70.  The star split must give
 * these back along each path. */
START_TEST (test_tee_split)
{
  g_autoptr (PlDocument) doc = pl_document_new ();
  g_autoptr (PlCommand) add = pl_command_new_add_part ("tee", NULL, 0.0, 0.0);
  pls_fitting_params legs[3];
  const PlPart *tee;

  ck_assert (pl_command_apply (add, doc, NULL));
  tee = pl_document_find_part (doc, "p1");
  ck_assert_double_eq (pl_part_get_number (tee, "run-k1"), 200.0);
  ck_assert_double_eq (pl_part_get_number (tee, "run-k-infinity"), 0.10);
  ck_assert_double_eq (pl_part_get_number (tee, "branch-k1"), 500.0);
  ck_assert_double_eq (pl_part_get_number (tee, "branch-k-infinity"), 0.70);
  ck_assert (pl_part_get_tee_legs (tee, legs, NULL));
  /* Sums of two halves and differences: exact to a few ulp. */
  ck_assert_double_eq_tol (legs[0].k1 + legs[1].k1, 200.0, 1e-12);
  ck_assert_double_eq_tol (legs[0].k_infinity + legs[1].k_infinity, 0.10, 1e-15);
  ck_assert_double_eq_tol (legs[0].k1 + legs[2].k1, 500.0, 1e-12);
  ck_assert_double_eq_tol (legs[1].k_infinity + legs[2].k_infinity, 0.70, 1e-15);
}
END_TEST

/* A linear passage: R = dp_ref / Q_ref.  Defaults 2 bar at 100 mL/min give
 * 2e5 Pa / (1e-4 m^3 / 60 s) = 1.2e11 Pa s/m^3 (arithmetic). */
START_TEST (test_nozzle_passage)
{
  g_autoptr (PlDocument) doc = pl_document_new ();
  g_autoptr (PlCommand) add = pl_command_new_add_part ("applicator", NULL, 0.0, 0.0);
  pls_nozzle_params n;

  ck_assert (pl_command_apply (add, doc, NULL));
  ck_assert (pl_part_get_nozzle_params (pl_document_find_part (doc, "p1"), &n, NULL));
  /* One division of two rounded operands: a relative 1e-15 is ample. */
  ck_assert_double_eq_tol (n.passage_resistance, 1.2e11, 1.2e11 * 1e-15);
  ck_assert_int_eq (n.cd_model, PLS_CD_LICHTAROWICZ);
}
END_TEST

START_TEST (test_wrong_kind_mapping)
{
  g_autoptr (PlDocument) doc = pl_document_new ();
  g_autoptr (PlCommand) add = pl_command_new_add_part ("gauge", NULL, 0.0, 0.0);
  g_autoptr (GError) error = NULL;
  pls_line_params line;

  ck_assert (pl_command_apply (add, doc, NULL));
  ck_assert (!pl_part_get_line_params (pl_document_find_part (doc, "p1"), &line, &error));
  ck_assert_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_WRONG_KIND);
  ck_assert_ptr_nonnull (strstr (error->message, "G1"));
  ck_assert_double_eq (pl_part_get_firing_delay (pl_document_find_part (doc, "p1")), 0.0);
}
END_TEST

/* --- range checks ------------------------------------------------------ */

typedef struct
{
  const char *type;
  const char *key;
  double value;
  gboolean ok;
  int code;
  const char *message;   /* exact, C locale, SI units; NULL: not checked */
} RangeCase;

static const RangeCase range_cases[] = {
  { "hose", "bore", 0.0, FALSE, PL_DOCUMENT_ERROR_OUT_OF_RANGE, "Bore must be more than 0 mm." },
  { "hose", "bore", -1e-3, FALSE, PL_DOCUMENT_ERROR_OUT_OF_RANGE, NULL },
  { "hose", "bore", 1e-9, TRUE, 0, NULL },
  { "hose", "bore", NAN, FALSE, PL_DOCUMENT_ERROR_INVALID_VALUE,
    "Bore must be a finite number." },
  { "hose", "length", INFINITY, FALSE, PL_DOCUMENT_ERROR_INVALID_VALUE, NULL },
  { "hose", "roughness", 0.0, TRUE, 0, NULL },
  { "hose", "rise", -12.0, TRUE, 0, NULL },
  { "hose", "rated-pressure", 0.0, TRUE, 0, NULL },
  { "hose", "rated-pressure", -1.0, FALSE, PL_DOCUMENT_ERROR_OUT_OF_RANGE,
    "Rated working pressure must be at least 0 bar. 0 means not rated." },
  { "pump", "curve-exponent", 0.1, TRUE, 0, NULL },
  { "pump", "curve-exponent", 10.0, TRUE, 0, NULL },
  { "pump", "curve-exponent", 10.5, FALSE, PL_DOCUMENT_ERROR_OUT_OF_RANGE, NULL },
  { "pump", "curve-exponent", 0.09, FALSE, PL_DOCUMENT_ERROR_OUT_OF_RANGE, NULL },
  { "pump", "ratio", 1000.0, TRUE, 0, NULL },
  { "accumulator", "polytropic-exponent", 1.0, TRUE, 0, NULL },
  { "accumulator", "polytropic-exponent", 1.67, TRUE, 0, NULL },
  { "accumulator", "polytropic-exponent", 1.7, FALSE, PL_DOCUMENT_ERROR_OUT_OF_RANGE, NULL },
  { "applicator", "discharge-coefficient", 1.0, TRUE, 0, NULL },
  { "applicator", "discharge-coefficient", 1.01, FALSE, PL_DOCUMENT_ERROR_OUT_OF_RANGE,
    "Discharge coefficient must be at most 1." },
  { "applicator", "discharge-coefficient", 0.0, FALSE, PL_DOCUMENT_ERROR_OUT_OF_RANGE, NULL },
  { "scenario", "flow-index", 2.0, FALSE, PL_DOCUMENT_ERROR_OUT_OF_RANGE,
    "Flow index n must be less than 2. Beyond 2 the flow would slow as the pressure rises." },
  { "scenario", "flow-index", 1.999, TRUE, 0, NULL },
  { "scenario", "air-pressure", 0.0, TRUE, 0, NULL },
  { "scenario", "temperature", 0.0, FALSE, PL_DOCUMENT_ERROR_OUT_OF_RANGE, NULL },
  { "gauge", "full-scale", 0.0, FALSE, PL_DOCUMENT_ERROR_OUT_OF_RANGE,
    "Full scale must be more than 0 bar." },
};

START_TEST (test_range)
{
  const RangeCase *c = &range_cases[_i];
  const PlPartType *t = pl_part_type_lookup (c->type);
  const PlParamSpec *s = pl_part_type_find_param (t, c->key, NULL);
  g_autoptr (GError) error = NULL;
  gboolean ok;

  ck_assert_ptr_nonnull (s);
  ok = pl_param_spec_check_number (s, c->value, NULL, &error);
  ck_assert_msg (ok == c->ok, "%s.%s = %g", c->type, c->key, c->value);
  if (c->ok)
    ck_assert_ptr_null (error);
  else
    {
      ck_assert_error (error, PL_DOCUMENT_ERROR, c->code);
      if (c->message != NULL)
        ck_assert_str_eq (error->message, c->message);
    }
}
END_TEST

/* The limit is shown in the user's units. */
START_TEST (test_range_units)
{
  const PlParamSpec *s = pl_part_type_find_param (pl_part_type_lookup ("gauge"), "full-scale",
                                                  NULL);
  g_autoptr (GError) error = NULL;
  PlUnitPrefs us;

  pl_unit_prefs_init (&us, PL_UNIT_SYSTEM_US);
  ck_assert (!pl_param_spec_check_number (s, -5.0, &us, &error));
  ck_assert_str_eq (error->message, "Full scale must be more than 0 psi.");
}
END_TEST

START_TEST (test_kind_checks)
{
  const PlPartType *title = pl_part_type_lookup ("title");
  const PlParamSpec *text = pl_part_type_find_param (title, "site", NULL);
  const PlParamSpec *num = pl_part_type_find_param (pl_part_type_lookup ("hose"), "bore", NULL);
  g_autofree char *long_text = g_strnfill (text->max_length + 1, 'x');
  g_autofree char *max_text = g_strnfill (text->max_length, 'x');
  PlValue v = { .kind = PL_PARAM_TEXT, .text = (char *) "Halle 3" };
  GError *error = NULL;

  ck_assert (!pl_param_spec_check_number (text, 1.0, NULL, &error));
  ck_assert_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_WRONG_KIND);
  g_clear_error (&error);
  ck_assert (!pl_param_spec_check_text (num, "x", &error));
  ck_assert_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_WRONG_KIND);
  g_clear_error (&error);
  ck_assert (!pl_param_spec_check_value (num, &v, NULL, &error));
  ck_assert_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_WRONG_KIND);
  g_clear_error (&error);
  ck_assert (pl_param_spec_check_value (text, &v, NULL, NULL));
  ck_assert (pl_param_spec_check_text (text, max_text, NULL));
  ck_assert (!pl_param_spec_check_text (text, long_text, &error));
  ck_assert_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INVALID_VALUE);
  g_clear_error (&error);
  ck_assert (!pl_param_spec_check_text (text, "line\none", &error));
  ck_assert_str_eq (error->message, "Site must be one line without control characters.");
  g_clear_error (&error);
  ck_assert (!pl_param_spec_check_text (text, "\xff\xfe", &error));
  ck_assert_str_eq (error->message, "Site must be valid UTF-8 text.");
  g_clear_error (&error);
  ck_assert (!pl_param_spec_check_text (text, NULL, &error));
  g_clear_error (&error);
  /* Characters, not bytes: max_length umlauts are fine. */
  {
    GString *s = g_string_new (NULL);

    for (guint i = 0; i < text->max_length; i++)
      g_string_append (s, "ä");
    ck_assert (pl_param_spec_check_text (text, s->str, NULL));
    g_string_free (s, TRUE);
  }
}
END_TEST

START_TEST (test_values)
{
  PlValue a = { .kind = PL_PARAM_TEXT, .text = (char *) "abc" };
  PlValue b, n1 = { .kind = PL_PARAM_NUMBER, .number = 0.1 };
  PlValue n2 = { .kind = PL_PARAM_NUMBER, .number = 0.1 + 1e-18 };
  PlValue n3 = { .kind = PL_PARAM_NUMBER, .number = nextafter (0.1, 1.0) };

  pl_value_copy (&a, &b);
  ck_assert_ptr_ne (a.text, b.text);
  ck_assert (pl_value_equal (&a, &b));
  pl_value_clear (&b);
  ck_assert_ptr_null (b.text);
  pl_value_clear (&b);   /* twice is fine */
  /* Exact comparison: one ulp apart is different, below an ulp is equal. */
  ck_assert (pl_value_equal (&n1, &n2));
  ck_assert (!pl_value_equal (&n1, &n3));
  ck_assert (!pl_value_equal (&n1, &a));
}
END_TEST

/* --- cross-field rules ------------------------------------------------- */

typedef struct
{
  const char *type;
  const char *key;
  double value;
  const char *message;   /* NULL: consistent */
} CrossCase;

/* Each line sets one value of a part at defaults; the message is the one
 * that pl_document_check_part must give (C locale, SI units).  The rules
 * are those of solver/pls-params.c and the time-domain schedule check. */
static const CrossCase cross_cases[] = {
  /* Default bore 6.35 mm: half is 3.175 mm. */
  { "hose", "roughness", 3.175e-3, "H1: the wall roughness must be less than half the bore "
                                   "(3.175 mm)." },
  { "hose", "roughness", 3.17e-3, NULL },
  { "pipe", "roughness", 5e-3, "R1: the wall roughness must be less than half the bore "
                               "(4 mm)." },
  { "applicator", "orifice-length", 50.1e-3, "N1: the orifice length must be at most 100 "
                                             "orifice diameters (50 mm)." },
  { "applicator", "orifice-length", 50e-3, NULL },
  /* 1 stroke/s: half a stroke is 0.5 s. */
  { "pump", "changeover-time", 0.5, "P1: the changeover time must be shorter than half a "
                                    "double stroke (0.5 s)." },
  { "pump", "changeover-time", 0.499, NULL },
  { "tee", "branch-k1", 100.0, "T1: the branch K1 must be more than half the run K1 (100)." },
  { "tee", "branch-k-infinity", 0.04, "T1: the branch K∞ must be at least half the run K∞ "
                                      "(0.05)." },
  /* 50 bar precharge set at 293.15 K: the absolute precharge scales with
   * the gas temperature (Gay-Lussac) and reaches one atmosphere at
   * 293.15 K x 101325 / 5101325 = 5.82 K. */
  { "accumulator", "gas-temperature", 5.9, NULL },
  { "accumulator", "gas-temperature", 5.7,
    "A1: the gas temperature must be high enough that the precharge stays above "
    "atmospheric pressure." },
  /* 2 shots/s: 0.5 s a cycle; 0.05 s on and 2 ms closing leave 0.448 s. */
  { "applicator", "firing-delay", 0.448, NULL },
  { "applicator", "firing-delay", 0.449, "N1: the firing delay, the on-time and the closing "
                                         "time together must fit in one firing cycle "
                                         "(0.5 s)." },
  { "scenario", "on-time", 0.5, "Scenario: the on-time must be shorter than one firing cycle "
                                "(0.5 s)." },
  { "scenario", "open-ramp", 0.051, "Scenario: the opening time must not exceed the "
                                    "on-time." },
  /* B (1/T - 1/Tref) with T = 293.15 K and Tref = 100 K reaches 50 at
   * B = 50 / (1/100 - 1/293.15) = 7588.7 K. */
  { "scenario", "reference-temperature", 100.0, NULL },
};

START_TEST (test_cross_rules)
{
  const CrossCase *c = &cross_cases[_i];
  g_autoptr (PlDocument) doc = pl_document_new ();
  g_autoptr (PlCommand) set = NULL;
  g_autoptr (GError) error = NULL;
  const char *id = "scenario";
  const PlPart *part;

  if (!g_str_equal (c->type, "scenario"))
    {
      g_autoptr (PlCommand) add = pl_command_new_add_part (c->type, NULL, 0.0, 0.0);

      ck_assert (pl_command_apply (add, doc, NULL));
      id = "p1";
    }
  set = pl_command_new_set_number (id, c->key, c->value);
  ck_assert (pl_command_apply (set, doc, NULL));
  part = pl_document_find_part (doc, id);
  if (c->message == NULL)
    ck_assert_msg (pl_document_check_part (doc, part, NULL, &error), "%s",
                   error != NULL ? error->message : "");
  else
    {
      ck_assert (!pl_document_check_part (doc, part, NULL, &error));
      ck_assert_error (error, PL_DOCUMENT_ERROR, PL_DOCUMENT_ERROR_INCONSISTENT);
      ck_assert_str_eq (error->message, c->message);
    }
}
END_TEST

/* The Arrhenius bound: just inside and just outside e^50. */
START_TEST (test_cross_arrhenius)
{
  g_autoptr (PlDocument) doc = pl_document_new ();
  g_autoptr (PlCommand) tref = pl_command_new_set_number ("scenario", "reference-temperature",
                                                          100.0);
  double b50 = 50.0 / (1.0 / 100.0 - 1.0 / 293.15);
  g_autoptr (PlCommand) inside = pl_command_new_set_number ("scenario",
                                                            "activation-temperature",
                                                            b50 * (1.0 - 1e-9));
  g_autoptr (PlCommand) outside = pl_command_new_set_number ("scenario",
                                                             "activation-temperature",
                                                             b50 * (1.0 + 1e-9));
  char why[256];
  pls_fluid_params f;

  ck_assert (pl_command_apply (tref, doc, NULL));
  ck_assert (pl_command_apply (inside, doc, NULL));
  ck_assert (pl_scenario_get_fluid_params (pl_document_get_scenario (doc), &f, NULL));
  ck_assert (pls_fluid_params_check (&f, why, sizeof why) == PLS_OK);
  ck_assert (pl_command_apply (outside, doc, NULL));
  ck_assert (!pl_document_check_part (doc, pl_document_get_scenario (doc), NULL, NULL));
  ck_assert (!pl_scenario_get_fluid_params (pl_document_get_scenario (doc), &f, NULL));
}
END_TEST

/* --- geometry ---------------------------------------------------------- */

typedef struct
{
  guint rotation;
  gboolean mirrored;
  double bx, by;   /* hose port "b" relative to the origin */
  PlSide side;
} TurnCase;

/* Port "b" of a hose is at (30, 0) facing east.  Mirroring puts it at
 * (-30, 0); each quarter turn clockwise on a y-down drawing maps (x, y) to
 * (-y, x). */
static const TurnCase turn_cases[] = {
  { 0, FALSE, 30.0, 0.0, PL_SIDE_EAST },
  { 1, FALSE, 0.0, 30.0, PL_SIDE_SOUTH },
  { 2, FALSE, -30.0, 0.0, PL_SIDE_WEST },
  { 3, FALSE, 0.0, -30.0, PL_SIDE_NORTH },
  { 0, TRUE, -30.0, 0.0, PL_SIDE_WEST },
  { 1, TRUE, 0.0, -30.0, PL_SIDE_NORTH },
  { 2, TRUE, 30.0, 0.0, PL_SIDE_EAST },
  { 3, TRUE, 0.0, 30.0, PL_SIDE_SOUTH },
};

START_TEST (test_port_turns)
{
  const TurnCase *c = &turn_cases[_i];
  g_autoptr (PlDocument) doc = pl_document_new ();
  g_autoptr (PlCommand) add = pl_command_new_add_part_full ("hose", NULL, NULL, 100.0, 50.0,
                                                            c->rotation, c->mirrored);
  const PlPart *hose;
  PlPoint p;

  ck_assert (pl_command_apply (add, doc, NULL));
  hose = pl_document_find_part (doc, "p1");
  ck_assert (pl_part_get_port_position (hose, "b", &p));
  ck_assert_double_eq (p.x, 100.0 + c->bx);
  ck_assert_double_eq (p.y, 50.0 + c->by);
  ck_assert_int_eq (pl_part_get_port_side (hose, "b"), c->side);
  /* Port "a" is always opposite "b" through the origin. */
  ck_assert (pl_part_get_port_position (hose, "a", &p));
  ck_assert_double_eq (p.x, 100.0 - c->bx);
  ck_assert_double_eq (p.y, 50.0 - c->by);
  ck_assert_int_eq (pl_part_get_port_side (hose, "a"), (c->side + 2) % 4);
  ck_assert (!pl_part_get_port_position (hose, "zz", &p));
}
END_TEST

START_TEST (test_port_elevation)
{
  g_autoptr (PlDocument) doc = pl_document_new ();
  g_autoptr (PlCommand) add = pl_command_new_add_part ("hose", NULL, 0.0, 0.0);
  g_autoptr (PlCommand) elev = pl_command_new_set_number ("p1", "elevation", 2.0);
  g_autoptr (PlCommand) rise = pl_command_new_set_number ("p1", "rise", -3.5);
  g_autoptr (PlCommand) gauge = pl_command_new_add_part ("gauge", NULL, 0.0, 0.0);
  g_autoptr (PlCommand) gelev = pl_command_new_set_number ("p2", "elevation", 1.25);
  const PlPart *hose;

  ck_assert (pl_command_apply (add, doc, NULL));
  ck_assert (pl_command_apply (elev, doc, NULL));
  ck_assert (pl_command_apply (rise, doc, NULL));
  ck_assert (pl_command_apply (gauge, doc, NULL));
  ck_assert (pl_command_apply (gelev, doc, NULL));
  hose = pl_document_find_part (doc, "p1");
  ck_assert_double_eq (pl_part_get_port_elevation (hose, "a"), 2.0);
  ck_assert_double_eq (pl_part_get_port_elevation (hose, "b"), -1.5);
  ck_assert_double_eq (pl_part_get_port_elevation (pl_document_find_part (doc, "p2"), "p"),
                       1.25);
}
END_TEST

START_TEST (test_relevance)
{
  g_autoptr (PlDocument) doc = pl_document_new ();
  g_autoptr (PlCommand) law = pl_command_new_set_choice ("scenario", "viscosity-law",
                                                         "power-law");
  const PlPartType *t = pl_part_type_lookup ("scenario");
  const PlParamSpec *mu = pl_part_type_find_param (t, "viscosity", NULL);
  const PlParamSpec *k = pl_part_type_find_param (t, "consistency", NULL);
  const PlParamSpec *n = pl_part_type_find_param (t, "flow-index", NULL);
  const PlParamSpec *rho = pl_part_type_find_param (t, "density", NULL);
  const PlPart *s = pl_document_get_scenario (doc);

  ck_assert (pl_part_param_is_relevant (s, mu));
  ck_assert (!pl_part_param_is_relevant (s, k));
  ck_assert (!pl_part_param_is_relevant (s, n));
  ck_assert (pl_command_apply (law, doc, NULL));
  s = pl_document_get_scenario (doc);
  ck_assert (!pl_part_param_is_relevant (s, mu));
  ck_assert (pl_part_param_is_relevant (s, k));
  ck_assert (pl_part_param_is_relevant (s, n));
  ck_assert (pl_part_param_is_relevant (s, rho));
  ck_assert_str_eq (pl_part_get_choice_key (s, "viscosity-law"), "power-law");
}
END_TEST

static Suite *
part_types_suite (void)
{
  Suite *s = suite_create ("part-types");
  TCase *tc_tables = tcase_create ("tables");
  TCase *tc_solver = tcase_create ("solver");
  TCase *tc_ranges = tcase_create ("ranges");
  TCase *tc_geometry = tcase_create ("geometry");

  tcase_add_loop_test (tc_tables, test_type_identity, 0, PL_N_PART_KINDS);
  tcase_add_test (tc_tables, test_registry);
  tcase_add_loop_test (tc_tables, test_ports, 0, PL_N_PART_KINDS);
  tcase_add_loop_test (tc_tables, test_params, 0, PL_N_PART_KINDS);
  tcase_add_loop_test (tc_tables, test_common_params, 0, PL_N_PART_KINDS);
  suite_add_tcase (s, tc_tables);

  tcase_add_test (tc_solver, test_defaults_pass_solver_validators);
  tcase_add_test (tc_solver, test_scenario_defaults_solve);
  tcase_add_test (tc_solver, test_tee_split);
  tcase_add_test (tc_solver, test_nozzle_passage);
  tcase_add_test (tc_solver, test_wrong_kind_mapping);
  suite_add_tcase (s, tc_solver);

  tcase_add_loop_test (tc_ranges, test_range, 0, G_N_ELEMENTS (range_cases));
  tcase_add_test (tc_ranges, test_range_units);
  tcase_add_test (tc_ranges, test_kind_checks);
  tcase_add_test (tc_ranges, test_values);
  tcase_add_loop_test (tc_ranges, test_cross_rules, 0, G_N_ELEMENTS (cross_cases));
  tcase_add_test (tc_ranges, test_cross_arrhenius);
  suite_add_tcase (s, tc_ranges);

  tcase_add_loop_test (tc_geometry, test_port_turns, 0, G_N_ELEMENTS (turn_cases));
  tcase_add_test (tc_geometry, test_port_elevation);
  tcase_add_test (tc_geometry, test_relevance);
  suite_add_tcase (s, tc_geometry);
  return s;
}

int
main (void)
{
  return pl_check_run (part_types_suite ());
}
