/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pls-result.c: read-only accessors of a steady result.  Out-of-range
 * indices and parts left out of the solve read as 0, never as NaN.
 */

#include "config.h"

#include <string.h>

#include "pls-network-private.h"

#define PLS_NODE_OK(r, i) ((r) != NULL && (i) >= 0 && (size_t) (i) < (r)->n_nodes)
#define PLS_ELEM_OK(r, i) ((r) != NULL && (i) >= 0 && (size_t) (i) < (r)->n_elements)

int
pls_steady_result_converged (const pls_steady_result *r)
{
  return r != NULL ? r->converged : 0;
}

int
pls_steady_result_iterations (const pls_steady_result *r)
{
  return r != NULL ? r->iterations : 0;
}

double
pls_steady_result_pressure_change (const pls_steady_result *r)
{
  return r != NULL ? r->pressure_change : 0.0;
}

double
pls_steady_result_flow_residual (const pls_steady_result *r)
{
  return r != NULL ? r->flow_residual : 0.0;
}

size_t
pls_steady_result_node_count (const pls_steady_result *r)
{
  return r != NULL ? r->n_nodes : 0;
}

size_t
pls_steady_result_element_count (const pls_steady_result *r)
{
  return r != NULL ? r->n_elements : 0;
}

int
pls_steady_node_solved (const pls_steady_result *r, int node)
{
  return PLS_NODE_OK (r, node) ? r->node_solved[node] : 0;
}

double
pls_steady_node_pressure (const pls_steady_result *r, int node)
{
  return PLS_NODE_OK (r, node) ? r->pressure[node] : 0.0;
}

int
pls_steady_element_solved (const pls_steady_result *r, int element)
{
  return PLS_ELEM_OK (r, element) ? r->elem_solved[element] : 0;
}

int
pls_steady_element_active (const pls_steady_result *r, int element)
{
  return PLS_ELEM_OK (r, element) ? r->elem_active[element] : 0;
}

double
pls_steady_element_flow (const pls_steady_result *r, int element)
{
  return PLS_ELEM_OK (r, element) ? r->flow[element] : 0.0;
}

/* The detail union holds the figures of the element's own kind only. */
static pls_status
pls_detail (const pls_steady_result *r, int element, pls_element_kind kind, void *out,
            size_t size)
{
  memset (out, 0, size);
  if (!PLS_ELEM_OK (r, element) || r->kind[element] != (unsigned char) kind)
    return PLS_ERR_INVALID;
  memcpy (out, &r->detail[element], size);
  return PLS_OK;
}

pls_status
pls_steady_line (const pls_steady_result *r, int element, pls_line_result *out)
{
  if (out == NULL)
    return PLS_ERR_INVALID;
  return pls_detail (r, element, PLS_ELEMENT_LINE, out, sizeof *out);
}

pls_status
pls_steady_pump (const pls_steady_result *r, int element, pls_pump_result *out)
{
  if (out == NULL)
    return PLS_ERR_INVALID;
  return pls_detail (r, element, PLS_ELEMENT_PUMP, out, sizeof *out);
}

pls_status
pls_steady_accumulator (const pls_steady_result *r, int element, pls_accumulator_result *out)
{
  if (out == NULL)
    return PLS_ERR_INVALID;
  return pls_detail (r, element, PLS_ELEMENT_ACCUMULATOR, out, sizeof *out);
}

size_t
pls_steady_finding_count (const pls_steady_result *r)
{
  return r != NULL ? r->findings.count : 0;
}

const pls_finding *
pls_steady_finding (const pls_steady_result *r, size_t index)
{
  if (r == NULL || index >= r->findings.count)
    return NULL;
  return &r->findings.items[index];
}
