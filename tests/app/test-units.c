/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Units: factors against NIST SP 811, conversions, look-ups, parsing of what
 * people type, formatting, preferences, and a fuzz run of the parser.
 */

#include "config.h"

#include <float.h>
#include <glib.h>
#include <glib/gstdio.h>
#include <locale.h>
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "pl-check.h"

#include "pl-units.h"
#include "pl-units-private.h"

/* Exact values behind the customary units (NIST SP 811 (2008), App. B.8
 * footnotes): inch, pound and standard gravity, written out again here so
 * the tests do not reuse the module's macros. */
#define REF_INCH 0.0254
#define REF_FOOT 0.3048
#define REF_POUND 0.45359237
#define REF_GN 9.80665

/* --- factors ------------------------------------------------------------ */

typedef struct
{
  PlUnitId unit;
  double si_per_unit;  /* the reference value */
  double tol;          /* absolute, see below */
} FactorCase;

/* Tolerances: an entry that NIST SP 811 App. B.8 prints rounded to 7
 * significant digits gets half a unit of its last digit; an exact factor
 * (SI prefix, or exact by definition in B.8) gets 4 ulp of double
 * arithmetic.  The B.8 values are quoted from memory of the 2008 edition
 * (the document itself is not at hand here); each agrees with the exact
 * definitions to the digits printed, which the exact checks below confirm. */
#define EXACT(v) (4.0 * DBL_EPSILON * (v))
#define HALF_LAST(v, digit) (0.5 * (digit))

static const FactorCase factor_cases[] = {
  { PL_UNIT_PA, 1.0, EXACT (1.0) },
  { PL_UNIT_KPA, 1e3, EXACT (1e3) },
  { PL_UNIT_MPA, 1e6, EXACT (1e6) },
  { PL_UNIT_GPA, 1e9, EXACT (1e9) },
  /* B.8 "bar (bar) to pascal (Pa)": 1.0 E+05, exact. */
  { PL_UNIT_BAR, 1e5, EXACT (1e5) },
  /* B.8 "pound-force per square inch (psi) (lbf/in2) to pascal": 6.894 757 E+03. */
  { PL_UNIT_PSI, 6.894757e3, HALF_LAST (6.894757e3, 1e-3) },
  /* B.8 "kip per square inch (ksi) (kip/in2) to pascal": 6.894 757 E+06. */
  { PL_UNIT_KSI, 6.894757e6, HALF_LAST (6.894757e6, 1.0) },
  { PL_UNIT_M3_PER_S, 1.0, EXACT (1.0) },
  /* B.8 "liter (L) to cubic meter" 1.0 E-03 and "minute (min) to second"
   * 6.0 E+01, both exact. */
  { PL_UNIT_L_PER_MIN, 1.0e-3 / 6.0e1, EXACT (1.7e-5) },
  { PL_UNIT_ML_PER_S, 1e-6, EXACT (1e-6) },
  { PL_UNIT_ML_PER_MIN, 1e-6 / 6.0e1, EXACT (1.7e-8) },
  /* B.8 "gallon (U.S.) per minute (gpm) (gal/min) to cubic meter per
   * second": 6.309 020 E-05. */
  { PL_UNIT_GAL_PER_MIN, 6.309020e-5, HALF_LAST (6.309020e-5, 1e-11) },
  { PL_UNIT_M, 1.0, EXACT (1.0) },
  { PL_UNIT_CM, 1e-2, EXACT (1e-2) },
  { PL_UNIT_MM, 1e-3, EXACT (1e-3) },
  { PL_UNIT_UM, 1e-6, EXACT (1e-6) },
  /* B.8 "inch (in) to meter (m)": 2.54 E-02, exact. */
  { PL_UNIT_IN, 2.54e-2, EXACT (2.54e-2) },
  /* B.8 "foot (ft) to meter (m)": 3.048 E-01, exact. */
  { PL_UNIT_FT, 3.048e-1, EXACT (3.048e-1) },
  { PL_UNIT_PA_S, 1.0, EXACT (1.0) },
  { PL_UNIT_MPA_S, 1e-3, EXACT (1e-3) },
  /* B.8 "centipoise (cP) to pascal second (Pa·s)": 1.0 E-03, exact. */
  { PL_UNIT_CP, 1e-3, EXACT (1e-3) },
  /* B.8 "poise (P) to pascal second (Pa·s)": 1.0 E-01, exact. */
  { PL_UNIT_POISE, 1e-1, EXACT (1e-1) },
  { PL_UNIT_M3, 1.0, EXACT (1.0) },
  /* B.8 "liter (L) to cubic meter (m3)": 1.0 E-03, exact. */
  { PL_UNIT_L, 1e-3, EXACT (1e-3) },
  { PL_UNIT_ML, 1e-6, EXACT (1e-6) },
  /* B.8 "gallon [U.S.] (gal) to cubic meter (m3)": 3.785 412 E-03. */
  { PL_UNIT_GAL, 3.785412e-3, HALF_LAST (3.785412e-3, 1e-9) },
  /* B.8 "cubic inch (in3) to cubic meter (m3)": 1.638 706 E-05. */
  { PL_UNIT_IN3, 1.638706e-5, HALF_LAST (1.638706e-5, 1e-11) },
  { PL_UNIT_KG, 1.0, EXACT (1.0) },
  { PL_UNIT_G, 1e-3, EXACT (1e-3) },
  /* B.8 "ounce (avoirdupois) (oz) to kilogram (kg)": 2.834 952 E-02. */
  { PL_UNIT_OZ, 2.834952e-2, HALF_LAST (2.834952e-2, 1e-8) },
  /* B.8 "pound (avoirdupois) (lb) to kilogram (kg)": 4.535 924 E-01. */
  { PL_UNIT_LB, 4.535924e-1, HALF_LAST (4.535924e-1, 1e-7) },
  { PL_UNIT_K, 1.0, EXACT (1.0) },
  /* B.9: a kelvin and a degree Celsius are the same size; a degree
   * Fahrenheit is 1/1.8 K. */
  { PL_UNIT_DEG_C, 1.0, EXACT (1.0) },
  { PL_UNIT_DEG_F, 1.0 / 1.8, EXACT (0.56) },
  { PL_UNIT_J, 1.0, EXACT (1.0) },
  { PL_UNIT_KJ, 1e3, EXACT (1e3) },
  /* B.8 "foot pound-force (ft·lbf) to joule (J)": 1.355 818 E+00. */
  { PL_UNIT_FT_LBF, 1.355818, HALF_LAST (1.355818, 1e-6) },
  { PL_UNIT_S, 1.0, EXACT (1.0) },
  { PL_UNIT_MS, 1e-3, EXACT (1e-3) },
  /* B.8 "minute (min) to second (s)": 6.0 E+01, exact. */
  { PL_UNIT_MIN, 60.0, EXACT (60.0) },
  { PL_UNIT_HZ, 1.0, EXACT (1.0) },
  { PL_UNIT_PER_MIN, 1.0 / 60.0, EXACT (0.017) },
  { PL_UNIT_KG_PER_M3, 1.0, EXACT (1.0) },
  /* B.8 "gram per cubic centimeter (g/cm3) to kilogram per cubic meter":
   * 1.0 E+03, exact. */
  { PL_UNIT_G_PER_CM3, 1e3, EXACT (1e3) },
  /* B.8 "pound per cubic foot (lb/ft3) to kilogram per cubic meter":
   * 1.601 846 E+01. */
  { PL_UNIT_LB_PER_FT3, 1.601846e1, HALF_LAST (1.601846e1, 1e-5) },
  { PL_UNIT_ONE, 1.0, EXACT (1.0) },
  /* SP 811 sec. 7.10.2: the symbol % stands for the number 0.01. */
  { PL_UNIT_PERCENT, 1e-2, EXACT (1e-2) },
  { PL_UNIT_M2, 1.0, EXACT (1.0) },
  { PL_UNIT_MM2, 1e-6, EXACT (1e-6) },
  /* B.8 "square inch (in2) to square meter (m2)": 6.4516 E-04, exact. */
  { PL_UNIT_IN2, 6.4516e-4, EXACT (6.4516e-4) },
  { PL_UNIT_M_PER_S, 1.0, EXACT (1.0) },
  /* B.8 "foot per second (ft/s) to meter per second (m/s)": 3.048 E-01,
   * exact. */
  { PL_UNIT_FT_PER_S, 3.048e-1, EXACT (3.048e-1) },
  { PL_UNIT_PER_S, 1.0, EXACT (1.0) },
  { PL_UNIT_M3_PER_M_PA, 1.0, EXACT (1.0) },
  { PL_UNIT_ML_PER_M_BAR, 1e-6 / 1e5, EXACT (1e-11) },
  /* cm3 / (ft ksi) from the B.8 foot and ksi entries above; the ksi value
   * is rounded to 7 digits, so 1e-7 relative. */
  { PL_UNIT_CC_PER_FT_KSI, 1e-6 / (3.048e-1 * 6.894757e6), 1e-7 * 4.76e-13 },
  /* Power-law consistency: the pascal second's factors (SI prefixes, exact)
   * with the flow index as exponent of the second. */
  { PL_UNIT_PA_S_N, 1.0, EXACT (1.0) },
  { PL_UNIT_MPA_S_N, 1e-3, EXACT (1e-3) },
};

