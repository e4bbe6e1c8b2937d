/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * bench-layout.h: the generated 500-part layout the editor benchmarks
 * share (bench-render, bench-editor), made through the document's commands.
 */
#pragma once

#include <glib.h>
#include <stdio.h>

#include "pl-command.h"
#include "pl-document.h"

#define BENCH_N_LINES 50

static gboolean
bench_apply (PlDocument *doc, PlCommand *cmd, char **created)
{
  g_autoptr (GError) error = NULL;
  gboolean ok = pl_command_apply (cmd, doc, &error);

  if (!ok)
    fprintf (stderr, "bench: %s\n", error->message);
  else if (created != NULL)
    *created = g_strdup (pl_command_get_created_id (cmd));
  pl_command_unref (cmd);
  return ok;
}

static gboolean
bench_add (PlDocument *doc, const char *type, double x, double y, guint rot, char **id)
{
  return bench_apply (doc, pl_command_new_add_part_full (type, NULL, NULL, x, y, rot, FALSE),
                      id);
}

static gboolean
bench_wire (PlDocument *doc, const char *a, const char *pa, const char *b, const char *pb)
{
  return bench_apply (doc, pl_command_new_add_wire (NULL, a, pa, b, pb, NULL, 0), NULL);
}

/* One line of ten parts at height y:
 * pump - hose - tee - hose - tee - pipe - applicator, an applicator
 * under each tee, a gauge on the first tee. */
static gboolean
bench_add_line (PlDocument *doc, double y)
{
  g_autofree char *p = NULL, *h1 = NULL, *t1 = NULL, *h2 = NULL, *t2 = NULL, *r = NULL;
  g_autofree char *n1 = NULL, *n2 = NULL, *n3 = NULL, *g = NULL;

  return bench_add (doc, "pump", 0, y, 0, &p) && bench_add (doc, "hose", 70, y, 0, &h1)
         && bench_add (doc, "tee", 140, y, 0, &t1) && bench_add (doc, "hose", 210, y, 0, &h2)
         && bench_add (doc, "tee", 280, y, 0, &t2) && bench_add (doc, "pipe", 350, y, 0, &r)
         && bench_add (doc, "applicator", 420, y + 30, 0, &n3)
         && bench_add (doc, "applicator", 140, y + 50, 0, &n1)
         && bench_add (doc, "applicator", 280, y + 50, 0, &n2)
         && bench_add (doc, "gauge", 110, y - 30, 0, &g)
         && bench_wire (doc, p, "out", h1, "a") && bench_wire (doc, h1, "b", t1, "a")
         && bench_wire (doc, t1, "branch", n1, "in") && bench_wire (doc, t1, "b", h2, "a")
         && bench_wire (doc, h2, "b", t2, "a") && bench_wire (doc, t2, "branch", n2, "in")
         && bench_wire (doc, t2, "b", r, "a") && bench_wire (doc, r, "b", n3, "in")
         && bench_wire (doc, g, "p", t1, "a");
}

/* 50 such lines, 110 mm apart: 500 parts, 450 wires.  NULL on failure. */
static PlDocument *
bench_layout_new (void)
{
  g_autoptr (PlDocument) doc = pl_document_new ();

  for (int i = 0; i < BENCH_N_LINES; i++)
    if (!bench_add_line (doc, 110.0 * i))
      return NULL;
  return g_steal_pointer (&doc);
}
