/* SPDX-License-Identifier: GPL-3.0-or-later */

#include "config.h"

#include "pl-canvas.h"

#include <glib/gi18n.h>
#include <math.h>

#include "pl-command.h"
#include "pl-geometry.h"
#include "pl-palette.h"

/* Hit tolerance and the distance a press must travel before it is a drag,
 * in screen pixels (GTK's own drag threshold is 8 px on a touch screen and
 * about 3 px with a mouse; a mouse is what this tool is used with). */
#define HIT_PX 6.0
#define DRAG_THRESHOLD_PX 3.0
/* Margin around the drawing when the view is fitted to it. */
#define FIT_MARGIN_PX 40.0
/* Where a paste lands relative to the copied parts: two grid steps down
 * and to the right, so the copy is visibly apart and stays on the grid. */
#define PASTE_OFFSET_MM (4.0 * PL_GRID_SNAP_MM)

typedef enum
{
  MODE_NONE,
  MODE_PAN,
  MODE_MOVE_PENDING,   /* pressed on an item, not yet past the threshold */
  MODE_MOVE,
  MODE_RUBBER,
  MODE_WIRE,
} DragMode;

struct _PlCanvas
{
  GtkWidget parent_instance;

  PlDocument *doc;
  PlUndoStack *undo;
  gulong changed_id;

  PlResults *fast;
  PlResults *full;
  PlResults *shown;            /* borrowed from fast or full */
  gboolean shown_stale;

  PlUnitPrefs units;
  PlRenderStyle style;
  gboolean style_forced;

  PlViewport vp;
  gboolean vp_valid;
  gboolean need_fit;

  GHashTable *selection;       /* owned id strings */
  char *hover_id;
  gboolean pointer_inside;
  double pointer_x, pointer_y; /* last pointer position, widget px */

  const PlPartType *armed;

  /* The primary-button drag. */
  DragMode mode;
  double start_x, start_y;     /* widget px */
  double cur_x, cur_y;
  gboolean rubber_add;
  gboolean pressed_was_selected;
  char *pressed_id;
  PlPoint move_anchor;         /* world position of the pressed item */
  PlPoint move_applied;        /* the world shift pushed so far */
  char *wire_part;
  char *wire_port;
  GArray *highlight;           /* PlPortRef, borrowed from doc */
  GArray *pressure_ports;      /* PlPortRef, borrowed from doc */
  gboolean space_down;
  double pan_last_x, pan_last_y;
  double pinch_last_scale;

  GtkGesture *drag;
  GtkGesture *pan_drag;

  /* The in-app clipboard: a small document holding the copied parts and
   * the wires between them, and how many times it was pasted. */
  PlDocument *clip;
  guint n_pastes;

  gboolean frame_stats;
  guint tick_id;
  gint64 last_tick;
  gint64 max_interval;
  guint n_ticks;
  guint n_draws;
};

enum
{
  SIGNAL_SELECTION_CHANGED,
  SIGNAL_ARMED_CHANGED,
  SIGNAL_MESSAGE,
  N_SIGNALS
};

static guint signals[N_SIGNALS];

G_DEFINE_FINAL_TYPE (PlCanvas, pl_canvas, GTK_TYPE_WIDGET)

/* --- helpers --- */

static void
pl_canvas_message (PlCanvas *self, const char *text)
{
  g_signal_emit (self, signals[SIGNAL_MESSAGE], 0, text);
}

static PlPoint
pl_canvas_to_world (PlCanvas *self, double x, double y)
{
  PlPoint s = { x, y }, w;

  pl_viewport_screen_to_world (&self->vp, s, &w);
  return w;
}

static gboolean
pl_canvas_id_exists (PlDocument *doc, const char *id)
{
  return pl_document_find_part (doc, id) != NULL || pl_document_find_wire (doc, id) != NULL
         || pl_document_find_note (doc, id) != NULL;
}

/* The selected ids in document order (borrowed from the document). */
static GPtrArray *
pl_canvas_selection_in_order (PlCanvas *self, gboolean parts_only)
{
  GPtrArray *ids = g_ptr_array_new ();
  guint n;

  if (self->doc == NULL)
    return ids;
  n = pl_document_get_n_parts (self->doc);
  for (guint i = 0; i < n; i++)
    {
      const char *id = pl_part_get_id (pl_document_get_part (self->doc, i));
      if (g_hash_table_contains (self->selection, id))
        g_ptr_array_add (ids, (gpointer) id);
    }
  if (parts_only)
    return ids;
  n = pl_document_get_n_wires (self->doc);
  for (guint i = 0; i < n; i++)
    {
      const char *id = pl_wire_get_id (pl_document_get_wire (self->doc, i));
      if (g_hash_table_contains (self->selection, id))
        g_ptr_array_add (ids, (gpointer) id);
    }
  n = pl_document_get_n_notes (self->doc);
  for (guint i = 0; i < n; i++)
    {
      const char *id = pl_note_get_id (pl_document_get_note (self->doc, i));
      if (g_hash_table_contains (self->selection, id))
        g_ptr_array_add (ids, (gpointer) id);
    }
  return ids;
}

static void
pl_canvas_selection_changed (PlCanvas *self)
{
  gtk_widget_queue_draw (GTK_WIDGET (self));
  g_signal_emit (self, signals[SIGNAL_SELECTION_CHANGED], 0);
}

static void
pl_canvas_select_only (PlCanvas *self, const char *id)
{
  g_hash_table_remove_all (self->selection);
  if (id != NULL)
    g_hash_table_add (self->selection, g_strdup (id));
  pl_canvas_selection_changed (self);
}

/* Ports whose pressure is labelled: the renderer's key ports (pump
 * outlets, applicator inlets) and each port of the selected parts. */
static void
pl_canvas_update_pressure_ports (PlCanvas *self)
{
  g_clear_pointer (&self->pressure_ports, g_array_unref);
  if (self->doc == NULL)
    {
      self->pressure_ports = g_array_new (FALSE, FALSE, sizeof (PlPortRef));
      return;
    }
  self->pressure_ports = pl_render_key_ports (self->doc,
                                              self->shown_stale ? NULL : self->shown,
                                              self->selection);
}

/* Ports a wire from (wire_part, wire_port) may end on: every port of every
 * other part. */
static void
pl_canvas_update_highlight (PlCanvas *self)
{
  guint n;

  g_array_set_size (self->highlight, 0);
  if (self->doc == NULL || self->mode != MODE_WIRE)
    return;
  n = pl_document_get_n_parts (self->doc);
  for (guint i = 0; i < n; i++)
    {
      const PlPart *part = pl_document_get_part (self->doc, i);
      const PlPartType *type = pl_part_get_part_type (part);

      if (g_strcmp0 (pl_part_get_id (part), self->wire_part) == 0)
        continue;
      for (guint k = 0; k < type->n_ports; k++)
        {
          PlPortRef ref = { pl_part_get_id (part), type->ports[k].key };
          g_array_append_val (self->highlight, ref);
        }
    }
}

static void
pl_canvas_pick_results (PlCanvas *self)
{
  guint64 rev = self->doc != NULL ? pl_document_get_revision (self->doc) : 0;

  if (self->full != NULL && pl_results_get_revision (self->full) == rev)
    self->shown = self->full;
  else
    self->shown = self->fast != NULL ? self->fast : self->full;
  self->shown_stale = self->shown != NULL && pl_results_get_revision (self->shown) != rev;
}

static gboolean
pl_canvas_tick_cb (GtkWidget     *widget,
                   GdkFrameClock *clock,
                   gpointer       user_data)
{
  PlCanvas *self = PL_CANVAS (widget);
  gint64 now = g_get_monotonic_time ();

  if (self->last_tick != 0 && now - self->last_tick > self->max_interval)
    self->max_interval = now - self->last_tick;
  self->last_tick = now;
  self->n_ticks++;
  return G_SOURCE_CONTINUE;
}