START_TEST (test_factor_nist)
{
  const FactorCase *c = &factor_cases[_i];
  const PlUnit *u = pl_unit_get (c->unit);

  ck_assert_ptr_nonnull (u);
  ck_assert_msg (fabs (u->factor - c->si_per_unit) <= c->tol,
                 "%s: factor %.17g, reference %.17g", u->key, u->factor, c->si_per_unit);
}
END_TEST

/* K shows as Pa·sⁿ, accepts what people type for it and, as the n = 1
 * case, a viscosity unit (files written before it had units of its own say
 * "Pa.s"). */
START_TEST (test_consistency_units)
{
  PlUnitPrefs si;
  double v = 0.0;
  g_autofree char *shown = NULL;
  g_autoptr (GError) error = NULL;

  pl_unit_prefs_init (&si, PL_UNIT_SYSTEM_SI);
  shown = pl_unit_format (2.0, PL_QUANTITY_CONSISTENCY, &si, 4, '.');
  ck_assert_str_eq (shown, "2000 mPa·sⁿ");
  ck_assert_uint_eq (pl_unit_lookup ("Pa.s^n", PL_QUANTITY_CONSISTENCY), PL_UNIT_PA_S_N);
  ck_assert_uint_eq (pl_unit_lookup ("mPa·sⁿ", PL_QUANTITY_CONSISTENCY), PL_UNIT_MPA_S_N);
  ck_assert_uint_eq (pl_unit_lookup ("Pa.s", PL_QUANTITY_CONSISTENCY), PL_UNIT_PA_S);
  ck_assert_uint_eq (pl_unit_lookup ("Pa.s^n", PL_QUANTITY_VISCOSITY), PL_UNIT_NONE);
  ck_assert_msg (pl_unit_parse ("3 Pa·s^n", PL_QUANTITY_CONSISTENCY, &si, '.', &v, &error), "%s",
                 error ? error->message : "");
  ck_assert_double_eq (v, 3.0);
}
END_TEST

/* Every unit has a line in factor_cases, so no factor goes unchecked. */
START_TEST (test_factor_table_complete)
{
  for (int u = PL_UNIT_NONE + 1; u < PL_N_UNITS; u++)
    {
      gboolean found = FALSE;

      for (gsize i = 0; i < G_N_ELEMENTS (factor_cases); i++)
        found = found || factor_cases[i].unit == (PlUnitId) u;
      ck_assert_msg (found, "unit %s has no NIST check", pl_unit_get ((PlUnitId) u)->key);
    }
}
END_TEST

/* The exact values, to the full precision of a double. */
START_TEST (test_factor_exact)
{
  double lbf = REF_POUND * REF_GN;

  /* PHYSICS.md check value from NIST SP 811: 1 psi = 6894.757293168 Pa,
   * printed to 1e-9 Pa, so half of that plus rounding of the division. */
  ck_assert_double_eq_tol (pl_unit_to_si (PL_UNIT_PSI, 1.0), 6894.757293168, 6e-10);
  /* The same from its definition, lbf / in^2 (B.8 footnotes). */
  ck_assert_double_eq_tol (pl_unit_to_si (PL_UNIT_PSI, 1.0), lbf / (REF_INCH * REF_INCH),
                           EXACT (6894.8));
  /* PHYSICS.md: 1 US gal = 3.785411784 L exactly (231 in^3). */
  ck_assert_double_eq_tol (pl_unit_to_si (PL_UNIT_GAL, 1.0) / pl_unit_to_si (PL_UNIT_L, 1.0),
                           3.785411784, EXACT (3.8));
  /* PHYSICS.md: 1 in = 25.4 mm exactly. */
  ck_assert_double_eq_tol (pl_unit_to_si (PL_UNIT_IN, 1.0) / pl_unit_to_si (PL_UNIT_MM, 1.0),
                           25.4, EXACT (25.4));
  /* 1 oz = 28.349523125 g exactly (1/16 of 0.45359237 kg). */
  ck_assert_double_eq_tol (pl_unit_to_si (PL_UNIT_OZ, 1.0) / pl_unit_to_si (PL_UNIT_G, 1.0),
                           28.349523125, EXACT (28.3));
  ck_assert_double_eq_tol (pl_unit_to_si (PL_UNIT_LB, 1.0), REF_POUND, EXACT (0.45));
  /* 1 in^3 = 0.0254^3 m^3 = 1.6387064e-5 m^3 exactly. */
  ck_assert_double_eq_tol (pl_unit_to_si (PL_UNIT_IN3, 1.0), 1.6387064e-5, EXACT (1.64e-5));
  /* 1 ft = 12 in. */
  ck_assert_double_eq_tol (pl_unit_to_si (PL_UNIT_FT, 1.0), 12.0 * REF_INCH, EXACT (0.3048));
  /* 1 ft·lbf = 0.3048 m x 4.4482216152605 N. */
  ck_assert_double_eq_tol (pl_unit_to_si (PL_UNIT_FT_LBF, 1.0), REF_FOOT * lbf, EXACT (1.36));
}
END_TEST

/* --- temperatures ------------------------------------------------------- */

typedef struct
{
  PlUnitId unit;
  double value;
  double kelvin;
} TemperatureCase;

/* NIST SP 811 B.9: T/K = t/°C + 273.15 and T/K = (t/°F + 459.67)/1.8;
 * 32 °F and 212 °F are the ice and steam points, -40 is where the scales
 * meet.  Tolerance 1e-9 K: the offsets and 1/1.8 cost a few ulp of 500. */
static const TemperatureCase temperature_cases[] = {
  { PL_UNIT_K, 300.0, 300.0 },
  { PL_UNIT_DEG_C, 20.0, 293.15 },
  { PL_UNIT_DEG_C, 0.0, 273.15 },
  { PL_UNIT_DEG_C, 100.0, 373.15 },
  { PL_UNIT_DEG_C, -40.0, 233.15 },
  { PL_UNIT_DEG_C, -273.15, 0.0 },
  { PL_UNIT_DEG_F, 68.0, 293.15 },
  { PL_UNIT_DEG_F, 32.0, 273.15 },
  { PL_UNIT_DEG_F, 212.0, 373.15 },
  { PL_UNIT_DEG_F, -40.0, 233.15 },
  { PL_UNIT_DEG_F, -459.67, 0.0 },
};

START_TEST (test_temperature)
{
  const TemperatureCase *c = &temperature_cases[_i];

  ck_assert_double_eq_tol (pl_unit_to_si (c->unit, c->value), c->kelvin, 1e-9);
  ck_assert_double_eq_tol (pl_unit_from_si (c->unit, c->kelvin), c->value, 1e-9);
}
END_TEST

/* --- round trips -------------------------------------------------------- */

/* from_si (to_si (v)) == v for every unit: one multiplication and one
 * division (plus an offset) cost at most a few ulp of |v| + offset. */
START_TEST (test_round_trip)
{
  static const double values[] = { 0.0, 1e-9, 0.7, 1.0, 3.14159, 2500.0, 1e7, -12.5 };
  PlUnitId unit = (PlUnitId) _i;
  const PlUnit *u = pl_unit_get (unit);

  ck_assert_ptr_nonnull (u);
  for (gsize i = 0; i < G_N_ELEMENTS (values); i++)
    {
      double v = values[i];
      double back = pl_unit_from_si (unit, pl_unit_to_si (unit, v));
      double tol = 8.0 * DBL_EPSILON * (fabs (v) + fabs (u->offset));

      ck_assert_msg (fabs (back - v) <= tol, "%s: %.17g -> %.17g", u->key, v, back);
    }
  ck_assert (isnan (pl_unit_to_si (PL_UNIT_NONE, 1.0)));
  ck_assert (isnan (pl_unit_from_si (PL_N_UNITS, 1.0)));
}
END_TEST

/* --- tables ------------------------------------------------------------- */

START_TEST (test_unit_table)
{
  PlUnitId unit = (PlUnitId) _i;
  const PlUnit *u = pl_unit_get (unit);

  ck_assert_ptr_nonnull (u);
  ck_assert_int_eq (u->id, unit);
  ck_assert (u->key[0] != '\0');
  for (const char *k = u->key; *k != '\0'; k++)
    ck_assert ((unsigned char) *k < 0x80 && g_ascii_isprint (*k) && *k != ';' && *k != '=');
  ck_assert (g_utf8_validate (u->symbol, -1, NULL));
  ck_assert (u->name[0] != '\0');
  ck_assert (isfinite (u->factor) && u->factor > 0.0);
  ck_assert ((int) u->kind >= 0 && u->kind < PL_N_QUANTITIES);
  ck_assert_int_eq (pl_quantity_get_unit_kind (u->kind), u->kind);
  ck_assert (pl_unit_fits (unit, u->kind));
  ck_assert_int_eq (pl_unit_from_key (u->key), unit);
  ck_assert_int_eq (pl_unit_lookup (u->key, u->kind), unit);
  if (u->symbol[0] != '\0')
    ck_assert_int_eq (pl_unit_lookup (u->symbol, u->kind), unit);
}
END_TEST

/* Collects every spelling (keys, symbols, aliases) with its unit. */
static GArray *
all_spellings (void)
{
  GArray *all = g_array_new (FALSE, FALSE, sizeof (PlUnitAlias));
  gsize n_aliases;
  const PlUnitAlias *aliases = pl_unit_get_aliases (&n_aliases);

  for (int u = PL_UNIT_NONE + 1; u < PL_N_UNITS; u++)
    {
      PlUnitAlias k = { (PlUnitId) u, pl_unit_get ((PlUnitId) u)->key };
      PlUnitAlias s = { (PlUnitId) u, pl_unit_get ((PlUnitId) u)->symbol };

      g_array_append_val (all, k);
      if (s.text[0] != '\0')
        g_array_append_val (all, s);
    }
  g_array_append_vals (all, aliases, (guint) n_aliases);
  return all;
}

