/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-stage.c: a read-only, always fitted view of a layout at an instant.
 */
#include "config.h"

#include "pl-stage.h"

#include <math.h>

#include "pl-geometry.h"
#include "pl-viewport.h"

/* Room around the drawing (px): the labels of the outermost parts, drawn
 * at the raised text floor, reach past the drawing's bounds. */
#define STAGE_MARGIN_PX 64.0

struct _PlStage
{
  GtkWidget parent_instance;

  PlDocument *doc;
  PlResults *fast, *full;
  PlUnitPrefs units;
  PlRun run;
  double time;
  guint n_draws;
};

G_DEFINE_FINAL_TYPE (PlStage, pl_stage, GTK_TYPE_WIDGET)

static PlResults *
current (PlStage *self)
{
  guint64 rev;

  if (self->doc == NULL)
    return NULL;
  rev = pl_document_get_revision (self->doc);
  if (self->full != NULL && pl_results_get_revision (self->full) == rev)
    return self->full;
  if (self->fast != NULL && pl_results_get_revision (self->fast) == rev)
    return self->fast;
  return NULL;
}

static void
pl_stage_snapshot (GtkWidget *widget, GtkSnapshot *snapshot)
{
  PlStage *self = PL_STAGE (widget);
  int width = gtk_widget_get_width (widget), height = gtk_widget_get_height (widget);
  PlRenderOptions opts;
  PlViewport vp;
  PlRect box;
  cairo_t *cr;

  if (width <= 0 || height <= 0)
    return;
  self->n_draws++;
  cr = gtk_snapshot_append_cairo (snapshot, &GRAPHENE_RECT_INIT (0, 0, width, height));
  pl_render_options_init (&opts);
  /* Light: a projector washes out dark sheets; the legend stays for the
   * colours' meaning. */
  opts.style = PL_RENDER_STYLE_LIGHT;
  opts.show_grid = FALSE;
  opts.units = &self->units;
  opts.replay_run = self->run;
  opts.replay_time = self->time;
  /* Tags and values readable from the back of a room. */
  opts.min_text_px = 13.0;
  pl_viewport_init (&vp, width, height);
  if (self->doc != NULL && pl_geometry_document_bounds (self->doc, &box))
    pl_viewport_fit (&vp, &box, STAGE_MARGIN_PX);
  opts.viewport = &vp;
  if (self->doc != NULL)
    pl_render_document (cr, self->doc, current (self), &opts);
  else
    {
      const PlPalette *pal = pl_palette_get (opts.style);

      cairo_set_source_rgb (cr, pal->background.r, pal->background.g, pal->background.b);
      cairo_paint (cr);
    }
  cairo_destroy (cr);
}

static void
pl_stage_dispose (GObject *object)
{
  PlStage *self = PL_STAGE (object);

  g_clear_object (&self->doc);
  g_clear_pointer (&self->fast, pl_results_unref);
  g_clear_pointer (&self->full, pl_results_unref);
  G_OBJECT_CLASS (pl_stage_parent_class)->dispose (object);
}

static void
pl_stage_class_init (PlStageClass *klass)
{
  G_OBJECT_CLASS (klass)->dispose = pl_stage_dispose;
  GTK_WIDGET_CLASS (klass)->snapshot = pl_stage_snapshot;
  gtk_widget_class_set_css_name (GTK_WIDGET_CLASS (klass), "pl-stage");
  gtk_widget_class_set_accessible_role (GTK_WIDGET_CLASS (klass), GTK_ACCESSIBLE_ROLE_IMG);
}

static void
pl_stage_init (PlStage *self)
{
  pl_unit_prefs_init (&self->units, PL_UNIT_SYSTEM_SI);
  self->time = NAN;
  gtk_widget_set_hexpand (GTK_WIDGET (self), TRUE);
  gtk_widget_set_vexpand (GTK_WIDGET (self), TRUE);
}

GtkWidget *
pl_stage_new (void)
{
  return g_object_new (PL_TYPE_STAGE, NULL);
}

void
pl_stage_set_document (PlStage *self, PlDocument *doc)
{
  g_return_if_fail (PL_IS_STAGE (self));
  g_set_object (&self->doc, doc);
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

static void
replace (PlResults **slot, PlResults *results)
{
  if (results != NULL)
    pl_results_ref (results);
  g_clear_pointer (slot, pl_results_unref);
  *slot = results;
}

void
pl_stage_set_results (PlStage *self, PlResults *fast, PlResults *full)
{
  g_return_if_fail (PL_IS_STAGE (self));
  replace (&self->fast, fast);
  replace (&self->full, full);
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

void
pl_stage_set_units (PlStage *self, const PlUnitPrefs *units)
{
  g_return_if_fail (PL_IS_STAGE (self) && units != NULL);
  self->units = *units;
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

void
pl_stage_set_replay (PlStage *self, PlRun run, double time)
{
  g_return_if_fail (PL_IS_STAGE (self));
  if (self->run == run && (self->time == time || (isnan (self->time) && isnan (time))))
    return;
  self->run = run;
  self->time = time;
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

PlResults *
pl_stage_get_shown_results (PlStage *self)
{
  g_return_val_if_fail (PL_IS_STAGE (self), NULL);
  return current (self);
}

guint
pl_stage_get_n_draws (PlStage *self)
{
  g_return_val_if_fail (PL_IS_STAGE (self), 0);
  return self->n_draws;
}
