/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * test-fluid.c: viscosity laws, temperature shift and the fluid validator.
 */
#include "config.h"

#include "pls-laws.h"

#include "pl-check.h"
#include <math.h>
#include <stdlib.h>
#include <string.h>

static pls_fluid_params
fluid_of (int k)
{
  pls_fluid_params f;

  pls_fluid_params_init (&f);
  switch (k)
    {
    case 0:
      f.mu = 2.0;
      break;
    case 1:
      f.law = PLS_VISCOSITY_POWER_LAW;
      f.consistency = 10.0;
      f.flow_index = 0.5;
      break;
    case 2:
      f.law = PLS_VISCOSITY_POWER_LAW;
      f.consistency = 0.3;
      f.flow_index = 1.6;
      break;
    case 3:
      f.law = PLS_VISCOSITY_CARREAU;
      f.mu_zero = 50.0;
      f.mu_infinity = 0.05;
      f.lambda = 0.8;
      f.flow_index = 0.35;
      break;
    default:
      f.law = PLS_VISCOSITY_CARREAU;
      f.mu_zero = 1.0;
      f.mu_infinity = 0.0;
      f.lambda = 0.1;
      f.flow_index = 1.4;
      break;
    }
  return f;
}

START_TEST (test_defaults_valid)
{
  pls_fluid_params f;
  char why[PLS_MESSAGE_MAX];

  pls_fluid_params_init (&f);
  ck_assert_int_eq (pls_fluid_params_check (&f, why, sizeof why), PLS_OK);
  ck_assert_str_eq (why, "");
  ck_assert_int_eq (f.law, PLS_VISCOSITY_NEWTONIAN);
  ck_assert_double_eq (pls_fluid_viscosity (&f, 123.0), 1.0);
}
END_TEST

START_TEST (test_power_law_values)
{
  /* Ostwald-de Waele: mu = K gamma^(n-1).  Above 1 1/s the plateau
   * regularisation (gc = 1e-3 1/s) changes it by (1-n)/2 (gc/gamma)^2 <=
   * 2.5e-7 for n >= 0.5, hence 1e-6.  Below gc it is the plateau K gc^(n-1)
   * within the factor 2^((n-1)/2) at gamma = gc. */
  pls_fluid_params f = fluid_of (1);
  double g;

  for (g = 1.0; g <= 1e6; g *= 3.0)
    ck_assert_double_eq_tol (pls_fluid_viscosity (&f, g) / (10.0 * pow (g, -0.5)), 1.0, 1e-6);
  ck_assert_double_eq_tol (pls_fluid_viscosity (&f, 0.0),
                           10.0 * pow (PLS_POWER_LAW_PLATEAU_SHEAR, -0.5), 1e-9);
  ck_assert_double_eq_tol (pls_fluid_viscosity (&f, PLS_POWER_LAW_PLATEAU_SHEAR)
                           / pls_fluid_viscosity (&f, 0.0), pow (2.0, -0.25), 1e-12);
  ck_assert (isfinite (pls_fluid_zero_shear_viscosity (&f)));
  ck_assert (!pls_fluid_is_newtonian (&f));
}
END_TEST

START_TEST (test_carreau_values)
{
  /* Carreau (Bird, Armstrong & Hassager, Dynamics of Polymeric Liquids,
   * vol. 1, eq. 4.1-9): mu = mu_inf + (mu_0 - mu_inf)(1 + (lambda g)^2)^((n-1)/2).
   * At lambda g = 1 the factor is 2^((n-1)/2); at high shear mu -> the
   * power law (mu_0 - mu_inf) (lambda g)^(n-1) + mu_inf. */
  pls_fluid_params f = fluid_of (3);
  double g = 1.0 / 0.8;

  ck_assert_double_eq_tol (pls_fluid_viscosity (&f, 0.0), 50.0, 1e-12);
  ck_assert_double_eq_tol (pls_fluid_viscosity (&f, g),
                           0.05 + 49.95 * pow (2.0, -0.325), 1e-12);
  ck_assert_double_eq_tol (pls_fluid_viscosity (&f, 1e6)
                           / (0.05 + 49.95 * pow (0.8e6, -0.65)), 1.0, 1e-10);
  /* lambda = 0 is Newtonian with mu_0. */
  f.lambda = 0.0;
  ck_assert (pls_fluid_is_newtonian (&f));
  ck_assert_double_eq (pls_fluid_viscosity (&f, 1e4), 50.0);
}
END_TEST