/* No two units of one kind share a spelling, not even one that differs in
 * ASCII case only, so what a person types never picks a unit by table order
 * within the quantity being edited. */
START_TEST (test_spellings_unique)
{
  g_autoptr (GArray) all = all_spellings ();

  for (guint i = 0; i < all->len; i++)
    {
      const PlUnitAlias *a = &g_array_index (all, PlUnitAlias, i);
      g_autofree char *na = pl_unit_normalize (a->text);

      ck_assert_msg (na[0] != '\0', "spelling “%s” normalises to nothing", a->text);
      ck_assert_int_eq (pl_unit_lookup (a->text, pl_unit_get (a->unit)->kind), a->unit);
      for (guint j = i + 1; j < all->len; j++)
        {
          const PlUnitAlias *b = &g_array_index (all, PlUnitAlias, j);
          g_autofree char *nb = NULL;

          if (a->unit == b->unit || pl_unit_get (a->unit)->kind != pl_unit_get (b->unit)->kind)
            continue;
          nb = pl_unit_normalize (b->text);
          ck_assert_msg (g_ascii_strcasecmp (na, nb) != 0, "“%s” (%s) and “%s” (%s) collide",
                         a->text, pl_unit_get (a->unit)->key, b->text,
                         pl_unit_get (b->unit)->key);
        }
    }
}
END_TEST

START_TEST (test_quantity_table)
{
  PlQuantity q = (PlQuantity) _i;
  g_autofree char *list = pl_quantity_list_units (q);

  ck_assert_ptr_nonnull (pl_quantity_get_key (q));
  ck_assert_int_eq (pl_quantity_from_key (pl_quantity_get_key (q)), q);
  ck_assert (pl_quantity_get_name (q)[0] != '\0');
  ck_assert (pl_quantity_get_phrase (q)[0] != '\0');
  ck_assert (list[0] != '\0');
  for (int s = 0; s < PL_N_UNIT_SYSTEMS; s++)
    ck_assert (pl_unit_fits (pl_unit_system_get_default ((PlUnitSystem) s, q), q));
  ck_assert_ptr_null (pl_quantity_get_key (PL_N_QUANTITIES));
  ck_assert_int_eq (pl_quantity_from_key ("no-such"), PL_N_QUANTITIES);
  ck_assert_int_eq (pl_quantity_from_key (NULL), PL_N_QUANTITIES);
}
END_TEST

typedef struct
{
  PlQuantity quantity;
  PlUnitId si;
  PlUnitId us;
} DefaultCase;

/* The defaults that issue 5 asks for in each system. */
static const DefaultCase default_cases[] = {
  { PL_QUANTITY_PRESSURE, PL_UNIT_BAR, PL_UNIT_PSI },
  { PL_QUANTITY_FLOW, PL_UNIT_L_PER_MIN, PL_UNIT_GAL_PER_MIN },
  { PL_QUANTITY_LENGTH, PL_UNIT_MM, PL_UNIT_IN },
  { PL_QUANTITY_VISCOSITY, PL_UNIT_MPA_S, PL_UNIT_CP },
  { PL_QUANTITY_VOLUME, PL_UNIT_ML, PL_UNIT_IN3 },
  { PL_QUANTITY_MASS, PL_UNIT_G, PL_UNIT_OZ },
  { PL_QUANTITY_TEMPERATURE, PL_UNIT_DEG_C, PL_UNIT_DEG_F },
  { PL_QUANTITY_ENERGY, PL_UNIT_J, PL_UNIT_J },
};

START_TEST (test_defaults)
{
  const DefaultCase *c = &default_cases[_i];

  ck_assert_int_eq (pl_unit_system_get_default (PL_UNIT_SYSTEM_SI, c->quantity), c->si);
  ck_assert_int_eq (pl_unit_system_get_default (PL_UNIT_SYSTEM_US, c->quantity), c->us);
  ck_assert_int_eq (pl_unit_prefs_get_unit (NULL, c->quantity), c->si);
}
END_TEST

/* --- look-ups ----------------------------------------------------------- */

typedef struct
{
  const char *typed;
  int kind;  /* a PlQuantity, or -1 for all */
  PlUnitId expected;
} LookupCase;

static const LookupCase lookup_cases[] = {
  { "psi", -1, PL_UNIT_PSI }, { "PSI", -1, PL_UNIT_PSI }, { "lbf/in2", -1, PL_UNIT_PSI },
  { "lbf/in²", -1, PL_UNIT_PSI }, { "bar", -1, PL_UNIT_BAR }, { "kPa", -1, PL_UNIT_KPA },
  { "MPa", -1, PL_UNIT_MPA }, { "Pa", -1, PL_UNIT_PA },
  { "l/min", -1, PL_UNIT_L_PER_MIN }, { "lpm", -1, PL_UNIT_L_PER_MIN },
  { "L/min", -1, PL_UNIT_L_PER_MIN }, { "gpm", -1, PL_UNIT_GAL_PER_MIN },
  { "gal/min", -1, PL_UNIT_GAL_PER_MIN }, { "mL/s", -1, PL_UNIT_ML_PER_S },
  { "mm", -1, PL_UNIT_MM }, { "m", -1, PL_UNIT_M }, { "in", -1, PL_UNIT_IN },
  { "inch", -1, PL_UNIT_IN }, { "\"", -1, PL_UNIT_IN }, { "″", -1, PL_UNIT_IN },
  { "in.", -1, PL_UNIT_IN }, { "ft", -1, PL_UNIT_FT }, { "'", -1, PL_UNIT_FT },
  { "µm", -1, PL_UNIT_UM }, { "μm", -1, PL_UNIT_UM }, { "um", -1, PL_UNIT_UM },
  { "mPa s", -1, PL_UNIT_MPA_S }, { "mPa·s", -1, PL_UNIT_MPA_S },
  { "mPas", -1, PL_UNIT_MPA_S }, { "mPa.s", -1, PL_UNIT_MPA_S },
  { "cP", -1, PL_UNIT_CP }, { "cps", -1, PL_UNIT_CP }, { "Pa s", -1, PL_UNIT_PA_S },
  { "Pa·s", -1, PL_UNIT_PA_S },
  { "mL", -1, PL_UNIT_ML }, { "ml", -1, PL_UNIT_ML }, { "cc", -1, PL_UNIT_ML },
  { "L", -1, PL_UNIT_L }, { "l", -1, PL_UNIT_L }, { "gal", -1, PL_UNIT_GAL },
  { "in3", -1, PL_UNIT_IN3 }, { "in^3", -1, PL_UNIT_IN3 }, { "in³", -1, PL_UNIT_IN3 },
  { "cu in", -1, PL_UNIT_IN3 }, { "cu. in.", -1, PL_UNIT_IN3 },
  { "g", -1, PL_UNIT_G }, { "kg", -1, PL_UNIT_KG }, { "oz", -1, PL_UNIT_OZ },
  { "C", -1, PL_UNIT_DEG_C }, { "°C", -1, PL_UNIT_DEG_C }, { "degC", -1, PL_UNIT_DEG_C },
  { "℃", -1, PL_UNIT_DEG_C }, { "F", -1, PL_UNIT_DEG_F }, { "°F", -1, PL_UNIT_DEG_F },
  { "J", -1, PL_UNIT_J }, { "kJ", -1, PL_UNIT_KJ }, { "ft·lbf", -1, PL_UNIT_FT_LBF },
  { "ms", -1, PL_UNIT_MS }, { "cycles/min", -1, PL_UNIT_PER_MIN },
  { "min⁻¹", -1, PL_UNIT_PER_MIN }, { "g/cm³", -1, PL_UNIT_G_PER_CM3 },
  { "%", -1, PL_UNIT_PERCENT }, { "mm²", -1, PL_UNIT_MM2 },
  /* ASCII case matters only where an exact spelling exists. */
  { "mpa", PL_QUANTITY_PRESSURE, PL_UNIT_MPA }, { "MM", PL_QUANTITY_LENGTH, PL_UNIT_MM },
  { "MPA S", PL_QUANTITY_VISCOSITY, PL_UNIT_MPA_S },
  /* One spelling, two kinds: the quantity decides. */
  { "1/s", PL_QUANTITY_SHEAR_RATE, PL_UNIT_PER_S }, { "1/s", PL_QUANTITY_FREQUENCY, PL_UNIT_HZ },
  { "psi", PL_QUANTITY_MODULUS, PL_UNIT_PSI }, { "ft", PL_QUANTITY_LINE_LENGTH, PL_UNIT_FT },
  { "psi", PL_QUANTITY_LENGTH, PL_UNIT_NONE }, { "furlong", -1, PL_UNIT_NONE },
  { "", -1, PL_UNIT_NONE }, { " · ", -1, PL_UNIT_NONE }, { "\xff", -1, PL_UNIT_NONE },
};

START_TEST (test_lookup)
{
  const LookupCase *c = &lookup_cases[_i];

  ck_assert_msg (pl_unit_lookup (c->typed, c->kind) == c->expected, "“%s” -> %d, not %d",
                 c->typed, pl_unit_lookup (c->typed, c->kind), c->expected);
}
END_TEST

