/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pls-network.c: building a network of nodes and elements.  Parameters are
 * validated here, once, so the Newton loops never meet a bad value.
 */

#include "config.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

#include "pls-network-private.h"

#define PLS_WHY_MAX 160

static const char *
pls_kind_word (const pls_element *e)
{
  switch (e->kind)
    {
    case PLS_ELEMENT_LINE: return e->u.line.kind == PLS_LINE_PIPE ? "pipe" : "hose";
    case PLS_ELEMENT_FITTING: return "fitting";
    case PLS_ELEMENT_VALVE: return e->u.valve.kind == PLS_VALVE_DUMP ? "dump valve" : "valve";
    case PLS_ELEMENT_PUMP: return "pump";
    case PLS_ELEMENT_NOZZLE: return "applicator";
    case PLS_ELEMENT_ACCUMULATOR: return "accumulator";
    case PLS_ELEMENT_GAUGE: return "gauge";
    case PLS_ELEMENT_CUSTOM: return "link";
    default: return "element";
    }
}

void
pls__element_label (const pls_network *net, int element, char *buf, size_t len)
{
  const pls_element *e = &net->elements[element];
  const char *name = net->names + e->name;

  if (name[0] != '\0')
    snprintf (buf, len, "%s %s", pls_kind_word (e), name);
  else
    snprintf (buf, len, "%s %d", pls_kind_word (e), element);
}

void
pls__node_label (const pls_network *net, int node, char *buf, size_t len)
{
  const char *name = net->names + net->nodes[node].name;

  if (name[0] != '\0')
    snprintf (buf, len, "node %s", name);
  else
    snprintf (buf, len, "node %d", node);
}

/* Appends name (or "") to the pool; *offset receives its place. */
static pls_status
pls_intern (pls_network *net, const char *name, size_t *offset)
{
  size_t n = name != NULL ? strlen (name) : 0;

  if (net->names_len + n + 1 > net->names_cap)
    {
      size_t cap = net->names_cap * 2;
      char *p;

      while (cap < net->names_len + n + 1)
        cap *= 2;
      p = pls__realloc (&net->alloc, net->names, cap);
      if (p == NULL)
        return PLS_ERR_NOMEM;
      net->names = p;
      net->names_cap = cap;
    }
  *offset = net->names_len;
  if (n > 0)
    memcpy (net->names + net->names_len, name, n);
  net->names[net->names_len + n] = '\0';
  net->names_len += n + 1;
  return PLS_OK;
}

pls_network *
pls_network_new (const pls_fluid_params *fluid, const pls_allocator *alloc, pls_error *err)
{
  char why[PLS_WHY_MAX] = "";
  pls_network *net = NULL;
  pls_allocator a = { 0 };

  pls__error_clear (err);
  if (alloc != NULL)
    a = *alloc;
  if (fluid == NULL)
    {
      pls__error (err, PLS_ERR_INVALID, -1, -1, "fluid: no fluid parameters given");
      goto fail;
    }
  if (pls_fluid_params_check (fluid, why, sizeof why) != PLS_OK)
    {
      pls__error (err, PLS_ERR_INVALID, -1, -1, "fluid: %s", why);
      goto fail;
    }
  net = pls__calloc (&a, 1, sizeof *net);
  if (net == NULL)
    goto nomem;
  net->alloc = a;
  pls_fluid_at_temperature (fluid, &net->fluid);
  net->names_cap = 64;
  net->names = pls__malloc (&a, net->names_cap);
  if (net->names == NULL)
    goto nomem;
  return net;

nomem:
  pls__error (err, PLS_ERR_NOMEM, -1, -1, "out of memory creating the network");
fail:
  pls_network_free (net);
  return NULL;
}

void
pls_network_free (pls_network *net)
{
  pls_allocator a;

  if (net == NULL)
    return;
  a = net->alloc;
  pls__free (&a, net->nodes);
  pls__free (&a, net->elements);
  pls__free (&a, net->names);
  pls__free (&a, net);
}