START_TEST (test_stress_slope_and_inverse)
{
  /* tau = mu gamma; its slope against a central difference (step 1e-6
   * gamma: truncation ~1e-12, round-off ~1e-10 relative, so 1e-7), and the
   * inverse gamma(tau) round trip to 1e-12 (the Newton stops at 4 ulp). */
  pls_fluid_params f = fluid_of (_i);
  double g;

  for (g = 1e-6; g < 1e7; g *= 2.3)
    {
      double slope, sp, sm, tau = pls_fluid_shear_stress (&f, g, &slope);
      double dg = 1e-6 * g;
      double tp = pls_fluid_shear_stress (&f, g + dg, &sp);
      double tm = pls_fluid_shear_stress (&f, g - dg, &sm);

      ck_assert (slope > 0.0 && isfinite (slope));
      ck_assert_double_eq_tol (tau / (pls_fluid_viscosity (&f, g) * g), 1.0, 1e-14);
      ck_assert_double_eq_tol ((tp - tm) / (2.0 * dg) / slope, 1.0, 1e-7);
      ck_assert_double_eq_tol (pls_fluid_shear_rate (&f, tau) / g, 1.0, 1e-12);
    }
  ck_assert_double_eq (pls_fluid_shear_rate (&f, 0.0), 0.0);
}
END_TEST

START_TEST (test_carreau_form)
{
  /* The Carreau rewrite of every law gives the same viscosity. */
  pls_fluid_params f = fluid_of (_i), c;
  double g;

  pls_fluid_carreau_form (&f, &c);
  ck_assert_int_eq (c.law, PLS_VISCOSITY_CARREAU);
  for (g = 1e-5; g < 1e6; g *= 10.0)
    ck_assert_double_eq_tol (pls_fluid_viscosity (&c, g) / pls_fluid_viscosity (&f, g),
                             1.0, 1e-14);
}
END_TEST

START_TEST (test_temperature_shift)
{
  /* Arrhenius: mu(T) = mu(Tref) exp[B (1/T - 1/Tref)].  With
   * B = ln 2 / (1/283.15 - 1/293.15) the viscosity doubles 10 K below Tref
   * and, for the same B, 10 K above it changes by exp[B (1/303.15 - 1/293.15)]
   * (derived from the law; 0.4999.. is not exactly 1/2 because 1/T is not
   * linear in T).  Every law's viscosity at every shear rate scales alike. */
  double b = log (2.0) / (1.0 / 283.15 - 1.0 / 293.15);
  int k;

  for (k = 0; k < 5; k++)
    {
      pls_fluid_params f = fluid_of (k), cold, hot, twice;
      char why[PLS_MESSAGE_MAX];

      f.activation_temperature = b;
      f.reference_temperature = 293.15;
      f.temperature = 283.15;
      ck_assert_int_eq (pls_fluid_params_check (&f, why, sizeof why), PLS_OK);
      pls_fluid_at_temperature (&f, &cold);
      f.temperature = 303.15;
      pls_fluid_at_temperature (&f, &hot);
      f.temperature = 293.15;
      for (double g = 0.01; g < 1e5; g *= 10.0)
        {
          double mu = pls_fluid_viscosity (&f, g);

          ck_assert_double_eq_tol (pls_fluid_viscosity (&cold, g) / mu, 2.0, 1e-12);
          ck_assert_double_eq_tol (pls_fluid_viscosity (&hot, g) / mu,
                                   exp (b * (1.0 / 303.15 - 1.0 / 293.15)), 1e-12);
        }
      /* The result is at its own temperature: shifting again is a no-op. */
      pls_fluid_at_temperature (&cold, &twice);
      ck_assert_double_eq (pls_fluid_viscosity (&twice, 5.0), pls_fluid_viscosity (&cold, 5.0));
      /* B = 0 switches the shift off. */
      f.activation_temperature = 0.0;
      f.temperature = 350.0;
      pls_fluid_at_temperature (&f, &hot);
      ck_assert_double_eq (pls_fluid_viscosity (&hot, 5.0), pls_fluid_viscosity (&f, 5.0));
    }
}
END_TEST

/* ---- validator ------------------------------------------------------------ */

