/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-label-placer.h: where labels go on a busy drawing.
 *
 * The renderer first marks what labels must keep clear of (the symbols it
 * draws), then asks for a place for each label in turn, offering candidate
 * boxes in the order it prefers them; the first box that overlaps neither
 * a symbol nor a label placed before wins.  A uniform grid of buckets keeps
 * each question to the few boxes nearby, so a 500-part drawing costs well
 * under a millisecond.  World units (mm); no drawing here.
 */
#pragma once

#include <glib.h>

#include "pl-viewport.h"

G_BEGIN_DECLS

typedef struct _PlLabelPlacer PlLabelPlacer;

PlLabelPlacer *pl_label_placer_new (void);
void pl_label_placer_free (PlLabelPlacer *self);

/* Something labels keep clear of. */
void pl_label_placer_block (PlLabelPlacer *self, const PlRect *box);

/* Picks the first of candidates[0..n) that overlaps nothing marked or
 * placed so far (touching edges do not count), records it as a label and
 * returns its index; when every candidate is taken the first is used and
 * n is returned.  n must be at least 1. */
guint pl_label_placer_place (PlLabelPlacer *self, const PlRect *candidates, guint n);

/* Whether box overlaps anything marked or placed so far. */
gboolean pl_label_placer_is_free (PlLabelPlacer *self, const PlRect *box);

/* Whether a and b share some area (touching edges do not count). */
gboolean pl_rect_overlaps (const PlRect *a, const PlRect *b);

G_DEFINE_AUTOPTR_CLEANUP_FUNC (PlLabelPlacer, pl_label_placer_free)

G_END_DECLS
