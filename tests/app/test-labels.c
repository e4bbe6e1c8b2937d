/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Labels on the drawing: the placer takes the first free candidate, counts
 * touching as free and says when none was; and on every sample, drawn with
 * its full results (gauge readings, dose bars) and a pressure label at
 * every applicator's inlet, at the fitted view, 100 % and 200 %, no two
 * label boxes overlap and no label box overlaps a symbol.  Plain geometry:
 * there is no published reference to compare with.
 */

#include "config.h"

#include <math.h>

#include "pl-check.h"
#include "pl-geometry.h"
#include "pl-label-placer.h"
#include "pl-layout-reader.h"
#include "pl-render.h"
#include "pl-solve-scheduler.h"
#include "pl-viewport.h"

START_TEST (test_placer_first_free)
{
  g_autoptr (PlLabelPlacer) placer = pl_label_placer_new ();
  PlRect symbol = { 0, 0, 10, 10 };
  PlRect cand[3] = {
    { 5, 5, 15, 8 },     /* on the symbol */
    { 10, 0, 20, 4 },    /* touches its edge only: free */
    { 30, 30, 40, 34 },
  };

  pl_label_placer_block (placer, &symbol);
  ck_assert_uint_eq (pl_label_placer_place (placer, cand, 3), 1);
  /* The label just placed is taken now too. */
  ck_assert (!pl_label_placer_is_free (placer, &cand[1]));
  ck_assert_uint_eq (pl_label_placer_place (placer, cand, 3), 2);
  /* Nothing free: the first is used, n says so. */
  ck_assert_uint_eq (pl_label_placer_place (placer, cand, 1), 1);
  /* Far apart boxes (other buckets, negative ones too) do not see each
   * other; a box spanning a great many buckets still sees them all. */
  {
    PlRect far = { 1000, -1000, 1010, -990 };
    PlRect huge = { -1e6, -1e6, 1e6, 1e6 };
    PlRect inside = { -500, -500, -490, -495 };

    ck_assert (pl_label_placer_is_free (placer, &far));
    ck_assert (!pl_label_placer_is_free (placer, &huge));
    pl_label_placer_block (placer, &huge);
    ck_assert (!pl_label_placer_is_free (placer, &inside));
  }
}
END_TEST

static const char *const samples[] = {
  "demo-glue-line.pline",
  "carton-sealer-starved.pline",
  "carton-sealer-retrofit.pline",
};

static const double zooms[] = { 0.0, 1.0, 2.0 };   /* 0: fitted to the view */

START_TEST (test_sample_labels_apart)
{
  g_autoptr (GError) error = NULL;
  g_autofree char *path = g_build_filename (g_getenv ("PRESSLINE_SOURCE_ROOT"), "samples",
                                            samples[_i / G_N_ELEMENTS (zooms)], NULL);
  g_autoptr (PlDocument) doc = pl_layout_read_file (path, &error);
  g_autoptr (PlResults) results = NULL;
  g_autoptr (GArray) ports = g_array_new (FALSE, FALSE, sizeof (PlPortRef));
  g_autoptr (GArray) labels = g_array_new (FALSE, FALSE, sizeof (PlRect));
  double zoom = zooms[_i % G_N_ELEMENTS (zooms)];
  cairo_surface_t *surface = cairo_image_surface_create (CAIRO_FORMAT_ARGB32, 1600, 1000);
  cairo_t *cr = cairo_create (surface);
  PlRenderOptions opts;
  PlViewport vp;
  PlRect bounds;

  ck_assert_msg (doc != NULL, "%s", error ? error->message : "");
  results = pl_solve_scheduler_solve_sync (doc, NULL, &error);
  ck_assert_msg (results != NULL, "%s", error ? error->message : "");
  for (guint i = 0; i < pl_document_get_n_parts (doc); i++)
    {
      const PlPart *part = pl_document_get_part (doc, i);

      if (pl_part_get_part_type (part)->kind == PL_PART_APPLICATOR)
        {
          PlPortRef ref = { pl_part_get_id (part), "in" };

          g_array_append_val (ports, ref);
        }
    }
  pl_viewport_init (&vp, 1600, 1000);
  ck_assert (pl_geometry_document_bounds (doc, &bounds));
  pl_viewport_fit (&vp, &bounds, 20);
  if (zoom > 0.0)
    pl_viewport_set_zoom_at (&vp, zoom, 800, 500);
  pl_render_options_init (&opts);
  opts.viewport = &vp;
  opts.pressure_ports = (const PlPortRef *) ports->data;
  opts.n_pressure_ports = ports->len;
  opts.label_boxes = labels;
  ck_assert_int_eq (pl_render_document (cr, doc, results, &opts), CAIRO_STATUS_SUCCESS);
  cairo_destroy (cr);
  cairo_surface_destroy (surface);

  /* Tag blocks and pressure labels were placed. */
  ck_assert_uint_gt (labels->len, ports->len);
  for (guint i = 0; i < labels->len; i++)
    {
      const PlRect *a = &g_array_index (labels, PlRect, i);

      for (guint j = i + 1; j < labels->len; j++)
        {
          const PlRect *b = &g_array_index (labels, PlRect, j);

          ck_assert_msg (!pl_rect_overlaps (a, b),
                         "%s at zoom %g: labels %u (%g, %g)-(%g, %g) and %u (%g, %g)-(%g, %g) "
                         "overlap", samples[_i / G_N_ELEMENTS (zooms)], vp.zoom, i, a->x0,
                         a->y0, a->x1, a->y1, j, b->x0, b->y0, b->x1, b->y1);
        }
      for (guint p = 0; p < pl_document_get_n_parts (doc); p++)
        {
          const PlPart *part = pl_document_get_part (doc, p);
          PlRect box;

          pl_geometry_part_bounds (part, &box);
          ck_assert_msg (!pl_rect_overlaps (a, &box), "%s at zoom %g: label %u covers %s",
                         samples[_i / G_N_ELEMENTS (zooms)], vp.zoom, i,
                         pl_part_get_tag (part));
        }
    }
}
END_TEST

static Suite *
labels_suite (void)
{
  Suite *s = suite_create ("labels");
  TCase *tc = tcase_create ("labels");

  tcase_set_timeout (tc, 60);
  tcase_add_test (tc, test_placer_first_free);
  tcase_add_loop_test (tc, test_sample_labels_apart, 0,
                       G_N_ELEMENTS (samples) * G_N_ELEMENTS (zooms));
  suite_add_tcase (s, tc);
  return s;
}

int
main (void)
{
  return pl_check_run (labels_suite ());
}