static int
pls_add_node_common (pls_network *net, double elevation, int fixed, double pressure,
                     const char *name, pls_error *err)
{
  pls_node *nd;
  size_t off;

  pls__error_clear (err);
  if (net == NULL)
    {
      pls__error (err, PLS_ERR_INVALID, -1, -1, "no network given");
      return -1;
    }
  if (!isfinite (elevation))
    {
      pls__error (err, PLS_ERR_INVALID, -1, (int) net->n_nodes,
                  "node %s: elevation must be a finite height",
                  name != NULL ? name : "(new)");
      return -1;
    }
  if (fixed && !isfinite (pressure))
    {
      pls__error (err, PLS_ERR_INVALID, -1, (int) net->n_nodes,
                  "node %s: pressure must be a finite value",
                  name != NULL ? name : "(new)");
      return -1;
    }
  if (net->n_nodes >= (size_t) 0x7fffffff)
    {
      pls__error (err, PLS_ERR_INVALID, -1, -1, "too many nodes");
      return -1;
    }
  if (net->n_nodes == net->cap_nodes)
    {
      size_t cap = net->cap_nodes ? 2 * net->cap_nodes : 16;
      pls_node *p = pls__realloc (&net->alloc, net->nodes, cap * sizeof *p);

      if (p == NULL)
        goto nomem;
      net->nodes = p;
      net->cap_nodes = cap;
    }
  if (pls_intern (net, name, &off) != PLS_OK)
    goto nomem;
  nd = &net->nodes[net->n_nodes];
  memset (nd, 0, sizeof *nd);
  nd->elevation = elevation;
  nd->fixed = fixed;
  nd->pressure = fixed ? pressure : 0.0;
  nd->name = off;
  return (int) net->n_nodes++;

nomem:
  pls__error (err, PLS_ERR_NOMEM, -1, -1, "out of memory adding node %s",
              name != NULL ? name : "");
  return -1;
}

int
pls_network_add_node (pls_network *net, double elevation_m, const char *name, pls_error *err)
{
  return pls_add_node_common (net, elevation_m, 0, 0.0, name, err);
}

int
pls_network_add_fixed_node (pls_network *net, double elevation_m, double pressure,
                            const char *name, pls_error *err)
{
  return pls_add_node_common (net, elevation_m, 1, pressure, name, err);
}

/* Checks ports and parameters of a filled-in element e and appends it.
 * why holds the validator's sentence when status is PLS_ERR_INVALID. */
static int
pls_add_element (pls_network *net, pls_element *e, pls_status law_status, const char *why,
                 const char *name, pls_error *err)
{
  char label[96];
  int idx;
  size_t off;

  if (net == NULL)
    {
      pls__error (err, PLS_ERR_INVALID, -1, -1, "no network given");
      return -1;
    }
  idx = (int) net->n_elements;
  /* The label for messages before the element exists. */
  if (name != NULL && name[0] != '\0')
    snprintf (label, sizeof label, "%s %s", pls_kind_word (e), name);
  else
    snprintf (label, sizeof label, "%s %d", pls_kind_word (e), idx);

  if (e->a < 0 || (size_t) e->a >= net->n_nodes)
    {
      pls__error (err, PLS_ERR_INVALID, idx, -1,
                  "%s: port 1 names node %d, which does not exist", label, e->a);
      return -1;
    }
  if (e->b != -1 && (e->b < 0 || (size_t) e->b >= net->n_nodes))
    {
      pls__error (err, PLS_ERR_INVALID, idx, -1,
                  "%s: port 2 names node %d, which does not exist", label, e->b);
      return -1;
    }
  if (e->b == e->a)
    {
      pls__error (err, PLS_ERR_INVALID, idx, e->a,
                  "%s: both ends are on the same node", label);
      return -1;
    }
  if (law_status != PLS_OK)
    {
      pls__error (err, PLS_ERR_INVALID, idx, -1, "%s: %s", label, why);
      return -1;
    }
  if (net->n_elements >= (size_t) 0x7fffffff)
    {
      pls__error (err, PLS_ERR_INVALID, idx, -1, "%s: too many elements", label);
      return -1;
    }
  if (net->n_elements == net->cap_elements)
    {
      size_t cap = net->cap_elements ? 2 * net->cap_elements : 16;
      pls_element *p = pls__realloc (&net->alloc, net->elements, cap * sizeof *p);

      if (p == NULL)
        goto nomem;
      net->elements = p;
      net->cap_elements = cap;
    }
  if (pls_intern (net, name, &off) != PLS_OK)
    goto nomem;
  e->name = off;
  net->elements[net->n_elements] = *e;
  if (e->kind == PLS_ELEMENT_PUMP)
    net->n_pumps++;
  return (int) net->n_elements++;

nomem:
  pls__error (err, PLS_ERR_NOMEM, idx, -1, "%s: out of memory", label);
  return -1;
}

