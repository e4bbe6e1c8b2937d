/* SPDX-License-Identifier: GPL-3.0-or-later */

#include "config.h"

#include "pl-label-placer.h"

#include <math.h>

/* Bucket size (mm): about a symbol with its label, so most boxes fall in
 * one to four buckets. */
#define BUCKET_MM 20.0
/* A box wider or taller than this many buckets is kept in a list of its
 * own that every question looks at (there are few, if any). */
#define BUCKET_SPAN_MAX 64

struct _PlLabelPlacer
{
  GArray *boxes;         /* PlRect: symbols and placed labels */
  GHashTable *buckets;   /* packed bucket coordinates -> GArray of guint */
  GArray *large;         /* guint: boxes in no bucket */
};

static gint64
bucket_key (gint32 bx, gint32 by)
{
  return (gint64) (((guint64) (guint32) bx << 32) | (guint32) by);
}

static gint32
bucket_of (double v)
{
  /* Any finite coordinate maps to a bucket; far ones share the edge. */
  return (gint32) CLAMP (floor (v / BUCKET_MM), -1e9, 1e9);
}

static void
bucket_range (const PlRect *r, gint32 *bx0, gint32 *by0, gint32 *bx1, gint32 *by1)
{
  *bx0 = bucket_of (r->x0);
  *by0 = bucket_of (r->y0);
  *bx1 = bucket_of (r->x1);
  *by1 = bucket_of (r->y1);
}

static gboolean
bucket_range_small (gint32 bx0, gint32 by0, gint32 bx1, gint32 by1)
{
  return (gint64) bx1 - bx0 < BUCKET_SPAN_MAX && (gint64) by1 - by0 < BUCKET_SPAN_MAX;
}

static void
free_bucket (gpointer data)
{
  g_array_unref (data);
}

static void
add_box (PlLabelPlacer *self, const PlRect *box)
{
  guint index = self->boxes->len;
  gint32 bx0, by0, bx1, by1;

  if (!(isfinite (box->x0) && isfinite (box->y0) && isfinite (box->x1)
        && isfinite (box->y1)))
    return;
  g_array_append_val (self->boxes, *box);
  bucket_range (box, &bx0, &by0, &bx1, &by1);
  if (!bucket_range_small (bx0, by0, bx1, by1))
    {
      g_array_append_val (self->large, index);
      return;
    }
  for (gint32 bx = bx0; bx <= bx1; bx++)
    for (gint32 by = by0; by <= by1; by++)
      {
        gint64 key = bucket_key (bx, by);
        GArray *bucket = g_hash_table_lookup (self->buckets, &key);

        if (bucket == NULL)
          {
            gint64 *k = g_new (gint64, 1);

            *k = key;
            bucket = g_array_new (FALSE, FALSE, sizeof (guint));
            g_hash_table_insert (self->buckets, k, bucket);
          }
        g_array_append_val (bucket, index);
      }
}

gboolean
pl_rect_overlaps (const PlRect *a, const PlRect *b)
{
  return a->x0 < b->x1 && b->x0 < a->x1 && a->y0 < b->y1 && b->y0 < a->y1;
}

PlLabelPlacer *
pl_label_placer_new (void)
{
  PlLabelPlacer *self = g_new0 (PlLabelPlacer, 1);

  self->boxes = g_array_new (FALSE, FALSE, sizeof (PlRect));
  self->buckets = g_hash_table_new_full (g_int64_hash, g_int64_equal, g_free, free_bucket);
  self->large = g_array_new (FALSE, FALSE, sizeof (guint));
  return self;
}

void
pl_label_placer_free (PlLabelPlacer *self)
{
  if (self == NULL)
    return;
  g_array_unref (self->boxes);
  g_hash_table_unref (self->buckets);
  g_array_unref (self->large);
  g_free (self);
}

void
pl_label_placer_block (PlLabelPlacer *self, const PlRect *box)
{
  g_return_if_fail (self != NULL && box != NULL);
  add_box (self, box);
}

gboolean
pl_label_placer_is_free (PlLabelPlacer *self, const PlRect *box)
{
  gint32 bx0, by0, bx1, by1;

  g_return_val_if_fail (self != NULL && box != NULL, FALSE);
  if (!(isfinite (box->x0) && isfinite (box->y0) && isfinite (box->x1)
        && isfinite (box->y1)))
    return FALSE;
  for (guint i = 0; i < self->large->len; i++)
    if (pl_rect_overlaps (box, &g_array_index (self->boxes, PlRect,
                                               g_array_index (self->large, guint, i))))
      return FALSE;
  bucket_range (box, &bx0, &by0, &bx1, &by1);
  if (!bucket_range_small (bx0, by0, bx1, by1))
    {
      /* A huge question: ask every box. */
      for (guint i = 0; i < self->boxes->len; i++)
        if (pl_rect_overlaps (box, &g_array_index (self->boxes, PlRect, i)))
          return FALSE;
      return TRUE;
    }
  for (gint32 bx = bx0; bx <= bx1; bx++)
    for (gint32 by = by0; by <= by1; by++)
      {
        gint64 key = bucket_key (bx, by);
        GArray *bucket = g_hash_table_lookup (self->buckets, &key);

        for (guint i = 0; bucket != NULL && i < bucket->len; i++)
          if (pl_rect_overlaps (box, &g_array_index (self->boxes, PlRect,
                                                     g_array_index (bucket, guint, i))))
            return FALSE;
      }
  return TRUE;
}

guint
pl_label_placer_place (PlLabelPlacer *self, const PlRect *candidates, guint n)
{
  g_return_val_if_fail (self != NULL && candidates != NULL && n > 0, 0);

  for (guint i = 0; i < n; i++)
    if (pl_label_placer_is_free (self, &candidates[i]))
      {
        add_box (self, &candidates[i]);
        return i;
      }
  add_box (self, &candidates[0]);
  return n;
}