static void
pl_canvas_drag_started (PlCanvas *self)
{
  if (self->frame_stats && self->tick_id == 0)
    {
      self->last_tick = 0;
      self->tick_id = gtk_widget_add_tick_callback (GTK_WIDGET (self), pl_canvas_tick_cb,
                                                    NULL, NULL);
    }
}

static void
pl_canvas_drag_stopped (PlCanvas *self)
{
  if (self->tick_id != 0)
    {
      gtk_widget_remove_tick_callback (GTK_WIDGET (self), self->tick_id);
      self->tick_id = 0;
    }
  self->mode = MODE_NONE;
  g_clear_pointer (&self->wire_part, g_free);
  g_clear_pointer (&self->wire_port, g_free);
  g_clear_pointer (&self->pressed_id, g_free);
  g_array_set_size (self->highlight, 0);
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

static void
pl_canvas_update_cursor (PlCanvas *self)
{
  const char *name = NULL;

  if (self->mode == MODE_PAN)
    name = "grabbing";
  else if (self->space_down)
    name = "grab";
  else if (self->armed != NULL || self->mode == MODE_WIRE)
    name = "crosshair";
  else if (self->mode == MODE_MOVE)
    name = "move";
  gtk_widget_set_cursor_from_name (GTK_WIDGET (self), name);
}

static void
pl_canvas_set_hover (PlCanvas *self, const char *id)
{
  if (g_strcmp0 (id, self->hover_id) == 0)
    return;
  g_free (self->hover_id);
  self->hover_id = g_strdup (id);
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

static void
pl_canvas_update_hover (PlCanvas *self)
{
  PlPoint w;
  double tol;
  const PlPart *part = NULL;
  const PlWire *wire;

  if (self->doc == NULL || !self->pointer_inside || !self->vp_valid)
    {
      pl_canvas_set_hover (self, NULL);
      return;
    }
  w = pl_canvas_to_world (self, self->pointer_x, self->pointer_y);
  tol = pl_viewport_world_tolerance (&self->vp, HIT_PX);
  if (pl_geometry_port_at (self->doc, w, tol, &part, NULL)
      || (part = pl_geometry_part_at (self->doc, w, tol)) != NULL)
    {
      pl_canvas_set_hover (self, pl_part_get_id (part));
      return;
    }
  wire = pl_geometry_wire_at (self->doc, w, tol);
  pl_canvas_set_hover (self, wire != NULL ? pl_wire_get_id (wire) : NULL);
}

/* The sheet follows the theme the widget is actually drawn with, whatever
 * says so (the dark preference, a theme name, GTK_THEME=Adwaita:dark, a
 * high-contrast inverse theme): light text means a dark background.  The
 * colour is the canvas's own CSS colour; luma by Rec. 709 weights. */
static PlRenderStyle
pl_canvas_theme_style (PlCanvas *self)
{
  GdkRGBA fg;
  double luma;

  if (self->style_forced)
    return self->style;
  /* gtk_widget_get_color () would do, but it came with GTK 4.10. */
  gtk_style_context_get_color (gtk_widget_get_style_context (GTK_WIDGET (self)), &fg);
  luma = 0.2126 * fg.red + 0.7152 * fg.green + 0.0722 * fg.blue;
  return luma > 0.5 ? PL_RENDER_STYLE_DARK : PL_RENDER_STYLE_LIGHT;
}

static void
pl_canvas_theme_changed_cb (GtkSettings *settings,
                            GParamSpec  *pspec,
                            gpointer     user_data)
{
  PlCanvas *self = PL_CANVAS (user_data);

  self->style = pl_canvas_theme_style (self);
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

/* --- document --- */

static void
pl_canvas_document_changed_cb (PlDocument *doc,
                               guint       change,
                               gpointer    user_data)
{
  PlCanvas *self = PL_CANVAS (user_data);
  GHashTableIter iter;
  gpointer key;
  gboolean pruned = FALSE;

  /* Undo may take away a selected item. */
  g_hash_table_iter_init (&iter, self->selection);
  while (g_hash_table_iter_next (&iter, &key, NULL))
    if (!pl_canvas_id_exists (doc, key))
      {
        g_hash_table_iter_remove (&iter);
        pruned = TRUE;
      }
  if (self->hover_id != NULL && !pl_canvas_id_exists (doc, self->hover_id))
    g_clear_pointer (&self->hover_id, g_free);
  /* The port references borrow the document's strings, which a change may
   * free: rebuild them. */
  pl_canvas_pick_results (self);
  pl_canvas_update_pressure_ports (self);
  pl_canvas_update_highlight (self);
  gtk_widget_queue_draw (GTK_WIDGET (self));
  if (pruned)
    g_signal_emit (self, signals[SIGNAL_SELECTION_CHANGED], 0);
}

/* --- gestures --- */

static void
pl_canvas_drag_begin_cb (GtkGestureDrag *gesture,
                         double          x,
                         double          y,
                         gpointer        user_data)
{
  PlCanvas *self = PL_CANVAS (user_data);
  GdkModifierType mods;

  mods = gtk_event_controller_get_current_event_state (GTK_EVENT_CONTROLLER (gesture));
  gtk_widget_grab_focus (GTK_WIDGET (self));
  pl_canvas_pointer_press (self, x, y, mods);
}

static void
pl_canvas_drag_update_cb (GtkGestureDrag *gesture,
                          double          dx,
                          double          dy,
                          gpointer        user_data)
{
  PlCanvas *self = PL_CANVAS (user_data);
  double x, y;

  if (!gtk_gesture_drag_get_start_point (gesture, &x, &y))
    return;
  pl_canvas_pointer_motion (self, x + dx, y + dy);
}

static void
pl_canvas_drag_end_cb (GtkGestureDrag *gesture,
                       double          dx,
                       double          dy,
                       gpointer        user_data)
{
  PlCanvas *self = PL_CANVAS (user_data);
  double x, y;

  if (!gtk_gesture_drag_get_start_point (gesture, &x, &y))
    return;
  pl_canvas_pointer_release (self, x + dx, y + dy);
}

static void
pl_canvas_pan_begin_cb (GtkGestureDrag *gesture,
                        double          x,
                        double          y,
                        gpointer        user_data)
{
  PlCanvas *self = PL_CANVAS (user_data);

  self->pan_last_x = 0;
  self->pan_last_y = 0;
  gtk_widget_set_cursor_from_name (GTK_WIDGET (self), "grabbing");
}

static void
pl_canvas_pan_update_cb (GtkGestureDrag *gesture,
                         double          dx,
                         double          dy,
                         gpointer        user_data)
{
  PlCanvas *self = PL_CANVAS (user_data);

  pl_viewport_pan (&self->vp, dx - self->pan_last_x, dy - self->pan_last_y);
  self->pan_last_x = dx;
  self->pan_last_y = dy;
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

static void
pl_canvas_pan_end_cb (GtkGestureDrag *gesture,
                      double          dx,
                      double          dy,
                      gpointer        user_data)
{
  pl_canvas_update_cursor (PL_CANVAS (user_data));
}

static gboolean
pl_canvas_scroll_cb (GtkEventControllerScroll *controller,
                     double                    dx,
                     double                    dy,
                     gpointer                  user_data)
{
  PlCanvas *self = PL_CANVAS (user_data);
  GdkModifierType mods;
  gboolean wheel;

  mods = gtk_event_controller_get_current_event_state (GTK_EVENT_CONTROLLER (controller));
  wheel = gtk_event_controller_scroll_get_unit (controller) == GDK_SCROLL_UNIT_WHEEL;
  if (mods & GDK_CONTROL_MASK)
    {
      /* A wheel notch zooms by 10 %; a touchpad reports pixels, and 100 px
       * of finger travel is one factor of e (smooth and symmetric). */
      double factor = wheel ? pow (1.1, -dy) : exp (-dy / 100.0);
      pl_canvas_zoom_at (self, factor, self->pointer_x, self->pointer_y);
      return TRUE;
    }
  if (mods & GDK_SHIFT_MASK)
    {
      double t = dx;
      dx = dy;
      dy = t;
    }
  /* A wheel notch pans 40 px, about two grid lines at 100 %. */
  if (wheel)
    pl_viewport_pan (&self->vp, -40.0 * dx, -40.0 * dy);
  else
    pl_viewport_pan (&self->vp, -dx, -dy);
  gtk_widget_queue_draw (GTK_WIDGET (self));
  return TRUE;
}

static void
pl_canvas_pinch_begin_cb (GtkGesture       *gesture,
                          GdkEventSequence *sequence,
                          gpointer          user_data)
{
  PL_CANVAS (user_data)->pinch_last_scale = 1.0;
}

static void
pl_canvas_pinch_cb (GtkGestureZoom *gesture,
                    double          scale,
                    gpointer        user_data)
{
  PlCanvas *self = PL_CANVAS (user_data);
  double cx, cy;

  if (scale <= 0 || self->pinch_last_scale <= 0)
    return;
  /* The centre of the touch points; a gesture with no points in hand
   * (driven by its signals alone, as in tests) has no last event to ask
   * about, which GTK would report as a critical: the middle then. */
  if (!gtk_gesture_is_active (GTK_GESTURE (gesture))
      || !gtk_gesture_get_bounding_box_center (GTK_GESTURE (gesture), &cx, &cy))
    {
      cx = self->vp.width / 2;
      cy = self->vp.height / 2;
    }
  pl_canvas_zoom_at (self, scale / self->pinch_last_scale, cx, cy);
  self->pinch_last_scale = scale;
}

static void
pl_canvas_motion_cb (GtkEventControllerMotion *controller,
                     double                    x,
                     double                    y,
                     gpointer                  user_data)
{
  PlCanvas *self = PL_CANVAS (user_data);

  self->pointer_x = x;
  self->pointer_y = y;
  if (!self->pointer_inside)
    {
      self->pointer_inside = TRUE;
      gtk_widget_queue_draw (GTK_WIDGET (self));
    }
  pl_canvas_update_hover (self);
  if (self->armed != NULL)
    gtk_widget_queue_draw (GTK_WIDGET (self));
}

static void
pl_canvas_leave_cb (GtkEventControllerMotion *controller,
                    gpointer                  user_data)
{
  PlCanvas *self = PL_CANVAS (user_data);

  self->pointer_inside = FALSE;
  pl_canvas_set_hover (self, NULL);
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

static gboolean
pl_canvas_key_pressed_cb (GtkEventControllerKey *controller,
                          guint                  keyval,
                          guint                  keycode,
                          GdkModifierType        state,
                          gpointer               user_data)
{
  PlCanvas *self = PL_CANVAS (user_data);

  if (keyval == GDK_KEY_space)
    {
      self->space_down = TRUE;
      pl_canvas_update_cursor (self);
      return TRUE;
    }
  return FALSE;
}

static void
pl_canvas_key_released_cb (GtkEventControllerKey *controller,
                           guint                  keyval,
                           guint                  keycode,
                           GdkModifierType        state,
                           gpointer               user_data)
{
  PlCanvas *self = PL_CANVAS (user_data);

  if (keyval == GDK_KEY_space)
    {
      self->space_down = FALSE;
      pl_canvas_update_cursor (self);
    }
}

static gboolean
pl_canvas_drop_cb (GtkDropTarget *target,
                   const GValue  *value,
                   double         x,
                   double         y,
                   gpointer       user_data)
{
  PlCanvas *self = PL_CANVAS (user_data);
  g_autofree char *id = NULL;

  if (!G_VALUE_HOLDS_STRING (value) || self->doc == NULL)
    return FALSE;
  id = pl_canvas_place_part (self, g_value_get_string (value),
                             pl_canvas_to_world (self, x, y));
  return id != NULL;
}

/* --- GtkWidget --- */

static void
pl_canvas_size_allocate (GtkWidget *widget,
                         int        width,
                         int        height,
                         int        baseline)
{
  PlCanvas *self = PL_CANVAS (widget);

  if (!self->vp_valid)
    {
      pl_viewport_init (&self->vp, width, height);
      self->vp_valid = TRUE;
    }
  else
    pl_viewport_set_size (&self->vp, width, height);
  if (self->need_fit && width > 0 && height > 0)
    {
      self->need_fit = FALSE;
      pl_canvas_zoom_fit (self);
    }
}

static void
pl_canvas_draw_overlay (PlCanvas *self, cairo_t *cr, const PlPalette *pal)
{
  if (self->mode == MODE_RUBBER)
    {
      double x0 = MIN (self->start_x, self->cur_x), y0 = MIN (self->start_y, self->cur_y);
      double w = fabs (self->cur_x - self->start_x), h = fabs (self->cur_y - self->start_y);

      cairo_rectangle (cr, x0 + 0.5, y0 + 0.5, w, h);
      cairo_set_source_rgba (cr, pal->selection.r, pal->selection.g, pal->selection.b, 0.12);
      cairo_fill_preserve (cr);
      cairo_set_source_rgba (cr, pal->selection.r, pal->selection.g, pal->selection.b, 0.9);
      cairo_set_line_width (cr, 1.0);
      cairo_stroke (cr);
    }
  else if (self->mode == MODE_WIRE && self->doc != NULL)
    {
      const PlPart *from = pl_document_find_part (self->doc, self->wire_part);
      PlPoint a, b = pl_canvas_to_world (self, self->cur_x, self->cur_y);
      PlSide side_a, side_b;
      const PlPart *to = NULL;
      const char *to_port = NULL;
      g_autoptr (GArray) route = g_array_new (FALSE, FALSE, sizeof (PlPoint));

      if (from == NULL || !pl_part_get_port_position (from, self->wire_port, &a))
        return;
      side_a = pl_part_get_port_side (from, self->wire_port);
      if (pl_geometry_port_at (self->doc, b, pl_viewport_world_tolerance (&self->vp, HIT_PX),
                               &to, &to_port)
          && to != from)
        {
          pl_part_get_port_position (to, to_port, &b);
          side_b = pl_part_get_port_side (to, to_port);
        }
      else if (fabs (b.x - a.x) >= fabs (b.y - a.y))
        side_b = b.x >= a.x ? PL_SIDE_WEST : PL_SIDE_EAST;
      else
        side_b = b.y >= a.y ? PL_SIDE_NORTH : PL_SIDE_SOUTH;
      pl_geometry_route (a, side_a, b, side_b, NULL, 0, route);
      for (guint i = 0; i < route->len; i++)
        {
          PlPoint s;
          pl_viewport_world_to_screen (&self->vp, g_array_index (route, PlPoint, i), &s);
          if (i == 0)
            cairo_move_to (cr, s.x, s.y);
          else
            cairo_line_to (cr, s.x, s.y);
        }
      cairo_set_source_rgb (cr, pal->port_highlight.r, pal->port_highlight.g,
                            pal->port_highlight.b);
      cairo_set_line_width (cr, 2.0);
      cairo_set_dash (cr, (double[]){ 6.0, 4.0 }, 2, 0);
      cairo_stroke (cr);
      cairo_set_dash (cr, NULL, 0, 0);
    }
  else if (self->armed != NULL && self->pointer_inside && self->mode == MODE_NONE)
    {
      /* A faint preview of the armed part where a click would put it. */
      PlPoint w = pl_canvas_to_world (self, self->pointer_x, self->pointer_y), snapped, s;
      double scale = pl_viewport_get_scale (&self->vp);
      double size = 2.0 * MAX (self->armed->half_width, self->armed->half_height) * scale;

      pl_geometry_snap (w, PL_GRID_SNAP_MM, &snapped);
      pl_viewport_world_to_screen (&self->vp, snapped, &s);
      cairo_save (cr);
      cairo_translate (cr, s.x - size / 2, s.y - size / 2);
      cairo_push_group (cr);
      pl_render_type_icon (cr, self->armed, size, self->style);
      cairo_pop_group_to_source (cr);
      cairo_paint_with_alpha (cr, 0.45);
      cairo_restore (cr);
    }
}

static void
pl_canvas_snapshot (GtkWidget   *widget,
                    GtkSnapshot *snapshot)
{
  PlCanvas *self = PL_CANVAS (widget);
  int width = gtk_widget_get_width (widget);
  int height = gtk_widget_get_height (widget);
  const PlPalette *pal;
  PlRenderOptions opts;
  cairo_t *cr;

  if (width <= 0 || height <= 0)
    return;
  /* A theme change restyles the widget and redraws it: read it here. */
  self->style = pl_canvas_theme_style (self);
  pal = pl_palette_get (self->style);
  self->n_draws++;
  cr = gtk_snapshot_append_cairo (snapshot, &GRAPHENE_RECT_INIT (0, 0, width, height));
  if (self->doc == NULL || !self->vp_valid)
    {
      cairo_set_source_rgb (cr, pal->background.r, pal->background.g, pal->background.b);
      cairo_paint (cr);
      cairo_destroy (cr);
      return;
    }
  pl_render_options_init (&opts);
  opts.viewport = &self->vp;
  opts.style = self->style;
  opts.units = &self->units;
  opts.show_ports = self->pointer_inside || self->mode == MODE_WIRE || self->armed != NULL;
  opts.selection = self->selection;
  opts.hover_id = self->hover_id;
  opts.highlight_ports = (const PlPortRef *) (void *) self->highlight->data;
  opts.n_highlight_ports = self->highlight->len;
  opts.pressure_ports = (const PlPortRef *) (void *) self->pressure_ports->data;
  opts.n_pressure_ports = self->pressure_ports->len;
  opts.results_stale = self->shown_stale;
  pl_render_document (cr, self->doc, self->shown, &opts);
  pl_canvas_draw_overlay (self, cr, pal);
  cairo_destroy (cr);
}

static void
pl_canvas_root (GtkWidget *widget)
{
  PlCanvas *self = PL_CANVAS (widget);
  GtkSettings *settings;

  GTK_WIDGET_CLASS (pl_canvas_parent_class)->root (widget);
  settings = gtk_widget_get_settings (widget);
  g_signal_connect_object (settings, "notify::gtk-application-prefer-dark-theme",
                           G_CALLBACK (pl_canvas_theme_changed_cb), self, 0);
  g_signal_connect_object (settings, "notify::gtk-theme-name",
                           G_CALLBACK (pl_canvas_theme_changed_cb), self, 0);
  self->style = pl_canvas_theme_style (self);
}

static void
pl_canvas_unroot (GtkWidget *widget)
{
  GtkSettings *settings = gtk_widget_get_settings (widget);

  g_signal_handlers_disconnect_by_func (settings, pl_canvas_theme_changed_cb, widget);
  GTK_WIDGET_CLASS (pl_canvas_parent_class)->unroot (widget);
}

static void
pl_canvas_measure (GtkWidget      *widget,
                   GtkOrientation  orientation,
                   int             for_size,
                   int            *minimum,
                   int            *natural,
                   int            *minimum_baseline,
                   int            *natural_baseline)
{
  *minimum = 120;
  *natural = 640;
}

static void
pl_canvas_dispose (GObject *object)
{
  PlCanvas *self = PL_CANVAS (object);

  pl_canvas_set_document (self, NULL, NULL);
  g_clear_object (&self->clip);
  G_OBJECT_CLASS (pl_canvas_parent_class)->dispose (object);
}

static void
pl_canvas_finalize (GObject *object)
{
  PlCanvas *self = PL_CANVAS (object);

  g_hash_table_unref (self->selection);
  g_array_unref (self->highlight);
  g_array_unref (self->pressure_ports);
  g_free (self->hover_id);
  g_free (self->wire_part);
  g_free (self->wire_port);
  g_free (self->pressed_id);
  G_OBJECT_CLASS (pl_canvas_parent_class)->finalize (object);
}

static void
pl_canvas_class_init (PlCanvasClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);

  object_class->dispose = pl_canvas_dispose;
  object_class->finalize = pl_canvas_finalize;
  widget_class->snapshot = pl_canvas_snapshot;
  widget_class->size_allocate = pl_canvas_size_allocate;
  widget_class->measure = pl_canvas_measure;
  widget_class->root = pl_canvas_root;
  widget_class->unroot = pl_canvas_unroot;

  signals[SIGNAL_SELECTION_CHANGED] =
    g_signal_new ("selection-changed", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0,
                  NULL, NULL, NULL, G_TYPE_NONE, 0);
  signals[SIGNAL_ARMED_CHANGED] =
    g_signal_new ("armed-changed", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0,
                  NULL, NULL, NULL, G_TYPE_NONE, 0);
  signals[SIGNAL_MESSAGE] =
    g_signal_new ("message", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0,
                  NULL, NULL, NULL, G_TYPE_NONE, 1, G_TYPE_STRING);

  gtk_widget_class_set_css_name (widget_class, "pl-canvas");
  gtk_widget_class_set_accessible_role (widget_class, GTK_ACCESSIBLE_ROLE_IMG);
}

static void
pl_canvas_init (PlCanvas *self)
{
  GtkWidget *widget = GTK_WIDGET (self);
  GtkEventController *controller;
  GtkDropTarget *drop;

  self->selection = g_hash_table_new_full (g_str_hash, g_str_equal, g_free, NULL);
  self->highlight = g_array_new (FALSE, FALSE, sizeof (PlPortRef));
  self->pressure_ports = g_array_new (FALSE, FALSE, sizeof (PlPortRef));
  pl_unit_prefs_init (&self->units, PL_UNIT_SYSTEM_SI);
  self->style = PL_RENDER_STYLE_LIGHT;
  self->frame_stats = g_getenv ("PRESSLINE_FRAME_STATS") != NULL;

  gtk_widget_set_focusable (widget, TRUE);
  gtk_widget_set_hexpand (widget, TRUE);
  gtk_widget_set_vexpand (widget, TRUE);
  gtk_widget_set_overflow (widget, GTK_OVERFLOW_HIDDEN);
  gtk_accessible_update_property (GTK_ACCESSIBLE (self), GTK_ACCESSIBLE_PROPERTY_LABEL,
                                  _("Layout drawing"), -1);

  self->drag = gtk_gesture_drag_new ();
  gtk_gesture_single_set_button (GTK_GESTURE_SINGLE (self->drag), GDK_BUTTON_PRIMARY);
  g_signal_connect (self->drag, "drag-begin", G_CALLBACK (pl_canvas_drag_begin_cb), self);
  g_signal_connect (self->drag, "drag-update", G_CALLBACK (pl_canvas_drag_update_cb), self);
  g_signal_connect (self->drag, "drag-end", G_CALLBACK (pl_canvas_drag_end_cb), self);
  gtk_widget_add_controller (widget, GTK_EVENT_CONTROLLER (self->drag));

  self->pan_drag = gtk_gesture_drag_new ();
  gtk_gesture_single_set_button (GTK_GESTURE_SINGLE (self->pan_drag), GDK_BUTTON_MIDDLE);
  g_signal_connect (self->pan_drag, "drag-begin", G_CALLBACK (pl_canvas_pan_begin_cb), self);
  g_signal_connect (self->pan_drag, "drag-update", G_CALLBACK (pl_canvas_pan_update_cb),
                    self);
  g_signal_connect (self->pan_drag, "drag-end", G_CALLBACK (pl_canvas_pan_end_cb), self);
  gtk_widget_add_controller (widget, GTK_EVENT_CONTROLLER (self->pan_drag));

  controller = gtk_event_controller_scroll_new (GTK_EVENT_CONTROLLER_SCROLL_BOTH_AXES);
  g_signal_connect (controller, "scroll", G_CALLBACK (pl_canvas_scroll_cb), self);
  gtk_widget_add_controller (widget, controller);

  controller = GTK_EVENT_CONTROLLER (gtk_gesture_zoom_new ());
  g_signal_connect (controller, "begin", G_CALLBACK (pl_canvas_pinch_begin_cb), self);
  g_signal_connect (controller, "scale-changed", G_CALLBACK (pl_canvas_pinch_cb), self);
  gtk_widget_add_controller (widget, controller);

  controller = gtk_event_controller_motion_new ();
  g_signal_connect (controller, "motion", G_CALLBACK (pl_canvas_motion_cb), self);
  g_signal_connect (controller, "enter", G_CALLBACK (pl_canvas_motion_cb), self);
  g_signal_connect (controller, "leave", G_CALLBACK (pl_canvas_leave_cb), self);
  gtk_widget_add_controller (widget, controller);

  controller = gtk_event_controller_key_new ();
  g_signal_connect (controller, "key-pressed", G_CALLBACK (pl_canvas_key_pressed_cb), self);
  g_signal_connect (controller, "key-released", G_CALLBACK (pl_canvas_key_released_cb),
                    self);
  gtk_widget_add_controller (widget, controller);

  drop = gtk_drop_target_new (G_TYPE_STRING, GDK_ACTION_COPY);
  g_signal_connect (drop, "drop", G_CALLBACK (pl_canvas_drop_cb), self);
  gtk_widget_add_controller (widget, GTK_EVENT_CONTROLLER (drop));
}

/* --- public --- */

GtkWidget *
pl_canvas_new (void)
{
  return g_object_new (PL_TYPE_CANVAS, NULL);
}

void
pl_canvas_set_document (PlCanvas    *self,
                        PlDocument  *doc,
                        PlUndoStack *undo)
{
  g_return_if_fail (PL_IS_CANVAS (self));

  if (self->mode != MODE_NONE)
    pl_canvas_cancel (self);
  if (self->doc != NULL)
    g_clear_signal_handler (&self->changed_id, self->doc);
  g_clear_object (&self->doc);
  g_clear_object (&self->undo);
  g_clear_pointer (&self->fast, pl_results_unref);
  g_clear_pointer (&self->full, pl_results_unref);
  self->shown = NULL;
  self->shown_stale = FALSE;
  g_hash_table_remove_all (self->selection);
  g_clear_pointer (&self->hover_id, g_free);
  self->n_pastes = 0;
  if (doc != NULL)
    {
      self->doc = g_object_ref (doc);
      self->undo = undo != NULL ? g_object_ref (undo) : NULL;
      self->changed_id = g_signal_connect (doc, "changed",
                                           G_CALLBACK (pl_canvas_document_changed_cb), self);
      self->need_fit = TRUE;
      if (self->vp_valid && self->vp.width > 0 && self->vp.height > 0)
        {
          self->need_fit = FALSE;
          pl_canvas_zoom_fit (self);
        }
    }
  pl_canvas_update_pressure_ports (self);
  gtk_widget_queue_draw (GTK_WIDGET (self));
  g_signal_emit (self, signals[SIGNAL_SELECTION_CHANGED], 0);
}

PlDocument *
pl_canvas_get_document (PlCanvas *self)
{
  g_return_val_if_fail (PL_IS_CANVAS (self), NULL);
  return self->doc;
}

void
pl_canvas_set_results (PlCanvas  *self,
                       PlResults *fast,
                       PlResults *full)
{
  g_return_if_fail (PL_IS_CANVAS (self));

  if (fast != NULL)
    pl_results_ref (fast);
  if (full != NULL)
    pl_results_ref (full);
  g_clear_pointer (&self->fast, pl_results_unref);
  g_clear_pointer (&self->full, pl_results_unref);
  self->fast = fast;
  self->full = full;
  pl_canvas_pick_results (self);
  pl_canvas_update_pressure_ports (self);
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

PlResults *
pl_canvas_get_shown_results (PlCanvas *self,
                             gboolean *stale)
{
  g_return_val_if_fail (PL_IS_CANVAS (self), NULL);
  if (stale != NULL)
    *stale = self->shown_stale;
  return self->shown;
}

void
pl_canvas_set_units (PlCanvas          *self,
                     const PlUnitPrefs *prefs)
{
  g_return_if_fail (PL_IS_CANVAS (self));
  g_return_if_fail (prefs != NULL);
  self->units = *prefs;
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

void
pl_canvas_set_style (PlCanvas      *self,
                     PlRenderStyle  style)
{
  g_return_if_fail (PL_IS_CANVAS (self));
  g_return_if_fail (style < PL_N_RENDER_STYLES);
  self->style = style;
  self->style_forced = TRUE;
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

PlRenderStyle
pl_canvas_get_style (PlCanvas *self)
{
  g_return_val_if_fail (PL_IS_CANVAS (self), PL_RENDER_STYLE_LIGHT);
  return pl_canvas_theme_style (self);
}

const PlViewport *
pl_canvas_get_viewport (PlCanvas *self)
{
  g_return_val_if_fail (PL_IS_CANVAS (self), NULL);
  return &self->vp;
}

void
pl_canvas_zoom_at (PlCanvas *self,
                   double    factor,
                   double    x,
                   double    y)
{
  g_return_if_fail (PL_IS_CANVAS (self));
  if (pl_viewport_zoom_at (&self->vp, factor, x, y))
    gtk_widget_queue_draw (GTK_WIDGET (self));
}

void
pl_canvas_zoom (PlCanvas *self,
                double    factor)
{
  g_return_if_fail (PL_IS_CANVAS (self));
  pl_canvas_zoom_at (self, factor, self->vp.width / 2, self->vp.height / 2);
}

void
pl_canvas_zoom_reset (PlCanvas *self)
{
  g_return_if_fail (PL_IS_CANVAS (self));
  if (pl_viewport_set_zoom_at (&self->vp, 1.0, self->vp.width / 2, self->vp.height / 2))
    gtk_widget_queue_draw (GTK_WIDGET (self));
}

void
pl_canvas_zoom_fit (PlCanvas *self)
{
  PlRect box;

  g_return_if_fail (PL_IS_CANVAS (self));
  if (self->doc == NULL || !pl_geometry_document_bounds (self->doc, &box))
    {
      box.x0 = box.x1 = 0;
      box.y0 = box.y1 = 0;
    }
  pl_viewport_fit (&self->vp, &box, FIT_MARGIN_PX);
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

char **
pl_canvas_get_selection (PlCanvas *self)
{
  g_autoptr (GPtrArray) ids = NULL;
  GStrvBuilder *builder;
  char **out;

  g_return_val_if_fail (PL_IS_CANVAS (self), NULL);
  ids = pl_canvas_selection_in_order (self, FALSE);
  builder = g_strv_builder_new ();
  for (guint i = 0; i < ids->len; i++)
    g_strv_builder_add (builder, g_ptr_array_index (ids, i));
  out = g_strv_builder_end (builder);
  g_strv_builder_unref (builder);
  return out;
}

void
pl_canvas_select (PlCanvas          *self,
                  const char *const *ids)
{
  g_return_if_fail (PL_IS_CANVAS (self));

  g_hash_table_remove_all (self->selection);
  for (guint i = 0; ids != NULL && ids[i] != NULL; i++)
    if (self->doc != NULL && pl_canvas_id_exists (self->doc, ids[i]))
      g_hash_table_add (self->selection, g_strdup (ids[i]));
  pl_canvas_update_pressure_ports (self);
  pl_canvas_selection_changed (self);
}

void
pl_canvas_select_all (PlCanvas *self)
{
  g_return_if_fail (PL_IS_CANVAS (self));
  if (self->doc == NULL)
    return;
  for (guint i = 0; i < pl_document_get_n_parts (self->doc); i++)
    g_hash_table_add (self->selection,
                      g_strdup (pl_part_get_id (pl_document_get_part (self->doc, i))));
  for (guint i = 0; i < pl_document_get_n_wires (self->doc); i++)
    g_hash_table_add (self->selection,
                      g_strdup (pl_wire_get_id (pl_document_get_wire (self->doc, i))));
  for (guint i = 0; i < pl_document_get_n_notes (self->doc); i++)
    g_hash_table_add (self->selection,
                      g_strdup (pl_note_get_id (pl_document_get_note (self->doc, i))));
  pl_canvas_update_pressure_ports (self);
  pl_canvas_selection_changed (self);
}

/* Pushes cmd (consumed); on refusal shows the document's reason. */
static gboolean
pl_canvas_push (PlCanvas  *self,
                PlCommand *cmd)
{
  g_autoptr (PlCommand) owned = cmd;
  g_autoptr (GError) error = NULL;

  if (self->undo == NULL)
    return FALSE;
  if (!pl_undo_stack_push (self->undo, owned, &error))
    {
      pl_canvas_message (self, error->message);
      return FALSE;
    }
  return TRUE;
}

gboolean
pl_canvas_delete_selection (PlCanvas *self)
{
  g_autoptr (GPtrArray) ids = NULL;

  g_return_val_if_fail (PL_IS_CANVAS (self), FALSE);
  ids = pl_canvas_selection_in_order (self, FALSE);
  if (ids->len == 0)
    return FALSE;
  return pl_canvas_push (self, pl_command_new_remove ((const char *const *) ids->pdata,
                                                      ids->len));
}

/* Applies make (id) to every selected part as one undo step. */
static gboolean
pl_canvas_each_part (PlCanvas    *self,
                     const char  *label,
                     PlCommand *(*make) (const char *id))
{
  g_autoptr (GPtrArray) ids = NULL;
  g_autoptr (GPtrArray) cmds = NULL;

  ids = pl_canvas_selection_in_order (self, TRUE);
  if (ids->len == 0)
    {
      pl_canvas_message (self, _("Select a part first."));
      return FALSE;
    }
  cmds = g_ptr_array_new_with_free_func ((GDestroyNotify) pl_command_unref);
  for (guint i = 0; i < ids->len; i++)
    g_ptr_array_add (cmds, make (g_ptr_array_index (ids, i)));
  return pl_canvas_push (self, pl_command_new_sequence (label,
                                                        (PlCommand *const *) cmds->pdata,
                                                        cmds->len));
}

static PlCommand *
make_rotate (const char *id)
{
  return pl_command_new_rotate (id, 1);
}

gboolean
pl_canvas_rotate_selection (PlCanvas *self)
{
  g_return_val_if_fail (PL_IS_CANVAS (self), FALSE);
  return pl_canvas_each_part (self, _("Rotate"), make_rotate);
}

gboolean
pl_canvas_flip_selection (PlCanvas *self)
{
  g_return_val_if_fail (PL_IS_CANVAS (self), FALSE);
  return pl_canvas_each_part (self, _("Flip"), pl_command_new_flip);
}

/* Every value of src that differs from its type's default, as set
 * commands for the part new_id (appended to cmds). */
static void
pl_canvas_copy_values (const PlPart *src, const char *new_id, GPtrArray *cmds)
{
  const PlPartType *type = pl_part_get_part_type (src);

  for (guint k = 0; k < type->n_params; k++)
    {
      const PlValue *value = pl_part_get_nth_value (src, k);
      PlValue def;
      gboolean same;

      pl_param_spec_default_value (&type->params[k], &def);
      same = value == NULL || pl_value_equal (value, &def);
      pl_value_clear (&def);
      if (!same)
        g_ptr_array_add (cmds, pl_command_new_set_value (new_id, type->params[k].key, value));
    }
}

gboolean
pl_canvas_copy (PlCanvas *self)
{
  g_autoptr (GPtrArray) ids = NULL;
  g_autoptr (PlDocument) clip = NULL;
  gboolean ok = TRUE;

  g_return_val_if_fail (PL_IS_CANVAS (self), FALSE);
  ids = pl_canvas_selection_in_order (self, TRUE);
  if (ids->len == 0)
    {
      pl_canvas_message (self, _("Select a part first."));
      return FALSE;
    }
  /* The copy keeps the parts' ids: pasting maps them to new ones. */
  clip = pl_document_new ();
  for (guint i = 0; i < ids->len && ok; i++)
    {
      const PlPart *part = pl_document_find_part (self->doc, g_ptr_array_index (ids, i));
      g_autoptr (GPtrArray) cmds = g_ptr_array_new_with_free_func (
        (GDestroyNotify) pl_command_unref);

      g_ptr_array_add (cmds, pl_command_new_add_part_full (
                         pl_part_get_part_type (part)->key, pl_part_get_id (part),
                         pl_part_get_tag (part), pl_part_get_x (part), pl_part_get_y (part),
                         pl_part_get_rotation (part), pl_part_get_mirrored (part)));
      pl_canvas_copy_values (part, pl_part_get_id (part), cmds);
      for (guint k = 0; k < cmds->len && ok; k++)
        ok = pl_command_apply (g_ptr_array_index (cmds, k), clip, NULL);
    }
  for (guint i = 0; i < pl_document_get_n_wires (self->doc) && ok; i++)
    {
      const PlWire *wire = pl_document_get_wire (self->doc, i);
      guint n_bends;
      const PlPoint *bends = pl_wire_get_bends (wire, &n_bends);
      g_autoptr (PlCommand) cmd = NULL;

      if (pl_document_find_part (clip, pl_wire_get_part_id (wire, 0)) == NULL
          || pl_document_find_part (clip, pl_wire_get_part_id (wire, 1)) == NULL)
        continue;
      cmd = pl_command_new_add_wire (NULL, pl_wire_get_part_id (wire, 0),
                                     pl_wire_get_port_key (wire, 0),
                                     pl_wire_get_part_id (wire, 1),
                                     pl_wire_get_port_key (wire, 1), bends, n_bends);
      ok = pl_command_apply (cmd, clip, NULL);
    }
  if (!ok)
    {
      /* Cannot happen for parts copied from a valid document; say so
       * rather than keep half a copy. */
      pl_canvas_message (self, _("The selection could not be copied."));
      return FALSE;
    }
  g_clear_object (&self->clip);
  self->clip = g_steal_pointer (&clip);
  self->n_pastes = 0;
  return TRUE;
}

gboolean
pl_canvas_can_paste (PlCanvas *self)
{
  g_return_val_if_fail (PL_IS_CANVAS (self), FALSE);
  return self->clip != NULL && self->doc != NULL && pl_document_get_n_parts (self->clip) > 0;
}

gboolean
pl_canvas_paste (PlCanvas *self)
{
  g_autoptr (GPtrArray) cmds = NULL;
  g_autoptr (GHashTable) map = NULL;   /* clip id -> new id */
  g_autoptr (GPtrArray) new_ids = NULL;
  guint next;
  double offset;
  gboolean ok;

  g_return_val_if_fail (PL_IS_CANVAS (self), FALSE);
  if (!pl_canvas_can_paste (self) || self->undo == NULL)
    {
      pl_canvas_message (self, _("Nothing to paste: copy some parts first."));
      return FALSE;
    }
  cmds = g_ptr_array_new_with_free_func ((GDestroyNotify) pl_command_unref);
  map = g_hash_table_new_full (g_str_hash, g_str_equal, NULL, g_free);
  new_ids = g_ptr_array_new ();
  /* Explicit new ids, so the values and wires can name the parts before
   * they exist; tags are left to the document (the next free ones). */
  next = pl_document_get_next_part_number (self->doc);
  offset = PASTE_OFFSET_MM * (self->n_pastes + 1);
  for (guint i = 0; i < pl_document_get_n_parts (self->clip); i++)
    {
      const PlPart *part = pl_document_get_part (self->clip, i);
      char *id = g_strdup_printf ("p%u", next + i);

      g_hash_table_insert (map, (gpointer) pl_part_get_id (part), id);
      g_ptr_array_add (new_ids, id);
      g_ptr_array_add (cmds, pl_command_new_add_part_full (
                         pl_part_get_part_type (part)->key, id, NULL,
                         pl_part_get_x (part) + offset, pl_part_get_y (part) + offset,
                         pl_part_get_rotation (part), pl_part_get_mirrored (part)));
      pl_canvas_copy_values (part, id, cmds);
    }
  for (guint i = 0; i < pl_document_get_n_wires (self->clip); i++)
    {
      const PlWire *wire = pl_document_get_wire (self->clip, i);
      guint n_bends;
      const PlPoint *bends = pl_wire_get_bends (wire, &n_bends);
      g_autofree PlPoint *shifted = g_new (PlPoint, MAX (n_bends, 1));

      for (guint k = 0; k < n_bends; k++)
        {
          shifted[k].x = bends[k].x + offset;
          shifted[k].y = bends[k].y + offset;
        }
      g_ptr_array_add (cmds, pl_command_new_add_wire (
                         NULL, g_hash_table_lookup (map, pl_wire_get_part_id (wire, 0)),
                         pl_wire_get_port_key (wire, 0),
                         g_hash_table_lookup (map, pl_wire_get_part_id (wire, 1)),
                         pl_wire_get_port_key (wire, 1), shifted, n_bends));
    }
  ok = pl_canvas_push (self, pl_command_new_sequence (_("Paste"),
                                                      (PlCommand *const *) cmds->pdata,
                                                      cmds->len));
  if (ok)
    {
      self->n_pastes++;
      g_ptr_array_add (new_ids, NULL);
      pl_canvas_select (self, (const char *const *) new_ids->pdata);
    }
  return ok;
}

char *
pl_canvas_place_part (PlCanvas   *self,
                      const char *type_key,
                      PlPoint     p)
{
  g_autoptr (PlCommand) cmd = NULL;
  g_autoptr (GError) error = NULL;
  const PlPartType *type;
  PlPoint snapped;
  char *id;

  g_return_val_if_fail (PL_IS_CANVAS (self), NULL);
  type = pl_part_type_lookup (type_key);
  if (self->undo == NULL || type == NULL || !type->placeable)
    {
      pl_canvas_message (self, _("That is not a part that can be placed."));
      return NULL;
    }
  pl_geometry_snap (p, PL_GRID_SNAP_MM, &snapped);
  cmd = pl_command_new_add_part (type->key, NULL, snapped.x, snapped.y);
  if (!pl_undo_stack_push (self->undo, cmd, &error))
    {
      pl_canvas_message (self, error->message);
      return NULL;
    }
  id = g_strdup (pl_command_get_created_id (cmd));
  pl_canvas_select_only (self, id);
  pl_canvas_update_pressure_ports (self);
  return id;
}

char *
pl_canvas_connect (PlCanvas   *self,
                   const char *part_a,
                   const char *port_a,
                   const char *part_b,
                   const char *port_b)
{
  g_autoptr (PlCommand) cmd = NULL;
  g_autoptr (GError) error = NULL;

  g_return_val_if_fail (PL_IS_CANVAS (self), NULL);
  if (self->undo == NULL)
    return NULL;
  if (g_strcmp0 (part_a, part_b) == 0)
    {
      /* The document refuses it too; this sentence says what to do. */
      pl_canvas_message (self, _("A wire must join two different parts: drop it on a port "
                                 "of another part."));
      return NULL;
    }
  cmd = pl_command_new_add_wire (NULL, part_a, port_a, part_b, port_b, NULL, 0);
  if (!pl_undo_stack_push (self->undo, cmd, &error))
    {
      pl_canvas_message (self, error->message);
      return NULL;
    }
  return g_strdup (pl_command_get_created_id (cmd));
}

void
pl_canvas_arm_type (PlCanvas   *self,
                    const char *type_key)
{
  const PlPartType *type;

  g_return_if_fail (PL_IS_CANVAS (self));
  type = type_key != NULL ? pl_part_type_lookup (type_key) : NULL;
  if (type != NULL && !type->placeable)
    type = NULL;
  if (type == self->armed)
    return;
  self->armed = type;
  pl_canvas_update_cursor (self);
  gtk_widget_queue_draw (GTK_WIDGET (self));
  g_signal_emit (self, signals[SIGNAL_ARMED_CHANGED], 0);
}

const char *
pl_canvas_get_armed_type (PlCanvas *self)
{
  g_return_val_if_fail (PL_IS_CANVAS (self), NULL);
  return self->armed != NULL ? self->armed->key : NULL;
}

gboolean
pl_canvas_cancel (PlCanvas *self)
{
  DragMode mode;

  g_return_val_if_fail (PL_IS_CANVAS (self), FALSE);
  mode = self->mode;
  if (mode == MODE_NONE)
    {
      if (self->armed == NULL)
        return FALSE;
      pl_canvas_arm_type (self, NULL);
      return TRUE;
    }
  if (mode == MODE_MOVE && self->undo != NULL)
    pl_undo_stack_abort_group (self->undo);
  pl_canvas_drag_stopped (self);
  /* The gesture would go on reporting the held button: end it (its
   * drag-end then finds no drag to finish). */
  gtk_event_controller_reset (GTK_EVENT_CONTROLLER (self->drag));
  pl_canvas_update_cursor (self);
  return TRUE;
}

void
pl_canvas_pointer_press (PlCanvas        *self,
                         double           x,
                         double           y,
                         GdkModifierType  mods)
{
  PlPoint w;
  double tol;
  const PlPart *part = NULL;
  const char *port = NULL;
  const PlWire *wire = NULL;
  const char *id = NULL;
  gboolean shift = (mods & GDK_SHIFT_MASK) != 0;

  g_return_if_fail (PL_IS_CANVAS (self));
  if (self->doc == NULL || !self->vp_valid)
    return;
  if (self->mode != MODE_NONE)
    pl_canvas_cancel (self);
  self->start_x = self->cur_x = x;
  self->start_y = self->cur_y = y;
  w = pl_canvas_to_world (self, x, y);

  if (self->space_down)
    {
      self->mode = MODE_PAN;
      self->pan_last_x = x;
      self->pan_last_y = y;
      pl_canvas_update_cursor (self);
      pl_canvas_drag_started (self);
      return;
    }
  if (self->armed != NULL)
    {
      g_autofree char *new_id = pl_canvas_place_part (self, self->armed->key, w);
      /* Shift keeps the type armed for placing several in a row. */
      if (!shift)
        pl_canvas_arm_type (self, NULL);
      return;
    }

  tol = pl_viewport_world_tolerance (&self->vp, HIT_PX);
  if (pl_geometry_port_at (self->doc, w, tol, &part, &port))
    {
      self->mode = MODE_WIRE;
      self->wire_part = g_strdup (pl_part_get_id (part));
      self->wire_port = g_strdup (port);
      pl_canvas_update_highlight (self);
      pl_canvas_update_cursor (self);
      pl_canvas_drag_started (self);
      gtk_widget_queue_draw (GTK_WIDGET (self));
      return;
    }
  part = pl_geometry_part_at (self->doc, w, tol);
  if (part != NULL)
    {
      id = pl_part_get_id (part);
      self->move_anchor.x = pl_part_get_x (part);
      self->move_anchor.y = pl_part_get_y (part);
    }
  else if ((wire = pl_geometry_wire_at (self->doc, w, tol)) != NULL)
    {
      id = pl_wire_get_id (wire);
      pl_geometry_snap (w, PL_GRID_SNAP_MM, &self->move_anchor);
    }

  if (id != NULL)
    {
      self->pressed_was_selected = g_hash_table_contains (self->selection, id);
      if (shift)
        {
          if (self->pressed_was_selected)
            g_hash_table_remove (self->selection, id);
          else
            g_hash_table_add (self->selection, g_strdup (id));
          pl_canvas_update_pressure_ports (self);
          pl_canvas_selection_changed (self);
          return;
        }
      if (!self->pressed_was_selected)
        {
          pl_canvas_select_only (self, id);
          pl_canvas_update_pressure_ports (self);
        }
      self->pressed_id = g_strdup (id);
      self->move_applied.x = self->move_applied.y = 0;
      self->mode = MODE_MOVE_PENDING;
      pl_canvas_drag_started (self);
      return;
    }

  self->mode = MODE_RUBBER;
  self->rubber_add = shift;
  if (!shift && g_hash_table_size (self->selection) > 0)
    {
      g_hash_table_remove_all (self->selection);
      pl_canvas_update_pressure_ports (self);
      pl_canvas_selection_changed (self);
    }
  pl_canvas_drag_started (self);
}

void
pl_canvas_pointer_motion (PlCanvas *self,
                          double    x,
                          double    y)
{
  double dx, dy;

  g_return_if_fail (PL_IS_CANVAS (self));
  dx = x - self->start_x;
  dy = y - self->start_y;
  switch (self->mode)
    {
    case MODE_NONE:
      return;
    case MODE_PAN:
      pl_viewport_pan (&self->vp, x - self->pan_last_x, y - self->pan_last_y);
      self->pan_last_x = x;
      self->pan_last_y = y;
      break;
    case MODE_MOVE_PENDING:
      if (hypot (dx, dy) < DRAG_THRESHOLD_PX)
        return;
      if (self->undo == NULL)
        return;
      pl_undo_stack_begin_group (self->undo, _("Move"));
      self->mode = MODE_MOVE;
      pl_canvas_update_cursor (self);
      G_GNUC_FALLTHROUGH;
    case MODE_MOVE:
      {
        double scale = pl_viewport_get_scale (&self->vp);
        PlPoint target = { self->move_anchor.x + dx / scale, self->move_anchor.y + dy / scale };
        PlPoint snapped;
        double ix, iy;

        /* Snap where the pressed part lands, so it stays on the grid. */
        pl_geometry_snap (target, PL_GRID_SNAP_MM, &snapped);
        ix = snapped.x - self->move_anchor.x - self->move_applied.x;
        iy = snapped.y - self->move_anchor.y - self->move_applied.y;
        if (ix != 0 || iy != 0)
          {
            g_autoptr (GPtrArray) ids = pl_canvas_selection_in_order (self, FALSE);
            if (ids->len > 0
                && pl_canvas_push (self, pl_command_new_move ((const char *const *) ids->pdata,
                                                              ids->len, ix, iy)))
              {
                self->move_applied.x += ix;
                self->move_applied.y += iy;
              }
          }
      }
      break;
    case MODE_RUBBER:
    case MODE_WIRE:
    default:
      break;
    }
  self->cur_x = x;
  self->cur_y = y;
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

void
pl_canvas_pointer_release (PlCanvas *self,
                           double    x,
                           double    y)
{
  g_return_if_fail (PL_IS_CANVAS (self));

  if (self->mode == MODE_NONE)
    return;
  pl_canvas_pointer_motion (self, x, y);
  switch (self->mode)
    {
    case MODE_MOVE_PENDING:
      /* A click on one of several selected items selects it alone. */
      if (self->pressed_was_selected && g_hash_table_size (self->selection) > 1)
        {
          pl_canvas_select_only (self, self->pressed_id);
          pl_canvas_update_pressure_ports (self);
        }
      break;
    case MODE_MOVE:
      if (self->undo != NULL)
        pl_undo_stack_end_group (self->undo);
      break;
    case MODE_RUBBER:
      if (hypot (x - self->start_x, y - self->start_y) >= DRAG_THRESHOLD_PX)
        {
          PlRect rect;
          g_autoptr (GPtrArray) ids = g_ptr_array_new ();

          pl_rect_from_corners (pl_canvas_to_world (self, self->start_x, self->start_y),
                                pl_canvas_to_world (self, x, y), &rect);
          pl_geometry_items_in_rect (self->doc, &rect, ids);
          if (!self->rubber_add)
            g_hash_table_remove_all (self->selection);
          for (guint i = 0; i < ids->len; i++)
            g_hash_table_add (self->selection, g_strdup (g_ptr_array_index (ids, i)));
          pl_canvas_update_pressure_ports (self);
          pl_canvas_selection_changed (self);
        }
      break;
    case MODE_WIRE:
      {
        PlPoint w = pl_canvas_to_world (self, x, y);
        const PlPart *part = NULL;
        const char *port = NULL;
        g_autofree char *from_part = g_strdup (self->wire_part);
        g_autofree char *from_port = g_strdup (self->wire_port);

        if (hypot (x - self->start_x, y - self->start_y) < DRAG_THRESHOLD_PX)
          {
            /* A click on a port selects its part. */
            pl_canvas_select_only (self, from_part);
            pl_canvas_update_pressure_ports (self);
          }
        else if (!pl_geometry_port_at (self->doc, w,
                                       pl_viewport_world_tolerance (&self->vp, HIT_PX),
                                       &part, &port))
          pl_canvas_message (self, _("Drop the wire on a port of another part."));
        else
          {
            g_autofree char *to_part = g_strdup (pl_part_get_id (part));
            g_autofree char *to_port = g_strdup (port);
            g_autofree char *id = NULL;

            pl_canvas_drag_stopped (self);
            id = pl_canvas_connect (self, from_part, from_port, to_part, to_port);
          }
      }
      break;
    case MODE_NONE:
    case MODE_PAN:
    default:
      break;
    }
  pl_canvas_drag_stopped (self);
  pl_canvas_update_cursor (self);
  pl_canvas_update_hover (self);
}

void
pl_canvas_reset_frame_stats (PlCanvas *self)
{
  g_return_if_fail (PL_IS_CANVAS (self));
  self->max_interval = 0;
  self->n_ticks = 0;
  self->last_tick = 0;
}

gint64
pl_canvas_get_max_frame_interval (PlCanvas *self,
                                  guint    *n_ticks)
{
  g_return_val_if_fail (PL_IS_CANVAS (self), 0);
  if (n_ticks != NULL)
    *n_ticks = self->n_ticks;
  return self->max_interval;
}

guint
pl_canvas_get_n_draws (PlCanvas *self)
{
  g_return_val_if_fail (PL_IS_CANVAS (self), 0);
  return self->n_draws;
}
