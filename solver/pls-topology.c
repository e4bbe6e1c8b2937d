/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pls-topology.c: which elements carry flow, which parts a pressure source
 * reaches, and what looks unfinished (open ports, unfed applicators).
 *
 * The nodal matrix of the steady solve is a weighted Laplacian with the
 * fixed-pressure nodes removed; it is positive definite only if every
 * connected part of the free nodes touches a fixed pressure (a tank, a
 * drain, or the atmosphere through an open applicator).  Parts that do not
 * are taken out here and reported, so they never reach the factorisation.
 */

#include "config.h"

#include <string.h>

#include "pls-network-private.h"

pls_status
pls__active_elements (const pls_network *net, const pls_steady_options *o,
                      unsigned char *active, pls_error *err)
{
  size_t k;

  for (k = 0; k < net->n_elements; k++)
    {
      const pls_element *e = &net->elements[k];

      switch (e->kind)
        {
        case PLS_ELEMENT_LINE:
        case PLS_ELEMENT_FITTING:
        case PLS_ELEMENT_CUSTOM:
          active[k] = 1;
          break;
        case PLS_ELEMENT_VALVE:
          if (e->u.valve.kind == PLS_VALVE_DUMP)
            active[k] = !o->air_on;   /* piloted shut while the air is on */
          else
            active[k] = e->u.valve.open != 0;
          break;
        case PLS_ELEMENT_PUMP:
          active[k] = o->air_on != 0;
          break;
        case PLS_ELEMENT_NOZZLE:
          active[k] = o->applicators == PLS_APPLICATORS_ALL;
          break;
        case PLS_ELEMENT_ACCUMULATOR:
        case PLS_ELEMENT_GAUGE:
        default:
          active[k] = 0;   /* no steady flow */
          break;
        }
    }
  if (o->applicators == PLS_APPLICATORS_LIST)
    {
      if (o->open_count > 0 && o->open_list == NULL)
        return pls__error (err, PLS_ERR_INVALID, -1, -1,
                           "options: open_count is %zu but open_list is NULL",
                           o->open_count);
      for (k = 0; k < o->open_count; k++)
        {
          int idx = o->open_list[k];

          if (idx < 0 || (size_t) idx >= net->n_elements
              || net->elements[idx].kind != PLS_ELEMENT_NOZZLE)
            return pls__error (err, PLS_ERR_INVALID, idx, -1,
                               "options: open_list[%zu] = %d is not an applicator",
                               k, idx);
          active[idx] = 1;
        }
    }
  return PLS_OK;
}

static int
pls_find (int *parent, int i)
{
  int root = i;

  while (parent[root] != root)
    root = parent[root];
  while (parent[i] != root)   /* path compression */
    {
      int next = parent[i];

      parent[i] = root;
      i = next;
    }
  return root;
}

static int
pls_is_two_port (const pls_element *e)
{
  return e->b >= 0;
}

