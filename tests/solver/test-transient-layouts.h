/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * test-transient-layouts.h: the dispensing layouts the time-domain tests
 * and the benchmark share.  A tank feeds a 30:1 ratio pump (18 MPa stall
 * at 6 bar of air; the ratio definition, common practice), a dump valve
 * to a drain at the pump outlet, a supply hose to the manifold head with
 * an accumulator precharged to half the stall pressure (common practice,
 * no source), then a manifold of rigid pipe with one drop hose and one
 * applicator per station.  The figures are typical, not from a datasheet.
 */
#pragma once

#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "pressline-solver.h"

#define PLS_PI_TEST 3.14159265358979323846

typedef struct
{
  pls_network *net;
  int tank, drain, n1, head;
  int pump, supply, dump, acc;
  int n_app;
  int first_app;      /* element index of the first applicator           */
  int app_stride;     /* elements between successive applicators         */
} pls_test_layout;

static inline pls_line_params
pls_test_hose (double length, double bore)
{
  pls_line_params p;

  memset (&p, 0, sizeof p);
  p.kind = PLS_LINE_HOSE;
  p.length = length;
  p.bore = bore;
  /* Volumetric expansion of a two-wire braid hose of this size, typical
   * figure from memory: about 0.3 mL per metre per 100 bar. */
  p.volumetric_expansion = 3e-14;
  return p;
}

static inline pls_line_params
pls_test_pipe (double length, double bore)
{
  pls_line_params p;

  memset (&p, 0, sizeof p);
  p.kind = PLS_LINE_PIPE;
  p.length = length;
  p.bore = bore;
  p.wall_thickness = 1.5e-3;
  p.youngs_modulus = 2.0e11;     /* steel, from memory */
  return p;
}

/* Builds the layout with n applicators.  reversed = 1 adds the nodes in
 * the opposite order (same network, other numbering). */
static inline pls_test_layout
pls_test_layout_new_full (int n, int reversed, double manifold_bore,
                          const pls_allocator *alloc, double changeover)
{
  pls_fluid_params f;
  pls_pump_params pp;
  pls_nozzle_params np;
  pls_accumulator_params ap;
  pls_valve_params dv;
  pls_line_params supply = pls_test_hose (10.0, 12.7e-3);
  pls_line_params run = pls_test_pipe (0.3, manifold_bore);
  pls_line_params drop = pls_test_hose (1.0, 6.35e-3);
  pls_test_layout l;
  int *station = NULL, *tip = NULL, i;
  char name[32];

  memset (&l, 0, sizeof l);
  pls_fluid_params_init (&f);
  memset (&pp, 0, sizeof pp);
  pp.ratio = 30.0;
  pp.displacement = 40e-6;
  pp.max_cycle_rate = 2.0;
  pp.curve_exponent = 1.0;
  pp.changeover_time = changeover;
  memset (&np, 0, sizeof np);
  np.orifice_diameter = 0.5e-3;
  np.orifice_length = 1e-3;
  np.cd_model = PLS_CD_FIXED;
  np.discharge_coefficient = 0.65;
  np.passage_resistance = 2e12;
  memset (&ap, 0, sizeof ap);
  ap.gas_volume = 0.5e-3;
  ap.precharge = 9e6;
  ap.precharge_temperature = 293.15;
  ap.gas_temperature = 293.15;
  ap.polytropic_exponent = 1.4;
  ap.neck_diameter = 0.01;
  ap.neck_length = 0.05;
  memset (&dv, 0, sizeof dv);
  dv.kind = PLS_VALVE_DUMP;
  dv.kv = 0.05;
  dv.bore = 4e-3;

  l.net = pls_network_new (&f, alloc, NULL);
  station = calloc ((size_t) n + 1, sizeof *station);
  tip = calloc ((size_t) n + 1, sizeof *tip);
  if (!reversed)
    {
      l.tank = pls_network_add_fixed_node (l.net, 0.0, 0.0, "tank", NULL);
      l.drain = pls_network_add_fixed_node (l.net, 0.0, 0.0, "drain", NULL);
      l.n1 = pls_network_add_node (l.net, 0.0, "N1", NULL);
      l.head = pls_network_add_node (l.net, 0.0, "head", NULL);
      for (i = 0; i < n; i++)
        {
          snprintf (name, sizeof name, "S%d", i + 1);
          station[i] = pls_network_add_node (l.net, 0.0, name, NULL);
          snprintf (name, sizeof name, "T%d", i + 1);
          tip[i] = pls_network_add_node (l.net, 0.0, name, NULL);
        }
    }
  else
    {
      for (i = n - 1; i >= 0; i--)
        {
          snprintf (name, sizeof name, "T%d", i + 1);
          tip[i] = pls_network_add_node (l.net, 0.0, name, NULL);
          snprintf (name, sizeof name, "S%d", i + 1);
          station[i] = pls_network_add_node (l.net, 0.0, name, NULL);
        }
      l.head = pls_network_add_node (l.net, 0.0, "head", NULL);
      l.n1 = pls_network_add_node (l.net, 0.0, "N1", NULL);
      l.drain = pls_network_add_fixed_node (l.net, 0.0, 0.0, "drain", NULL);
      l.tank = pls_network_add_fixed_node (l.net, 0.0, 0.0, "tank", NULL);
    }
  l.pump = pls_network_add_pump (l.net, l.tank, l.n1, &pp, "P1", NULL);
  l.dump = pls_network_add_valve (l.net, l.n1, l.drain, &dv, "D1", NULL);
  l.supply = pls_network_add_line (l.net, l.n1, l.head, &supply, "H1", NULL);
  l.acc = pls_network_add_accumulator (l.net, l.head, &ap, "C1", NULL);
  l.n_app = n;
  for (i = 0; i < n; i++)
    {
      int e;

      snprintf (name, sizeof name, "M%d", i + 1);
      pls_network_add_line (l.net, i == 0 ? l.head : station[i - 1], station[i], &run, name,
                            NULL);
      snprintf (name, sizeof name, "D%d", i + 1);
      pls_network_add_line (l.net, station[i], tip[i], &drop, name, NULL);
      snprintf (name, sizeof name, "A%d", i + 1);
      e = pls_network_add_nozzle (l.net, tip[i], &np, name, NULL);
      if (i == 0)
        l.first_app = e;
      else if (i == 1)
        l.app_stride = e - l.first_app;
    }
  free (station);
  free (tip);
  return l;
}

static inline pls_test_layout
pls_test_layout_new_with (int n, int reversed, double manifold_bore,
                          const pls_allocator *alloc)
{
  return pls_test_layout_new_full (n, reversed, manifold_bore, alloc, 0.0);
}

static inline pls_test_layout
pls_test_layout_new (int n, int reversed, double manifold_bore)
{
  return pls_test_layout_new_with (n, reversed, manifold_bore, NULL);
}

/* Index of the node or element with a name (-1 if none). */
static inline int
pls_test_node_named (const pls_network *net, const char *name)
{
  size_t i;

  for (i = 0; i < pls_network_node_count (net); i++)
    if (strcmp (pls_network_node_name (net, (int) i), name) == 0)
      return (int) i;
  return -1;
}

static inline int
pls_test_element_named (const pls_network *net, const char *name)
{
  size_t i;

  for (i = 0; i < pls_network_element_count (net); i++)
    if (strcmp (pls_network_element_name (net, (int) i), name) == 0)
      return (int) i;
  return -1;
}