/* Shared front of the add functions: a NULL params pointer is bad input. */
#define PLS_NEED_PARAMS(params, kind_word)                                   \
  do                                                                         \
    {                                                                        \
      pls__error_clear (err);                                                \
      if ((params) == NULL)                                                  \
        {                                                                    \
          pls__error (err, PLS_ERR_INVALID, -1, -1, "%s %s: no parameters given", \
                      (kind_word), name != NULL ? name : "");                \
          return -1;                                                         \
        }                                                                    \
    }                                                                        \
  while (0)

int
pls_network_add_line (pls_network *net, int from, int to, const pls_line_params *params,
                      const char *name, pls_error *err)
{
  char why[PLS_WHY_MAX] = "";
  pls_element e = { 0 };
  pls_status st;

  PLS_NEED_PARAMS (params, "hose");
  e.kind = PLS_ELEMENT_LINE;
  e.a = from;
  e.b = to;
  e.u.line = *params;
  st = pls_line_params_check (params, why, sizeof why);
  return pls_add_element (net, &e, st, why, name, err);
}

int
pls_network_add_fitting (pls_network *net, int from, int to,
                         const pls_fitting_params *params, const char *name, pls_error *err)
{
  char why[PLS_WHY_MAX] = "";
  pls_element e = { 0 };
  pls_status st;

  PLS_NEED_PARAMS (params, "fitting");
  e.kind = PLS_ELEMENT_FITTING;
  e.a = from;
  e.b = to;
  e.u.fitting = *params;
  st = pls_fitting_params_check (params, why, sizeof why);
  return pls_add_element (net, &e, st, why, name, err);
}

int
pls_network_add_valve (pls_network *net, int from, int to, const pls_valve_params *params,
                       const char *name, pls_error *err)
{
  char why[PLS_WHY_MAX] = "";
  pls_element e = { 0 };
  pls_status st;

  PLS_NEED_PARAMS (params, "valve");
  e.kind = PLS_ELEMENT_VALVE;
  e.a = from;
  e.b = to;
  e.u.valve = *params;
  st = pls_valve_params_check (params, why, sizeof why);
  return pls_add_element (net, &e, st, why, name, err);
}

int
pls_network_add_pump (pls_network *net, int inlet, int outlet, const pls_pump_params *params,
                      const char *name, pls_error *err)
{
  char why[PLS_WHY_MAX] = "";
  pls_element e = { 0 };
  pls_status st;

  PLS_NEED_PARAMS (params, "pump");
  e.kind = PLS_ELEMENT_PUMP;
  e.a = inlet;
  e.b = outlet;
  e.u.pump = *params;
  st = pls_pump_params_check (params, why, sizeof why);
  return pls_add_element (net, &e, st, why, name, err);
}

int
pls_network_add_nozzle (pls_network *net, int node, const pls_nozzle_params *params,
                        const char *name, pls_error *err)
{
  char why[PLS_WHY_MAX] = "";
  pls_element e = { 0 };
  pls_status st;

  PLS_NEED_PARAMS (params, "applicator");
  e.kind = PLS_ELEMENT_NOZZLE;
  e.a = node;
  e.b = -1;
  e.u.nozzle = *params;
  st = pls_nozzle_params_check (params, why, sizeof why);
  return pls_add_element (net, &e, st, why, name, err);
}

int
pls_network_add_accumulator (pls_network *net, int node,
                             const pls_accumulator_params *params, const char *name,
                             pls_error *err)
{
  char why[PLS_WHY_MAX] = "";
  pls_element e = { 0 };
  pls_status st;

  PLS_NEED_PARAMS (params, "accumulator");
  e.kind = PLS_ELEMENT_ACCUMULATOR;
  e.a = node;
  e.b = -1;
  e.u.accumulator = *params;
  st = pls_accumulator_params_check (params, why, sizeof why);
  return pls_add_element (net, &e, st, why, name, err);
}

int
pls_network_add_gauge (pls_network *net, int node, const pls_gauge_params *params,
                       const char *name, pls_error *err)
{
  const char *why = "";
  pls_element e = { 0 };
  pls_status st = PLS_OK;

  PLS_NEED_PARAMS (params, "gauge");
  e.kind = PLS_ELEMENT_GAUGE;
  e.a = node;
  e.b = -1;
  e.u.gauge = *params;
  if (!(isfinite (params->full_scale) && params->full_scale > 0.0))
    {
      st = PLS_ERR_INVALID;
      why = "full scale must be a positive pressure";
    }
  return pls_add_element (net, &e, st, why, name, err);
}