/* --- parsing ------------------------------------------------------------ */

typedef struct
{
  const char *text;
  PlQuantity quantity;
  PlUnitSystem system;  /* the prefs' system (unit when none typed) */
  char sep;
  double expected;      /* SI */
  double tol;
} ParseCase;

#define PSI (REF_POUND * REF_GN / (REF_INCH * REF_INCH))
#define GAL (231.0 * REF_INCH * REF_INCH * REF_INCH)
/* Relative tolerance for results that are a short product of exact
 * decimals: a few ulp. */
#define R(v) (8.0 * DBL_EPSILON * fabs (v))

static const ParseCase parse_cases[] = {
  /* Inch fractions: 7/8 x 25.4 mm = 22.225 mm; 1.5 x 25.4 mm = 38.1 mm. */
  { "7/8 in", PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_SI, '.', 0.022225, R (0.022225) },
  { "1-1/2 in", PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_SI, '.', 0.0381, R (0.0381) },
  { "1 1/2 in", PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_SI, '.', 0.0381, R (0.0381) },
  { "1 1/2in", PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_SI, '.', 0.0381, R (0.0381) },
  { "1½ in", PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_SI, '.', 0.0381, R (0.0381) },
  { "⅞\"", PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_SI, '.', 0.022225, R (0.022225) },
  { "3 / 4 in", PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_SI, '.', 0.01905, R (0.01905) },
  { "-1-1/2 in", PL_QUANTITY_LINE_LENGTH, PL_UNIT_SYSTEM_SI, '.', -0.0381, R (0.0381) },
  /* 2500 x 6894.757293168 Pa = 17.236893232920 MPa (PHYSICS.md psi value);
   * the printed psi is good to 5e-10 Pa, x 2500. */
  { "2500 psi", PL_QUANTITY_PRESSURE, PL_UNIT_SYSTEM_SI, '.', 17.236893232920e6, 2e-6 },
  { "2,500 psi", PL_QUANTITY_PRESSURE, PL_UNIT_SYSTEM_SI, '.', 17.236893232920e6, 2e-6 },
  { "2,500 psi", PL_QUANTITY_PRESSURE, PL_UNIT_SYSTEM_SI, ',', 2.5 * PSI, R (2.5 * PSI) },
  { "1.5e3 psi", PL_QUANTITY_PRESSURE, PL_UNIT_SYSTEM_SI, '.', 1500.0 * PSI, R (1.1e7) },
  { "172 bar", PL_QUANTITY_PRESSURE, PL_UNIT_SYSTEM_SI, '.', 172e5, R (172e5) },
  { "-0.5 bar", PL_QUANTITY_PRESSURE, PL_UNIT_SYSTEM_SI, '.', -0.5e5, R (0.5e5) },
  { "−0,5 bar", PL_QUANTITY_PRESSURE, PL_UNIT_SYSTEM_SI, ',', -0.5e5, R (0.5e5) },
  { "1 MPA", PL_QUANTITY_PRESSURE, PL_UNIT_SYSTEM_SI, '.', 1e6, R (1e6) },
  { "3000", PL_QUANTITY_PRESSURE, PL_UNIT_SYSTEM_US, '.', 3000.0 * PSI, R (2.1e7) },
  { "2.1 GPa", PL_QUANTITY_MODULUS, PL_UNIT_SYSTEM_SI, '.', 2.1e9, R (2.1e9) },
  { "1500", PL_QUANTITY_MODULUS, PL_UNIT_SYSTEM_SI, '.', 1.5e9, R (1.5e9) },
  /* Decimal comma and point. */
  { "12,5 mm", PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_SI, ',', 0.0125, R (0.0125) },
  { "12.5 mm", PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_SI, '.', 0.0125, R (0.0125) },
  { "12.5 mm", PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_SI, ',', 0.0125, R (0.0125) },
  { "1,234.5 mm", PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_SI, '.', 1.2345, R (1.2345) },
  { "1,234,567 mm", PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_SI, '.', 1234.567, R (1234.6) },
  { ".5 in", PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_SI, '.', 0.0127, R (0.0127) },
  { ",5 in", PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_SI, ',', 0.0127, R (0.0127) },
  { "5. mm", PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_SI, '.', 0.005, R (0.005) },
  { "1e-3 m", PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_SI, '.', 0.001, R (0.001) },
  { "22mm", PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_SI, '.', 0.022, R (0.022) },
  { "+3 mm", PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_SI, '.', 0.003, R (0.003) },
  { "10 µm", PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_SI, '.', 1e-5, R (1e-5) },
  { "6\"", PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_SI, '.', 0.1524, R (0.1524) },
  /* The number alone takes the prefs' unit: mm in SI, inch in US. */
  { "5", PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_SI, '.', 0.005, R (0.005) },
  { "5", PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_US, '.', 0.127, R (0.127) },
  { "3 ft", PL_QUANTITY_LINE_LENGTH, PL_UNIT_SYSTEM_SI, '.', 0.9144, R (0.9144) },
  { "10'", PL_QUANTITY_LINE_LENGTH, PL_UNIT_SYSTEM_SI, '.', 3.048, R (3.048) },
  { "10", PL_QUANTITY_LINE_LENGTH, PL_UNIT_SYSTEM_SI, '.', 10.0, R (10.0) },
  { "-2 m", PL_QUANTITY_LINE_LENGTH, PL_UNIT_SYSTEM_SI, '.', -2.0, R (2.0) },
  /* Flow: 3 L/min = 5e-5 m^3/s; 2 gpm = 2 x 231 in^3 / 60 s. */
  { "  3 L/min ", PL_QUANTITY_FLOW, PL_UNIT_SYSTEM_SI, '.', 5e-5, R (5e-5) },
  { "\t3\u00a0l/min", PL_QUANTITY_FLOW, PL_UNIT_SYSTEM_SI, '.', 5e-5, R (5e-5) },
  { "2 gpm", PL_QUANTITY_FLOW, PL_UNIT_SYSTEM_SI, '.', 2.0 * GAL / 60.0, R (1.3e-4) },
  { "1 mL/s", PL_QUANTITY_FLOW, PL_UNIT_SYSTEM_SI, '.', 1e-6, R (1e-6) },
  /* Viscosity: 1 cP = 1 mPa·s, 1 P = 0.1 Pa·s (SP 811 B.8). */
  { "500 cP", PL_QUANTITY_VISCOSITY, PL_UNIT_SYSTEM_SI, '.', 0.5, R (0.5) },
  { "500 cps", PL_QUANTITY_VISCOSITY, PL_UNIT_SYSTEM_SI, '.', 0.5, R (0.5) },
  { "500 mPa s", PL_QUANTITY_VISCOSITY, PL_UNIT_SYSTEM_SI, '.', 0.5, R (0.5) },
  { "500 mPa·s", PL_QUANTITY_VISCOSITY, PL_UNIT_SYSTEM_SI, '.', 0.5, R (0.5) },
  { "0.5 Pa.s", PL_QUANTITY_VISCOSITY, PL_UNIT_SYSTEM_SI, '.', 0.5, R (0.5) },
  { "5 P", PL_QUANTITY_VISCOSITY, PL_UNIT_SYSTEM_SI, '.', 0.5, R (0.5) },
  { "500", PL_QUANTITY_VISCOSITY, PL_UNIT_SYSTEM_US, '.', 0.5, R (0.5) },
  /* Volume. */
  { "10 cc", PL_QUANTITY_VOLUME, PL_UNIT_SYSTEM_SI, '.', 1e-5, R (1e-5) },
  { "2 L", PL_QUANTITY_VOLUME, PL_UNIT_SYSTEM_SI, '.', 2e-3, R (2e-3) },
  { "1 gal", PL_QUANTITY_VOLUME, PL_UNIT_SYSTEM_SI, '.', 3.785411784e-3, R (3.8e-3) },
  { "100 cu in", PL_QUANTITY_VOLUME, PL_UNIT_SYSTEM_SI, '.', 1.6387064e-3, R (1.6e-3) },
  { "100 in³", PL_QUANTITY_VOLUME, PL_UNIT_SYSTEM_SI, '.', 1.6387064e-3, R (1.6e-3) },
  { "-0 mL", PL_QUANTITY_VOLUME, PL_UNIT_SYSTEM_SI, '.', 0.0, 0.0 },
  /* Mass: 1 oz = 28.349523125 g; 1 lb = 0.45359237 kg. */
  { "1 oz", PL_QUANTITY_MASS, PL_UNIT_SYSTEM_SI, '.', 0.028349523125, R (0.028) },
  { "2 lb", PL_QUANTITY_MASS, PL_UNIT_SYSTEM_SI, '.', 0.90718474, R (0.9) },
  { "0,35 g", PL_QUANTITY_MASS, PL_UNIT_SYSTEM_SI, ',', 3.5e-4, R (3.5e-4) },
  /* Temperatures (SP 811 B.9); 1e-9 K as in test_temperature. */
  { "68 °F", PL_QUANTITY_TEMPERATURE, PL_UNIT_SYSTEM_SI, '.', 293.15, 1e-9 },
  { "68°F", PL_QUANTITY_TEMPERATURE, PL_UNIT_SYSTEM_SI, '.', 293.15, 1e-9 },
  { "20 C", PL_QUANTITY_TEMPERATURE, PL_UNIT_SYSTEM_SI, '.', 293.15, 1e-9 },
  { "20 ℃", PL_QUANTITY_TEMPERATURE, PL_UNIT_SYSTEM_SI, '.', 293.15, 1e-9 },
  { "-40 F", PL_QUANTITY_TEMPERATURE, PL_UNIT_SYSTEM_SI, '.', 233.15, 1e-9 },
  { "-40 C", PL_QUANTITY_TEMPERATURE, PL_UNIT_SYSTEM_SI, '.', 233.15, 1e-9 },
  { "300 K", PL_QUANTITY_TEMPERATURE, PL_UNIT_SYSTEM_SI, '.', 300.0, 1e-9 },
  { "20", PL_QUANTITY_TEMPERATURE, PL_UNIT_SYSTEM_SI, '.', 293.15, 1e-9 },
  { "68", PL_QUANTITY_TEMPERATURE, PL_UNIT_SYSTEM_US, '.', 293.15, 1e-9 },
  { "-273.15 °C", PL_QUANTITY_TEMPERATURE, PL_UNIT_SYSTEM_SI, '.', 0.0, 1e-9 },
  /* Energy, time, rates, density, ratios, areas, expansion. */
  { "1.5 kJ", PL_QUANTITY_ENERGY, PL_UNIT_SYSTEM_SI, '.', 1500.0, R (1500.0) },
  { "1 ft·lbf", PL_QUANTITY_ENERGY, PL_UNIT_SYSTEM_SI, '.', REF_FOOT * REF_POUND * REF_GN,
    R (1.36) },
  { "5 ms", PL_QUANTITY_TIME, PL_UNIT_SYSTEM_SI, '.', 0.005, R (0.005) },
  { "2 min", PL_QUANTITY_TIME, PL_UNIT_SYSTEM_SI, '.', 120.0, R (120.0) },
  { "60 1/min", PL_QUANTITY_FREQUENCY, PL_UNIT_SYSTEM_SI, '.', 1.0, R (1.0) },
  { "30 cycles/min", PL_QUANTITY_FREQUENCY, PL_UNIT_SYSTEM_SI, '.', 0.5, R (0.5) },
  { "30", PL_QUANTITY_FREQUENCY, PL_UNIT_SYSTEM_SI, '.', 0.5, R (0.5) },
  { "120 /min", PL_QUANTITY_FREQUENCY, PL_UNIT_SYSTEM_SI, '.', 2.0, R (2.0) },
  { "2 Hz", PL_QUANTITY_FREQUENCY, PL_UNIT_SYSTEM_SI, '.', 2.0, R (2.0) },
  { "1.2 g/cm3", PL_QUANTITY_DENSITY, PL_UNIT_SYSTEM_SI, '.', 1200.0, R (1200.0) },
  { "62.4 lb/ft3", PL_QUANTITY_DENSITY, PL_UNIT_SYSTEM_SI, '.',
    62.4 * REF_POUND / (REF_FOOT * REF_FOOT * REF_FOOT), R (1000.0) },
  { "30:1", PL_QUANTITY_RATIO, PL_UNIT_SYSTEM_SI, '.', 30.0, R (30.0) },
  { "30", PL_QUANTITY_RATIO, PL_UNIT_SYSTEM_SI, '.', 30.0, R (30.0) },
  { "50 %", PL_QUANTITY_RATIO, PL_UNIT_SYSTEM_SI, '.', 0.5, R (0.5) },
  { "1 in²", PL_QUANTITY_AREA, PL_UNIT_SYSTEM_SI, '.', 6.4516e-4, R (6.4516e-4) },
  { "1 mm2", PL_QUANTITY_AREA, PL_UNIT_SYSTEM_SI, '.', 1e-6, R (1e-6) },
  { "3 ft/s", PL_QUANTITY_VELOCITY, PL_UNIT_SYSTEM_SI, '.', 0.9144, R (0.9144) },
  { "500 1/s", PL_QUANTITY_SHEAR_RATE, PL_UNIT_SYSTEM_SI, '.', 500.0, R (500.0) },
  { "0.005 mL/(m·bar)", PL_QUANTITY_HOSE_EXPANSION, PL_UNIT_SYSTEM_SI, '.', 5e-14, R (5e-14) },
};