pls_status
pls__topology (const pls_network *net, const pls_steady_options *o,
               const unsigned char *active, unsigned char *node_solved, int *comp,
               unsigned char *pumped, pls_finding_list *findings)
{
  const pls_allocator *a = &net->alloc;
  size_t n = net->n_nodes, k;
  int *parent = NULL, *first = NULL, *degree = NULL, *count = NULL;
  unsigned char *has_ref = NULL, *has_pump = NULL, *ones = NULL;
  pls_status st = PLS_ERR_NOMEM;
  char label[96], nlabel[96];

  parent = pls__malloc (a, n * sizeof *parent);
  first = pls__malloc (a, n * sizeof *first);
  degree = pls__calloc (a, n, sizeof *degree);
  count = pls__calloc (a, n, sizeof *count);
  has_ref = pls__calloc (a, n, 1);
  has_pump = pls__calloc (a, n, 1);
  ones = pls__calloc (a, n, 1);
  if (!parent || !first || !degree || !count || !has_ref || !has_pump || !ones)
    goto out;

  for (k = 0; k < n; k++)
    {
      parent[k] = (int) k;
      first[k] = -1;
    }
  /* Join free nodes through active two-ports (union by index keeps it
   * deterministic; path compression keeps it near linear). */
  for (k = 0; k < net->n_elements; k++)
    {
      const pls_element *e = &net->elements[k];

      if (!active[k] || !pls_is_two_port (e))
        continue;
      if (!net->nodes[e->a].fixed && !net->nodes[e->b].fixed)
        {
          int ra = pls_find (parent, e->a), rb = pls_find (parent, e->b);

          if (ra != rb)
            {
              if (ra < rb)
                parent[rb] = ra;
              else
                parent[ra] = rb;
            }
        }
    }
  /* Attributes per part: a pressure reference, a running pump. */
  for (k = 0; k < net->n_elements; k++)
    {
      const pls_element *e = &net->elements[k];
      int fa = net->nodes[e->a].fixed;

      if (!active[k])
        continue;
      if (pls_is_two_port (e))
        {
          int fb = net->nodes[e->b].fixed;

          if (fa && !fb)
            has_ref[pls_find (parent, e->b)] = 1;
          if (fb && !fa)
            has_ref[pls_find (parent, e->a)] = 1;
          if (e->kind == PLS_ELEMENT_PUMP)
            {
              if (!fa)
                has_pump[pls_find (parent, e->a)] = 1;
              if (!fb)
                has_pump[pls_find (parent, e->b)] = 1;
            }
        }
      else if (e->kind == PLS_ELEMENT_NOZZLE && !fa)
        has_ref[pls_find (parent, e->a)] = 1;   /* vents to the atmosphere */
    }
  for (k = 0; k < n; k++)
    {
      if (net->nodes[k].fixed)
        {
          node_solved[k] = 1;
          comp[k] = -1;
          pumped[k] = 0;
        }
      else
        {
          int r = pls_find (parent, (int) k);

          comp[k] = r;
          node_solved[k] = has_ref[r];
          pumped[k] = has_pump[r];
        }
    }

  /* Parts left out: count their elements, name the first. */
  for (k = 0; k < net->n_elements; k++)
    {
      const pls_element *e = &net->elements[k];
      int ports[2] = { e->a, e->b }, p;

      for (p = 0; p < 2; p++)
        {
          int nd = ports[p];

          if (nd < 0)
            continue;
          if (!net->nodes[nd].fixed
              && !(p == 1 && !net->nodes[e->a].fixed && comp[e->a] == comp[nd]))
            {
              int r = comp[nd];

              count[r]++;   /* once per element and part */
              /* Name a pump first: it is what makes a part "no-reference". */
              if (first[r] < 0 || (e->kind == PLS_ELEMENT_PUMP
                                   && net->elements[first[r]].kind != PLS_ELEMENT_PUMP))
                first[r] = (int) k;
            }
          if (pls_is_two_port (e))
            degree[nd]++;
          else
            ones[nd] = 1;
        }
    }
  for (k = 0; k < n; k++)
    {
      int r;

      if (net->nodes[k].fixed || comp[k] != (int) k || has_ref[k])
        continue;
      r = (int) k;
      if (first[r] >= 0)
        {
          pls__element_label (net, first[r], label, sizeof label);
          if (has_pump[r])
            st = pls__finding_add (findings, a, PLS_SEVERITY_ERROR, "no-reference",
                                   first[r], r, 0, 0,
                                   "The part with %s (%d parts in all) has a running pump "
                                   "but no tank, drain or open applicator, so its pressure "
                                   "is undetermined; it is left out of the solve.",
                                   label, count[r]);
          else
            st = pls__finding_add (findings, a, PLS_SEVERITY_WARNING, "unreached",
                                   first[r], r, 0, 0,
                                   "No pump, tank or drain reaches %s (%d parts in all); "
                                   "it is left out of the solve.", label, count[r]);
        }
      else
        {
          pls__node_label (net, r, nlabel, sizeof nlabel);
          st = pls__finding_add (findings, a, PLS_SEVERITY_WARNING, "unreached", -1, r, 0, 0,
                                 "%s is connected to nothing; it is left out of the solve.",
                                 nlabel);
          /* Capitalised sentence start for a generated label. */
          if (st == PLS_OK && findings->items[findings->count - 1].message[0] == 'n')
            findings->items[findings->count - 1].message[0] = 'N';
        }
      if (st != PLS_OK)
        goto out;
    }

  /* Open ports: one two-port and nothing else on a free node.  The solver
   * treats such an end as capped (no flow), which is rarely what was meant. */
  for (k = 0; k < net->n_elements; k++)
    {
      const pls_element *e = &net->elements[k];
      int ports[2] = { e->a, e->b }, p;

      if (!pls_is_two_port (e))
        continue;
      for (p = 0; p < 2; p++)
        {
          int nd = ports[p];

          if (net->nodes[nd].fixed || degree[nd] != 1 || ones[nd])
            continue;
          pls__element_label (net, (int) k, label, sizeof label);
          pls__node_label (net, nd, nlabel, sizeof nlabel);
          st = pls__finding_add (findings, a, PLS_SEVERITY_WARNING, "open-port", (int) k, nd,
                                 0, 0,
                                 "The %s end of %s (%s) is connected to nothing; it is "
                                 "treated as capped.",
                                 p == 0 ? "first" : "second", label, nlabel);
          if (st != PLS_OK)
            goto out;
        }
    }

  /* Applicators that no running pump can feed. */
  if (o->air_on)
    for (k = 0; k < net->n_elements; k++)
      {
        const pls_element *e = &net->elements[k];

        if (e->kind != PLS_ELEMENT_NOZZLE || net->nodes[e->a].fixed || pumped[e->a])
          continue;
        pls__element_label (net, (int) k, label, sizeof label);
        st = pls__finding_add (findings, a, PLS_SEVERITY_WARNING, "nozzle-unfed", (int) k,
                               e->a, 0, 0,
                               "No running pump feeds %s: there is no open path to it.",
                               label);
        if (st != PLS_OK)
          goto out;
      }
  st = PLS_OK;

out:
  pls__free (a, parent);
  pls__free (a, first);
  pls__free (a, degree);
  pls__free (a, count);
  pls__free (a, has_ref);
  pls__free (a, has_pump);
  pls__free (a, ones);
  return st;
}