int
pls_network_add_custom_link (pls_network *net, int from, int to, double s, double r,
                             double q0, const char *name, pls_error *err)
{
  const char *why = "";
  pls_element e = { 0 };
  pls_status st = PLS_OK;

  pls__error_clear (err);
  e.kind = PLS_ELEMENT_CUSTOM;
  e.a = from;
  e.b = to;
  e.u.custom.s = s;
  e.u.custom.r = r;
  e.u.custom.q0 = q0;
  if (!(isfinite (s) && isfinite (r) && isfinite (q0) && s >= 0.0 && r >= 0.0
        && (s > 0.0 || r > 0.0)))
    {
      st = PLS_ERR_INVALID;
      why = "coefficients must be finite, >= 0 and not both 0";
    }
  return pls_add_element (net, &e, st, why, name, err);
}

pls_status
pls_network_set_demand (pls_network *net, int node, double demand, pls_error *err)
{
  pls__error_clear (err);
  if (net == NULL)
    return pls__error (err, PLS_ERR_INVALID, -1, -1, "no network given");
  if (node < 0 || (size_t) node >= net->n_nodes)
    return pls__error (err, PLS_ERR_INVALID, -1, node, "node %d does not exist", node);
  if (net->nodes[node].fixed || !isfinite (demand))
    return pls__error (err, PLS_ERR_INVALID, -1, node,
                       "node %d: a demand needs a free node and a finite flow", node);
  net->nodes[node].demand = demand;
  return PLS_OK;
}

void
pls__element_drop (const pls_network *net, const pls_element *e, double air_pressure,
                   double q, pls_drop *out)
{
  switch (e->kind)
    {
    case PLS_ELEMENT_LINE:
      pls_line_drop (&net->fluid, &e->u.line, q, out, NULL);
      break;
    case PLS_ELEMENT_FITTING:
      pls_fitting_drop (&net->fluid, &e->u.fitting, q, out);
      break;
    case PLS_ELEMENT_VALVE:
      pls_valve_drop (&net->fluid, &e->u.valve, q, out);
      break;
    case PLS_ELEMENT_PUMP:
      pls_pump_drop (&e->u.pump, air_pressure, q, out);
      break;
    case PLS_ELEMENT_NOZZLE:
      pls_nozzle_drop (&net->fluid, &e->u.nozzle, q, out);
      break;
    case PLS_ELEMENT_CUSTOM:
      out->h = e->u.custom.s * q + e->u.custom.r * q * fabs (q);
      out->dh_dq = e->u.custom.s + 2.0 * e->u.custom.r * fabs (q);
      break;
    case PLS_ELEMENT_ACCUMULATOR:
    case PLS_ELEMENT_GAUGE:
    default:
      /* One-ports other than applicators carry no steady flow. */
      out->h = 0.0;
      out->dh_dq = 1.0;
      break;
    }
}

size_t
pls_network_node_count (const pls_network *net)
{
  return net != NULL ? net->n_nodes : 0;
}

size_t
pls_network_element_count (const pls_network *net)
{
  return net != NULL ? net->n_elements : 0;
}

const char *
pls_network_node_name (const pls_network *net, int node)
{
  if (net == NULL || node < 0 || (size_t) node >= net->n_nodes)
    return "";
  return net->names + net->nodes[node].name;
}

const char *
pls_network_element_name (const pls_network *net, int element)
{
  if (net == NULL || element < 0 || (size_t) element >= net->n_elements)
    return "";
  return net->names + net->elements[element].name;
}

pls_element_kind
pls_network_element_kind (const pls_network *net, int element)
{
  if (net == NULL || element < 0 || (size_t) element >= net->n_elements)
    return PLS_ELEMENT_CUSTOM;
  return net->elements[element].kind;
}

int
pls_network_element_node (const pls_network *net, int element, int port)
{
  if (net == NULL || element < 0 || (size_t) element >= net->n_elements)
    return -1;
  if (port == 0)
    return net->elements[element].a;
  if (port == 1)
    return net->elements[element].b;
  return -1;
}

int
pls_network_node_is_fixed (const pls_network *net, int node)
{
  if (net == NULL || node < 0 || (size_t) node >= net->n_nodes)
    return 0;
  return net->nodes[node].fixed;
}