START_TEST (test_parse)
{
  const ParseCase *c = &parse_cases[_i];
  g_autoptr (GError) error = NULL;
  PlUnitPrefs prefs;
  double value = -12345.0;

  pl_unit_prefs_init (&prefs, c->system);
  ck_assert_msg (pl_unit_parse (c->text, c->quantity, &prefs, c->sep, &value, &error),
                 "“%s”: %s", c->text, error != NULL ? error->message : "");
  ck_assert_ptr_null (error);
  ck_assert_msg (fabs (value - c->expected) <= c->tol, "“%s” -> %.17g, expected %.17g",
                 c->text, value, c->expected);
  ck_assert (!signbit (value) || value != 0.0);
}
END_TEST

typedef struct
{
  const char *text;
  PlQuantity quantity;
  char sep;
  PlUnitError code;
} RejectCase;

static const RejectCase reject_cases[] = {
  { "", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_EMPTY },
  { "   ", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_EMPTY },
  { "\u00a0\t", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_EMPTY },
  { "abc", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_INVALID_NUMBER },
  { "psi", PL_QUANTITY_PRESSURE, '.', PL_UNIT_ERROR_INVALID_NUMBER },
  { "-", PL_QUANTITY_PRESSURE, '.', PL_UNIT_ERROR_INVALID_NUMBER },
  { ".", PL_QUANTITY_PRESSURE, '.', PL_UNIT_ERROR_INVALID_NUMBER },
  { "+-3 bar", PL_QUANTITY_PRESSURE, '.', PL_UNIT_ERROR_INVALID_NUMBER },
  { "7/0 in", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_DIVISION_BY_ZERO },
  { "1-1/0 in", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_DIVISION_BY_ZERO },
  { "0/0", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_DIVISION_BY_ZERO },
  { "3 furlongs", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_UNKNOWN_UNIT },
  { "1 ft 6 in", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_UNKNOWN_UNIT },
  { "0x10 mm", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_UNKNOWN_UNIT },
  { "1e", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_UNKNOWN_UNIT },
  { "22 psi", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_WRONG_QUANTITY },
  { "22 mm", PL_QUANTITY_PRESSURE, '.', PL_UNIT_ERROR_WRONG_QUANTITY },
  { "5 Hz", PL_QUANTITY_SHEAR_RATE, '.', PL_UNIT_ERROR_WRONG_QUANTITY },
  { "1/2/3 in", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_INVALID_NUMBER },
  { "1-1/2/3 in", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_INVALID_NUMBER },
  { "1 1/2/3 in", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_INVALID_NUMBER },
  { "1/2 1/2 in", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_INVALID_NUMBER },
  { "1.5/2 in", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_INVALID_NUMBER },
  { "1/2.5 in", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_INVALID_NUMBER },
  { "5-3 mm", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_INVALID_NUMBER },
  { "1 500 bar", PL_QUANTITY_PRESSURE, '.', PL_UNIT_ERROR_INVALID_NUMBER },
  { "1.2.3 mm", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_INVALID_NUMBER },
  { "3..5 mm", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_INVALID_NUMBER },
  /* ',' in a '.' locale groups thousands and nothing else. */
  { "12,5 mm", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_INVALID_NUMBER },
  { "1,23 mm", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_INVALID_NUMBER },
  { "1234,567 mm", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_INVALID_NUMBER },
  { "2,5000 psi", PL_QUANTITY_PRESSURE, '.', PL_UNIT_ERROR_INVALID_NUMBER },
  { ",5 in", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_INVALID_NUMBER },
  { "1,5,0 mm", PL_QUANTITY_LENGTH, ',', PL_UNIT_ERROR_INVALID_NUMBER },
  /* Overflow and underflow never come back as Inf or a silent 0. */
  { "1e999 psi", PL_QUANTITY_PRESSURE, '.', PL_UNIT_ERROR_OUT_OF_RANGE },
  { "-1e999 psi", PL_QUANTITY_PRESSURE, '.', PL_UNIT_ERROR_OUT_OF_RANGE },
  { "1e-999 psi", PL_QUANTITY_PRESSURE, '.', PL_UNIT_ERROR_OUT_OF_RANGE },
  { "1e99999999999999999999 psi", PL_QUANTITY_PRESSURE, '.', PL_UNIT_ERROR_OUT_OF_RANGE },
  { "1e308 ksi", PL_QUANTITY_PRESSURE, '.', PL_UNIT_ERROR_OUT_OF_RANGE },
  { "1e-300 cc/(ft·ksi)", PL_QUANTITY_HOSE_EXPANSION, '.', PL_UNIT_ERROR_OUT_OF_RANGE },
  { "NaN", PL_QUANTITY_PRESSURE, '.', PL_UNIT_ERROR_INVALID_NUMBER },
  { "nan psi", PL_QUANTITY_PRESSURE, '.', PL_UNIT_ERROR_INVALID_NUMBER },
  { "inf", PL_QUANTITY_PRESSURE, '.', PL_UNIT_ERROR_INVALID_NUMBER },
  { "infinity bar", PL_QUANTITY_PRESSURE, '.', PL_UNIT_ERROR_INVALID_NUMBER },
  { "-300 °C", PL_QUANTITY_TEMPERATURE, '.', PL_UNIT_ERROR_OUT_OF_RANGE },
  { "-1 K", PL_QUANTITY_TEMPERATURE, '.', PL_UNIT_ERROR_OUT_OF_RANGE },
  { "-3 mL", PL_QUANTITY_VOLUME, '.', PL_UNIT_ERROR_NEGATIVE },
  { "-5 mm", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_NEGATIVE },
  { "−1 mPa s", PL_QUANTITY_VISCOSITY, '.', PL_UNIT_ERROR_NEGATIVE },
  { "\xff\xfe", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_INVALID_NUMBER },
  { "12 \xc3", PL_QUANTITY_LENGTH, '.', PL_UNIT_ERROR_INVALID_NUMBER },
};