static const struct
{
  int law;              /* fluid_of() index the row starts from */
  const char *field;
  size_t offset;
  double value;
} bad_fluid[] = {
  { 0, "density", offsetof (pls_fluid_params, density), 0.0 },
  { 0, "density", offsetof (pls_fluid_params, density), -1000.0 },
  { 0, "density", offsetof (pls_fluid_params, density), NAN },
  { 0, "density", offsetof (pls_fluid_params, density), INFINITY },
  { 0, "bulk_modulus", offsetof (pls_fluid_params, bulk_modulus), 0.0 },
  { 0, "bulk_modulus", offsetof (pls_fluid_params, bulk_modulus), NAN },
  { 0, "mu", offsetof (pls_fluid_params, mu), 0.0 },
  { 0, "mu", offsetof (pls_fluid_params, mu), -1.0 },
  { 0, "mu", offsetof (pls_fluid_params, mu), NAN },
  { 0, "mu", offsetof (pls_fluid_params, mu), INFINITY },
  { 1, "consistency", offsetof (pls_fluid_params, consistency), 0.0 },
  { 1, "consistency", offsetof (pls_fluid_params, consistency), NAN },
  { 1, "flow_index", offsetof (pls_fluid_params, flow_index), 0.0 },
  { 1, "flow_index", offsetof (pls_fluid_params, flow_index), -0.5 },
  { 1, "flow_index", offsetof (pls_fluid_params, flow_index), 2.0 },
  { 1, "flow_index", offsetof (pls_fluid_params, flow_index), NAN },
  { 1, "flow_index", offsetof (pls_fluid_params, flow_index), INFINITY },
  { 3, "mu_zero", offsetof (pls_fluid_params, mu_zero), 0.0 },
  { 3, "mu_zero", offsetof (pls_fluid_params, mu_zero), INFINITY },
  { 3, "mu_infinity", offsetof (pls_fluid_params, mu_infinity), -0.1 },
  { 3, "mu_infinity", offsetof (pls_fluid_params, mu_infinity), 60.0 },
  { 3, "mu_infinity", offsetof (pls_fluid_params, mu_infinity), NAN },
  { 3, "lambda", offsetof (pls_fluid_params, lambda), -1.0 },
  { 3, "lambda", offsetof (pls_fluid_params, lambda), NAN },
  { 3, "flow_index", offsetof (pls_fluid_params, flow_index), 0.0 },
  { 3, "flow_index", offsetof (pls_fluid_params, flow_index), NAN },
  { 0, "temperature", offsetof (pls_fluid_params, temperature), 0.0 },
  { 0, "temperature", offsetof (pls_fluid_params, temperature), -20.0 },
  { 0, "temperature", offsetof (pls_fluid_params, temperature), NAN },
  { 0, "reference_temperature", offsetof (pls_fluid_params, reference_temperature), 0.0 },
  { 0, "reference_temperature", offsetof (pls_fluid_params, reference_temperature),
    INFINITY },
  { 0, "activation_temperature", offsetof (pls_fluid_params, activation_temperature),
    -100.0 },
  { 0, "activation_temperature", offsetof (pls_fluid_params, activation_temperature), NAN },
  /* A shift beyond e^50 between 293.15 K and the reference. */
  { 0, "activation_temperature", offsetof (pls_fluid_params, activation_temperature), 1e9 },
};

START_TEST (test_fluid_validator)
{
  pls_fluid_params f = fluid_of (bad_fluid[_i].law);
  char why[PLS_MESSAGE_MAX];

  f.reference_temperature = 303.15;
  ck_assert_int_eq (pls_fluid_params_check (&f, why, sizeof why), PLS_OK);
  *(double *) ((char *) &f + bad_fluid[_i].offset) = bad_fluid[_i].value;
  ck_assert_int_eq (pls_fluid_params_check (&f, why, sizeof why), PLS_ERR_INVALID);
  ck_assert_msg (strncmp (why, bad_fluid[_i].field, strlen (bad_fluid[_i].field)) == 0
                 && why[strlen (bad_fluid[_i].field)] == ' ',
                 "message '%s' names '%s'", why, bad_fluid[_i].field);
}
END_TEST

START_TEST (test_fluid_validator_law_and_null)
{
  pls_fluid_params f;
  char why[8];

  pls_fluid_params_init (&f);
  f.law = (pls_viscosity_law) 9;
  ck_assert_int_eq (pls_fluid_params_check (&f, NULL, 0), PLS_ERR_INVALID);
  /* A short buffer is truncated, never overrun (ASan watches). */
  ck_assert_int_eq (pls_fluid_params_check (&f, why, sizeof why), PLS_ERR_INVALID);
  ck_assert_str_eq (why, "law mus");
  ck_assert_int_eq (pls_fluid_params_check (NULL, why, sizeof why), PLS_ERR_INVALID);
  /* Fields of another law are not checked: a Newtonian fluid with a junk
   * Carreau block is still valid. */
  pls_fluid_params_init (&f);
  f.mu_zero = NAN;
  f.lambda = -1.0;
  ck_assert_int_eq (pls_fluid_params_check (&f, NULL, 0), PLS_OK);
}
END_TEST

static Suite *
fluid_suite (void)
{
  Suite *s = suite_create ("fluid");
  TCase *tc = tcase_create ("laws");

  tcase_add_test (tc, test_defaults_valid);
  tcase_add_test (tc, test_power_law_values);
  tcase_add_test (tc, test_carreau_values);
  tcase_add_loop_test (tc, test_stress_slope_and_inverse, 0, 5);
  tcase_add_loop_test (tc, test_carreau_form, 0, 5);
  tcase_add_test (tc, test_temperature_shift);
  tcase_add_loop_test (tc, test_fluid_validator, 0,
                       (int) (sizeof bad_fluid / sizeof bad_fluid[0]));
  tcase_add_test (tc, test_fluid_validator_law_and_null);
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  return pl_check_run (fluid_suite ());
}