START_TEST (test_reject)
{
  const RejectCase *c = &reject_cases[_i];
  g_autoptr (GError) error = NULL;
  double value = -12345.0;

  ck_assert_msg (!pl_unit_parse (c->text, c->quantity, NULL, c->sep, &value, &error),
                 "“%s” was accepted as %g", c->text, value);
  ck_assert_double_eq (value, -12345.0);
  ck_assert_ptr_nonnull (error);
  ck_assert (g_error_matches (error, PL_UNIT_ERROR, (gint) c->code));
  ck_assert (g_utf8_validate (error->message, -1, NULL));
  /* A sentence that names what was typed, when there is something to show. */
  if (c->code != PL_UNIT_ERROR_EMPTY && g_utf8_validate (c->text, -1, NULL))
    {
      g_autofree char *shown = g_strstrip (g_strdup (c->text));

      ck_assert_msg (strstr (error->message, shown) != NULL, "“%s” not in “%s”", shown,
                     error->message);
    }
  ck_assert (g_str_has_suffix (error->message, "."));
}
END_TEST

/* The messages that issue 5 spells out, in English (no translation is
 * loaded in the test). */
START_TEST (test_reject_messages)
{
  g_autoptr (GError) error = NULL;
  double value;

  ck_assert (!pl_unit_parse ("22 psi", PL_QUANTITY_LENGTH, NULL, '.', &value, &error));
  ck_assert_str_eq (error->message,
                    "“22 psi” is a pressure; a length is expected (m, cm, mm, µm, in, ft).");
  g_clear_error (&error);
  ck_assert (!pl_unit_parse (" 3 furlongs ", PL_QUANTITY_LENGTH, NULL, '.', &value, &error));
  ck_assert_str_eq (error->message, "In “3 furlongs”, “furlongs” is not a unit that Pressline "
                    "knows; a length is expected (m, cm, mm, µm, in, ft).");
  g_clear_error (&error);
  ck_assert (!pl_unit_parse ("-3 mL", PL_QUANTITY_VOLUME, NULL, '.', &value, &error));
  ck_assert_str_eq (error->message, "“-3 mL” is negative; a volume cannot be negative.");
  g_clear_error (&error);
  ck_assert (!pl_unit_parse (NULL, PL_QUANTITY_VOLUME, NULL, '.', &value, &error));
  ck_assert (g_error_matches (error, PL_UNIT_ERROR, PL_UNIT_ERROR_EMPTY));
}
END_TEST

/* Up to PL_UNIT_PARSE_MAX_LENGTH bytes are read; more is an error, not a
 * long scan or a huge message. */
START_TEST (test_parse_long)
{
  gsize big = 100000;
  g_autofree char *huge = g_malloc (big + 1);
  g_autofree char *limit = g_malloc (PL_UNIT_PARSE_MAX_LENGTH + 1);
  g_autofree char *over = NULL;
  g_autoptr (GError) error = NULL;
  double value = 0.0;

  memset (huge, '1', big);
  huge[big] = '\0';
  ck_assert (!pl_unit_parse (huge, PL_QUANTITY_LENGTH, NULL, '.', &value, &error));
  ck_assert (g_error_matches (error, PL_UNIT_ERROR, PL_UNIT_ERROR_INVALID_NUMBER));
  ck_assert_uint_lt (strlen (error->message), 200);
  g_clear_error (&error);

  /* "1.000…000 m", exactly PL_UNIT_PARSE_MAX_LENGTH bytes: still read. */
  memset (limit, '0', PL_UNIT_PARSE_MAX_LENGTH);
  limit[0] = '1';
  limit[1] = '.';
  memcpy (limit + PL_UNIT_PARSE_MAX_LENGTH - 2, " m", 2);
  limit[PL_UNIT_PARSE_MAX_LENGTH] = '\0';
  ck_assert (pl_unit_parse (limit, PL_QUANTITY_LENGTH, NULL, '.', &value, &error));
  ck_assert_double_eq_tol (value, 1.0, DBL_EPSILON);

  over = g_strconcat (" ", limit, NULL);
  ck_assert (!pl_unit_parse (over, PL_QUANTITY_LENGTH, NULL, '.', &value, &error));
  ck_assert (g_error_matches (error, PL_UNIT_ERROR, PL_UNIT_ERROR_INVALID_NUMBER));
}
END_TEST

START_TEST (test_parse_unit)
{
  PlUnitPrefs us;

  pl_unit_prefs_init (&us, PL_UNIT_SYSTEM_US);
  ck_assert_int_eq (pl_unit_parse_unit ("22mm", PL_QUANTITY_LENGTH, &us, '.'), PL_UNIT_MM);
  ck_assert_int_eq (pl_unit_parse_unit ("22", PL_QUANTITY_LENGTH, &us, '.'), PL_UNIT_IN);
  ck_assert_int_eq (pl_unit_parse_unit ("22", PL_QUANTITY_LENGTH, NULL, '.'), PL_UNIT_MM);
  ck_assert_int_eq (pl_unit_parse_unit ("abc", PL_QUANTITY_LENGTH, &us, '.'), PL_UNIT_NONE);
  ck_assert_int_eq (pl_unit_parse_unit ("2 psi", PL_QUANTITY_LENGTH, &us, '.'), PL_UNIT_NONE);
}
END_TEST

/* --- formatting --------------------------------------------------------- */

typedef struct
{
  double value_si;
  PlQuantity quantity;
  PlUnitSystem system;
  int digits;
  char sep;
  const char *expected;
} FormatCase;

static const FormatCase format_cases[] = {
  { 17236893.232920, PL_QUANTITY_PRESSURE, PL_UNIT_SYSTEM_US, 0, '.', "2500 psi" },
  { 17236893.232920, PL_QUANTITY_PRESSURE, PL_UNIT_SYSTEM_SI, 0, '.', "172.4 bar" },
  { 17236893.232920, PL_QUANTITY_PRESSURE, PL_UNIT_SYSTEM_SI, 6, ',', "172,369 bar" },
  { 1.72e7, PL_QUANTITY_PRESSURE, PL_UNIT_SYSTEM_SI, 0, '.', "172 bar" },
  { -5e4, PL_QUANTITY_PRESSURE, PL_UNIT_SYSTEM_SI, 0, '.', "-0.5 bar" },
  { 0.0, PL_QUANTITY_PRESSURE, PL_UNIT_SYSTEM_SI, 0, '.', "0 bar" },
  { -0.0, PL_QUANTITY_PRESSURE, PL_UNIT_SYSTEM_SI, 0, '.', "0 bar" },
  { 1.23456789e15, PL_QUANTITY_PRESSURE, PL_UNIT_SYSTEM_SI, 0, '.', "1.235e+10 bar" },
  { 1.5e9, PL_QUANTITY_MODULUS, PL_UNIT_SYSTEM_SI, 0, '.', "1500 MPa" },
  { 0.0125, PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_SI, 0, ',', "12,5 mm" },
  { 0.0125, PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_SI, 0, '.', "12.5 mm" },
  /* 12.5 mm / 25.4 mm = 0.49212598... in */
  { 0.0125, PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_US, 0, '.', "0.4921 in" },
  { 0.022225, PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_US, 0, '.', "0.875 in" },
  { 2.5e-10, PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_SI, 0, '.', "2.5e-07 mm" },
  { 2.5e-10, PL_QUANTITY_LENGTH, PL_UNIT_SYSTEM_SI, 0, ',', "2,5e-07 mm" },
  { 30.48, PL_QUANTITY_LINE_LENGTH, PL_UNIT_SYSTEM_US, 0, '.', "100 ft" },
  { 293.15, PL_QUANTITY_TEMPERATURE, PL_UNIT_SYSTEM_SI, 0, '.', "20 °C" },
  { 293.15, PL_QUANTITY_TEMPERATURE, PL_UNIT_SYSTEM_US, 0, '.', "68 °F" },
  { 5e-5, PL_QUANTITY_FLOW, PL_UNIT_SYSTEM_SI, 0, '.', "3 L/min" },
  /* 5e-5 m^3/s / (3.785411784e-3 m^3 / 60 s) = 0.79251616 gal/min */
  { 5e-5, PL_QUANTITY_FLOW, PL_UNIT_SYSTEM_US, 0, '.', "0.7925 gal/min" },
  { 0.5, PL_QUANTITY_VISCOSITY, PL_UNIT_SYSTEM_SI, 0, '.', "500 mPa·s" },
  { 0.5, PL_QUANTITY_VISCOSITY, PL_UNIT_SYSTEM_US, 0, '.', "500 cP" },
  { 1e-6, PL_QUANTITY_VOLUME, PL_UNIT_SYSTEM_SI, 0, '.', "1 mL" },
  /* 1 mL / 16.387064 mL = 0.0610237 in^3 */
  { 1e-6, PL_QUANTITY_VOLUME, PL_UNIT_SYSTEM_US, 0, ',', "0,06102 in³" },
  { 0.028349523125, PL_QUANTITY_MASS, PL_UNIT_SYSTEM_US, 0, '.', "1 oz" },
  { 0.028349523125, PL_QUANTITY_MASS, PL_UNIT_SYSTEM_SI, 0, '.', "28.35 g" },
  { 1500.0, PL_QUANTITY_ENERGY, PL_UNIT_SYSTEM_US, 0, '.', "1500 J" },
  { 0.5, PL_QUANTITY_FREQUENCY, PL_UNIT_SYSTEM_SI, 0, '.', "30 1/min" },
  { 30.0, PL_QUANTITY_RATIO, PL_UNIT_SYSTEM_SI, 0, '.', "30" },
  { 1200.0, PL_QUANTITY_DENSITY, PL_UNIT_SYSTEM_SI, 0, '.', "1200 kg/m³" },
  { 5e-14, PL_QUANTITY_HOSE_EXPANSION, PL_UNIT_SYSTEM_SI, 0, '.', "0.005 mL/(m·bar)" },
  { NAN, PL_QUANTITY_PRESSURE, PL_UNIT_SYSTEM_SI, 0, '.', "– bar" },
  { INFINITY, PL_QUANTITY_PRESSURE, PL_UNIT_SYSTEM_SI, 0, '.', "– bar" },
  /* 9.99996 rounds up to 10.000 and loses its zeros. */
  { 9.99996e5, PL_QUANTITY_PRESSURE, PL_UNIT_SYSTEM_SI, 0, '.', "10 bar" },
};

START_TEST (test_format)
{
  const FormatCase *c = &format_cases[_i];
  PlUnitPrefs prefs;
  g_autofree char *text = NULL;
  g_autofree char *number = NULL;
  g_autofree char *expected_number = NULL;
  const char *space;

  pl_unit_prefs_init (&prefs, c->system);
  text = pl_unit_format (c->value_si, c->quantity, &prefs, c->digits, c->sep);
  ck_assert_str_eq (text, c->expected);
  number = pl_unit_format_number (c->value_si, c->quantity, &prefs, c->digits, c->sep);
  space = strchr (c->expected, ' ');
  expected_number = space != NULL ? g_strndup (c->expected, (gsize) (space - c->expected))
                                  : g_strdup (c->expected);
  ck_assert_str_eq (number, expected_number);
}
END_TEST

/* format -> parse gives the value back for every quantity, system and
 * separator: with 17 significant digits a double survives the decimal
 * text exactly, so what is left is the conversion, a few ulp. */
START_TEST (test_format_parse_round_trip)
{
  static const double values[] = { 1.0, 0.022225, 17236893.23292, 3.3e-9, 4.2e11, -2.5 };
  static const char seps[] = { '.', ',' };
  PlQuantity q = (PlQuantity) _i;

  for (int s = 0; s < PL_N_UNIT_SYSTEMS; s++)
    for (gsize k = 0; k < G_N_ELEMENTS (seps); k++)
      for (gsize i = 0; i < G_N_ELEMENTS (values); i++)
        {
          PlUnitPrefs prefs;
          double v = values[i];
          g_autofree char *text = NULL;
          g_autoptr (GError) error = NULL;
          double back = 0.0;

          if (q == PL_QUANTITY_TEMPERATURE)
            v = fabs (v) + 1.0;  /* kelvin */
          else if (v < 0.0 && !pl_quantity_may_be_negative (q))
            continue;
          pl_unit_prefs_init (&prefs, (PlUnitSystem) s);
          text = pl_unit_format (v, q, &prefs, 17, seps[k]);
          ck_assert_msg (pl_unit_parse (text, q, &prefs, seps[k], &back, &error), "“%s”: %s",
                         text, error != NULL ? error->message : "");
          /* The temperature offsets (up to 459.67) add to the error. */
          double scale = fabs (v) + (q == PL_QUANTITY_TEMPERATURE ? 460.0 : 0.0);

          ck_assert_msg (fabs (back - v) <= 8.0 * DBL_EPSILON * scale,
                         "“%s”: %.17g -> %.17g", text, v, back);
        }
}
END_TEST

/* --- the locale --------------------------------------------------------- */

static gboolean
remove_tree (const char *path)
{
  g_autoptr (GDir) dir = g_dir_open (path, 0, NULL);
  const char *name;

  if (dir != NULL)
    while ((name = g_dir_read_name (dir)) != NULL)
      {
        g_autofree char *child = g_build_filename (path, name, NULL);

        remove_tree (child);
      }
  return g_remove (path) == 0;
}

/* Switches LC_NUMERIC to a locale whose decimal mark is ','.  Tries the
 * installed ones first, then builds de_DE.UTF-8 with localedef into a
 * temporary folder (LOCPATH).  Returns the folder to remove (or "" if none
 * was made), or NULL if no such locale can be had on this machine. */
static char *
use_comma_locale (void)
{
  static const char *const names[] = { "de_DE.UTF-8", "de_DE.utf8", "fr_FR.UTF-8",
                                       "nl_NL.UTF-8", "de_DE" };
  g_autofree char *localedef = g_find_program_in_path ("localedef");
  g_autofree char *dir = NULL;
  g_autofree char *target = NULL;
  int status = 0;

  for (gsize i = 0; i < G_N_ELEMENTS (names); i++)
    if (setlocale (LC_NUMERIC, names[i]) != NULL
        && strcmp (localeconv ()->decimal_point, ",") == 0)
      return g_strdup ("");
  if (localedef == NULL || (dir = g_dir_make_tmp ("pl-units-XXXXXX", NULL)) == NULL)
    return NULL;
  target = g_build_filename (dir, "de_DE.UTF-8", NULL);
  {
    const char *argv[] = { localedef, "-i", "de_DE", "-f", "UTF-8", target, NULL };

    if (!g_spawn_sync (NULL, (char **) argv, NULL,
                       G_SPAWN_STDOUT_TO_DEV_NULL | G_SPAWN_STDERR_TO_DEV_NULL, NULL, NULL,
                       NULL, NULL, &status, NULL)
        || !g_spawn_check_wait_status (status, NULL))
      {
        remove_tree (dir);
        return NULL;
      }
  }
  g_setenv ("LOCPATH", dir, TRUE);
  if (setlocale (LC_NUMERIC, "de_DE.UTF-8") == NULL
      || strcmp (localeconv ()->decimal_point, ",") != 0)
    {
      g_unsetenv ("LOCPATH");
      remove_tree (dir);
      return NULL;
    }
  return g_steal_pointer (&dir);
}

/* The file form ('.') never depends on the process locale; the locale form
 * follows it, in formatting and in parsing. */
START_TEST (test_locale)
{
  g_autofree char *made = NULL;
  char printed[32];
  double value = 0.0;
  g_autoptr (GError) error = NULL;

  /* In the C locale the locale form is '.'. */
  setlocale (LC_NUMERIC, "C");
  {
    g_autofree char *c_text = pl_unit_format (0.0125, PL_QUANTITY_LENGTH, NULL, 0,
                                              PL_UNIT_DECIMAL_FROM_LOCALE);
    ck_assert_str_eq (c_text, "12.5 mm");
  }

  made = use_comma_locale ();
  if (made == NULL)
    {
      fprintf (stderr, "test_locale: no decimal-comma locale on this machine "
               "(install 'locales'); only the C locale was checked\n");
      return;
    }
  /* The switch took: the C library now prints a comma. */
  snprintf (printed, sizeof printed, "%.1f", 12.5);
  ck_assert_str_eq (printed, "12,5");

  {
    g_autofree char *file = pl_unit_format (0.0125, PL_QUANTITY_LENGTH, NULL, 0, '.');
    g_autofree char *file_number = pl_unit_format_number (2.5e-10, PL_QUANTITY_LENGTH, NULL,
                                                          0, '.');
    g_autofree char *ui = pl_unit_format (0.0125, PL_QUANTITY_LENGTH, NULL, 0,
                                          PL_UNIT_DECIMAL_FROM_LOCALE);

    ck_assert_str_eq (file, "12.5 mm");
    ck_assert_str_eq (file_number, "2.5e-07");
    ck_assert_str_eq (ui, "12,5 mm");
  }
  ck_assert (pl_unit_parse ("12,5 mm", PL_QUANTITY_LENGTH, NULL, PL_UNIT_DECIMAL_FROM_LOCALE,
                            &value, &error));
  ck_assert_double_eq_tol (value, 0.0125, 1e-17);
  /* With '.' asked for, the locale's comma is a thousands separator again. */
  ck_assert (pl_unit_parse ("2,500 psi", PL_QUANTITY_PRESSURE, NULL, '.', &value, &error));
  ck_assert_double_eq_tol (value, 17.236893232920e6, 2e-6);
  ck_assert (pl_unit_parse ("1.5e3 psi", PL_QUANTITY_PRESSURE, NULL, '.', &value, &error));
  ck_assert_double_eq_tol (value, 1500.0 * PSI, 1e-8);

  setlocale (LC_NUMERIC, "C");
  if (made[0] != '\0')
    {
      g_unsetenv ("LOCPATH");
      ck_assert (remove_tree (made));
    }
}
END_TEST

/* --- preferences -------------------------------------------------------- */

START_TEST (test_prefs)
{
  PlUnitPrefs prefs;
  PlUnitPrefs back;
  g_autofree char *text = NULL;

  pl_unit_prefs_init (&prefs, PL_UNIT_SYSTEM_US);
  ck_assert_int_eq (pl_unit_prefs_get_unit (&prefs, PL_QUANTITY_PRESSURE), PL_UNIT_PSI);
  ck_assert (pl_unit_prefs_set_unit (&prefs, PL_QUANTITY_PRESSURE, PL_UNIT_BAR));
  ck_assert (pl_unit_prefs_set_unit (&prefs, PL_QUANTITY_LINE_LENGTH, PL_UNIT_M));
  ck_assert (!pl_unit_prefs_set_unit (&prefs, PL_QUANTITY_LENGTH, PL_UNIT_PSI));
  ck_assert (pl_unit_prefs_set_unit (&prefs, PL_QUANTITY_MODULUS, PL_UNIT_GPA));
  ck_assert_int_eq (pl_unit_prefs_get_unit (&prefs, PL_QUANTITY_PRESSURE), PL_UNIT_BAR);
  ck_assert_int_eq (pl_unit_prefs_get_unit (&prefs, PL_QUANTITY_LENGTH), PL_UNIT_IN);

  text = pl_unit_prefs_to_string (&prefs);
  ck_assert_str_eq (text, "us;pressure=bar;modulus=GPa;line-length=m");
  memset (&back, 0xff, sizeof back);
  ck_assert (pl_unit_prefs_from_string (&back, text, NULL));
  ck_assert (memcmp (&back, &prefs, sizeof prefs) == 0);

  ck_assert (pl_unit_prefs_set_unit (&prefs, PL_QUANTITY_PRESSURE, PL_UNIT_NONE));
  ck_assert_int_eq (pl_unit_prefs_get_unit (&prefs, PL_QUANTITY_PRESSURE), PL_UNIT_PSI);

  /* A struct filled with rubbish still answers with a fitting unit. */
  memset (&back, 0x7f, sizeof back);
  for (int q = 0; q < PL_N_QUANTITIES; q++)
    ck_assert (pl_unit_fits (pl_unit_prefs_get_unit (&back, (PlQuantity) q), (PlQuantity) q));
}
END_TEST

static const char *const bad_prefs[] = {
  "", "xx", "si;pressure=mm", "si;nope=bar", "si;pressure", "us;pressure=", "si;=bar",
  "\xff", "SI",
};

START_TEST (test_prefs_reject)
{
  PlUnitPrefs prefs;
  PlUnitPrefs before;
  g_autoptr (GError) error = NULL;

  pl_unit_prefs_init (&prefs, PL_UNIT_SYSTEM_US);
  pl_unit_prefs_set_unit (&prefs, PL_QUANTITY_LENGTH, PL_UNIT_MM);
  before = prefs;
  ck_assert (!pl_unit_prefs_from_string (&prefs, bad_prefs[_i], &error));
  ck_assert_ptr_nonnull (error);
  ck_assert (error->domain == PL_UNIT_ERROR);
  ck_assert (memcmp (&before, &prefs, sizeof prefs) == 0);
  ck_assert (pl_unit_prefs_from_string (&prefs, "si; length = in ;", NULL));
  ck_assert_int_eq (pl_unit_prefs_get_unit (&prefs, PL_QUANTITY_LENGTH), PL_UNIT_IN);
}
END_TEST

/* --- fuzz --------------------------------------------------------------- */

/* What the random UTF-8 strings are made of: what a number and a unit may
 * contain, look-alikes, and a few arbitrary characters. */
static const gunichar fuzz_chars[] = {
  '0', '1', '2', '5', '7', '9', '.', ',', '/', '-', '+', ' ', 'e', 'E', ':', '%', '\'', '"',
  'm', 'M', 'i', 'n', 'p', 's', 'P', 'a', 'L', 'l', 'g', 'C', 'F', 'k', 'b', 'r', '(', ')',
  '^', '*', '\t', 0x00A0, 0x202F, 0x2212, 0x2013, 0x00B7, 0x00B0, 0x00B2, 0x00B3, 0x00B5,
  0x00BD, 0x215E, 0x2044, 0x2033, 0x2103, 0x207B, 0x00E9, 0x4E2D, 0x1F600, 0xFFFD,
};

static void
fuzz_one (const char *text, GRand *rand)
{
  static const char seps[] = { '.', ',', PL_UNIT_DECIMAL_FROM_LOCALE, 'x' };
  PlQuantity q = (PlQuantity) g_rand_int_range (rand, 0, PL_N_QUANTITIES);
  PlUnitPrefs prefs;
  g_autoptr (GError) error = NULL;
  double value = -12345.0;
  gboolean ok;

  pl_unit_prefs_init (&prefs, (PlUnitSystem) g_rand_int_range (rand, 0, PL_N_UNIT_SYSTEMS));
  ok = pl_unit_parse (text, q, &prefs, seps[g_rand_int_range (rand, 0, 4)], &value, &error);
  if (ok)
    {
      ck_assert_ptr_null (error);
      ck_assert_msg (isfinite (value), "“%s” -> %g", text, value);
      if (!pl_quantity_may_be_negative (q))
        ck_assert_msg (value >= 0.0, "“%s” -> %g for %s", text, value,
                       pl_quantity_get_key (q));
    }
  else
    {
      ck_assert_ptr_nonnull (error);
      ck_assert (error->domain == PL_UNIT_ERROR);
      ck_assert (g_utf8_validate (error->message, -1, NULL));
      ck_assert_double_eq (value, -12345.0);
    }
}

/* Random bytes, then random UTF-8 from fuzz_chars, each in a buffer of
 * exactly its length so AddressSanitizer sees any read past the end.
 * Fixed seed: the same 6000 strings every run. */
START_TEST (test_fuzz)
{
  g_autoptr (GRand) rand = g_rand_new_with_seed (20260501);

  for (int i = 0; i < 3000; i++)
    {
      int len = g_rand_int_range (rand, 0, 24);
      g_autofree char *bytes = g_malloc (len + 1);

      for (int k = 0; k < len; k++)
        bytes[k] = (char) g_rand_int_range (rand, 1, 256);
      bytes[len] = '\0';
      fuzz_one (bytes, rand);
    }
  for (int i = 0; i < 3000; i++)
    {
      int len = g_rand_int_range (rand, 0, 16);
      GString *s = g_string_new (NULL);
      g_autofree char *text = NULL;

      for (int k = 0; k < len; k++)
        g_string_append_unichar (s, fuzz_chars[g_rand_int_range (rand, 0,
                                                                 G_N_ELEMENTS (fuzz_chars))]);
      text = g_malloc (s->len + 1);
      memcpy (text, s->str, s->len + 1);
      g_string_free (s, TRUE);
      fuzz_one (text, rand);
    }
}
END_TEST

static Suite *
units_suite (void)
{
  Suite *s = suite_create ("units");
  TCase *tc_factors = tcase_create ("factors");
  TCase *tc_tables = tcase_create ("tables");
  TCase *tc_parse = tcase_create ("parse");
  TCase *tc_format = tcase_create ("format");
  TCase *tc_prefs = tcase_create ("prefs");

  tcase_add_loop_test (tc_factors, test_factor_nist, 0, G_N_ELEMENTS (factor_cases));
  tcase_add_test (tc_factors, test_factor_table_complete);
  tcase_add_test (tc_factors, test_consistency_units);
  tcase_add_test (tc_factors, test_factor_exact);
  tcase_add_loop_test (tc_factors, test_temperature, 0, G_N_ELEMENTS (temperature_cases));
  tcase_add_loop_test (tc_factors, test_round_trip, PL_UNIT_NONE + 1, PL_N_UNITS);
  suite_add_tcase (s, tc_factors);

  tcase_add_loop_test (tc_tables, test_unit_table, PL_UNIT_NONE + 1, PL_N_UNITS);
  tcase_add_test (tc_tables, test_spellings_unique);
  tcase_add_loop_test (tc_tables, test_quantity_table, 0, PL_N_QUANTITIES);
  tcase_add_loop_test (tc_tables, test_defaults, 0, G_N_ELEMENTS (default_cases));
  tcase_add_loop_test (tc_tables, test_lookup, 0, G_N_ELEMENTS (lookup_cases));
  suite_add_tcase (s, tc_tables);

  tcase_add_loop_test (tc_parse, test_parse, 0, G_N_ELEMENTS (parse_cases));
  tcase_add_loop_test (tc_parse, test_reject, 0, G_N_ELEMENTS (reject_cases));
  tcase_add_test (tc_parse, test_reject_messages);
  tcase_add_test (tc_parse, test_parse_long);
  tcase_add_test (tc_parse, test_parse_unit);
  tcase_add_test (tc_parse, test_fuzz);
  tcase_set_timeout (tc_parse, 60);
  suite_add_tcase (s, tc_parse);

  tcase_add_loop_test (tc_format, test_format, 0, G_N_ELEMENTS (format_cases));
  tcase_add_loop_test (tc_format, test_format_parse_round_trip, 0, PL_N_QUANTITIES);
  tcase_add_test (tc_format, test_locale);
  tcase_set_timeout (tc_format, 60);
  suite_add_tcase (s, tc_format);

  tcase_add_test (tc_prefs, test_prefs);
  tcase_add_loop_test (tc_prefs, test_prefs_reject, 0, G_N_ELEMENTS (bad_prefs));
  suite_add_tcase (s, tc_prefs);
  return s;
}

int
main (void)
{
  return pl_check_run (units_suite ());
}
