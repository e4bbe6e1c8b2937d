/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-render.c: one draw of a layout: sheet, grid, wires, parts and their
 * labels, ports, notes, selection; the overlays live in
 * pl-render-overlay.c and the symbols in pl-render-symbols.c.
 */
#include "config.h"

#include "pl-render.h"
#include "pl-render-private.h"

#include <math.h>

void
pl_render_options_init (PlRenderOptions *opts)
{
  g_return_if_fail (opts != NULL);
  *opts = (PlRenderOptions) {
    .style = PL_RENDER_STYLE_LIGHT,
    .paint_background = TRUE,
    .show_grid = TRUE,
    .show_legend = TRUE,
    .pressure_kind = PL_PRESSURE_STEADY_OPEN,
    .replay_time = NAN,
  };
}

static gboolean
key_port_place_taken (const PlPart *part, const char *key, PlResults *results,
                      GHashTable *nodes, GArray *places)
{
  PlPoint p;
  int node = -1;

  if (!pl_part_get_port_position (part, key, &p))
    return TRUE;
  if (results != NULL)
    node = pl_compiled_get_port_node (pl_results_get_compiled (results),
                                      pl_part_get_id (part), key);
  if (node >= 0 && !g_hash_table_add (nodes, GINT_TO_POINTER (node + 1)))
    return TRUE;
  for (guint i = 0; i < places->len; i++)
    {
      const PlPoint *q = &g_array_index (places, PlPoint, i);

      if (fabs (p.x - q->x) < 1e-6 && fabs (p.y - q->y) < 1e-6)
        return TRUE;
    }
  g_array_append_val (places, p);
  return FALSE;
}

GArray *
pl_render_key_ports (PlDocument *doc, PlResults *results, GHashTable *selection)
{
  GArray *ports = g_array_new (FALSE, FALSE, sizeof (PlPortRef));
  g_autoptr (GArray) places = g_array_new (FALSE, FALSE, sizeof (PlPoint));
  g_autoptr (GHashTable) nodes = g_hash_table_new (g_direct_hash, g_direct_equal);

  g_return_val_if_fail (doc != NULL, ports);
  for (guint i = 0; i < pl_document_get_n_parts (doc); i++)
    {
      const PlPart *part = pl_document_get_part (doc, i);
      const PlPartType *type = pl_part_get_part_type (part);
      gboolean selected = selection != NULL
                          && g_hash_table_contains (selection, pl_part_get_id (part));
      gboolean want = selected || type->kind == PL_PART_APPLICATOR
                      || type->kind == PL_PART_PUMP;

      if (!want || type->kind == PL_PART_GAUGE)
        continue;
      for (guint k = 0; k < type->n_ports; k++)
        if (!key_port_place_taken (part, type->ports[k].key, results, nodes, places))
          {
            PlPortRef ref = { pl_part_get_id (part), type->ports[k].key };

            g_array_append_val (ports, ref);
          }
    }
  return ports;
}

/* --- helpers shared with the other files --- */

void
pl_render_set_color (PlRenderCtx *ctx, const PlColor *c)
{
  cairo_set_source_rgba (ctx->cr, c->r, c->g, c->b, c->a);
}

void
pl_render_set_color_alpha (PlRenderCtx *ctx, const PlColor *c, double alpha)
{
  cairo_set_source_rgba (ctx->cr, c->r, c->g, c->b, c->a * alpha);
}

double
pl_render_line_width (PlRenderCtx *ctx, double mm)
{
  return MAX (mm, ctx->px);
}

double
pl_render_text_size (PlRenderCtx *ctx, double mm)
{
  double floor_px = ctx->opts->min_text_px > 0.0 ? ctx->opts->min_text_px
                                                 : PL_RENDER_MIN_TEXT_PX;

  if (ctx->opts->paper_scale > 0.0)
    return MAX (mm, PL_RENDER_PAPER_TEXT_MM / ctx->opts->paper_scale);
  if (mm * ctx->scale < PL_RENDER_HIDE_TEXT_PX && !(ctx->opts->min_text_px > 0.0))
    return 0.0;
  return MAX (mm, floor_px * ctx->px);
}

void
pl_render_layout_text (PlRenderCtx *ctx, const char *text, double size, gboolean bold,
                       double *width, double *height)
{
  PangoRectangle logical;

  pango_font_description_set_absolute_size (ctx->font, size * PANGO_SCALE);
  pango_font_description_set_weight (ctx->font, bold ? PANGO_WEIGHT_BOLD
                                                     : PANGO_WEIGHT_NORMAL);
  pango_layout_set_font_description (ctx->layout, ctx->font);
  pango_layout_set_text (ctx->layout, text, -1);
  pango_layout_get_extents (ctx->layout, NULL, &logical);
  if (width != NULL)
    *width = (double) logical.width / PANGO_SCALE;
  if (height != NULL)
    *height = (double) logical.height / PANGO_SCALE;
}

void
pl_render_show_layout (PlRenderCtx *ctx, double x, double y, const PlColor *color)
{
  pl_render_set_color (ctx, color);
  cairo_move_to (ctx->cr, x, y);
  pango_cairo_show_layout (ctx->cr, ctx->layout);
}

static char *
port_wire_key (const char *part_id, const char *port_key)
{
  return g_strconcat (part_id, "\n", port_key, NULL);
}

guint
pl_render_port_wire_count (PlRenderCtx *ctx, const char *part_id, const char *port_key)
{
  g_autofree char *key = port_wire_key (part_id, port_key);

  return GPOINTER_TO_UINT (g_hash_table_lookup (ctx->port_wires, key));
}

guint
pl_render_place_label (PlRenderCtx *ctx, const PlRect *candidates, guint n)
{
  guint k = pl_label_placer_place (ctx->placer, candidates, n);

  if (ctx->opts->label_boxes != NULL)
    g_array_append_val (ctx->opts->label_boxes, candidates[k < n ? k : 0]);
  return k;
}

static gboolean
is_selected (PlRenderCtx *ctx, const char *id)
{
  return ctx->opts->selection != NULL && g_hash_table_contains (ctx->opts->selection, id);
}

static gboolean
is_hovered (PlRenderCtx *ctx, const char *id)
{
  return ctx->opts->hover_id != NULL && g_str_equal (ctx->opts->hover_id, id);
}

/* --- grid --- */

static void
draw_grid (PlRenderCtx *ctx)
{
  PlViewport probe;
  cairo_matrix_t m;
  double minor, major, dx0, dy0, dx1, dy1;
  const PlRect *c = &ctx->clip;

  /* The spacing rule of the canvas, at the scale of this draw. */
  pl_viewport_init (&probe, 1, 1);
  probe.zoom = ctx->scale / PL_VIEWPORT_PX_PER_MM;
  pl_viewport_grid_spacing (&probe, 8.0, &minor, &major);
  /* Hairlines one device pixel wide, as whole-pixel boxes without
   * antialiasing: the same look as stroked hairlines, at a fraction of the
   * cost (stroking every line of a 50 % view took longer than all the
   * parts).  The sheet is only ever scaled and moved, never turned, so
   * world x maps to device x alone. */
  cairo_get_matrix (ctx->cr, &m);
  cairo_save (ctx->cr);
  cairo_identity_matrix (ctx->cr);
  cairo_set_antialias (ctx->cr, CAIRO_ANTIALIAS_NONE);
  cairo_clip_extents (ctx->cr, &dx0, &dy0, &dx1, &dy1);
  for (guint pass = 0; pass < 2; pass++)
    {
      double step = pass == 0 ? minor : major;

      for (double x = ceil (c->x0 / step) * step; x <= c->x1; x += step)
        if (pass == 1 || fmod (fabs (x), major) != 0.0)
          cairo_rectangle (ctx->cr, floor (m.xx * x + m.x0), dy0, 1.0, dy1 - dy0);
      for (double y = ceil (c->y0 / step) * step; y <= c->y1; y += step)
        if (pass == 1 || fmod (fabs (y), major) != 0.0)
          cairo_rectangle (ctx->cr, dx0, floor (m.yy * y + m.y0), dx1 - dx0, 1.0);
      pl_render_set_color (ctx, pass == 0 ? &ctx->pal->grid_minor : &ctx->pal->grid_major);
      cairo_fill (ctx->cr);
    }
  cairo_restore (ctx->cr);
}

/* --- wires --- */

/* The direction fluid moves along a wire from end 0 to end 1: +1, -1 or 0
 * when unknown.  Known where an end's port carries only this wire and its
 * part says how much leaves through that port. */
static int
wire_flow_sign (PlRenderCtx *ctx, const PlWire *wire)
{
  for (guint e = 0; e < 2; e++)
    {
      const char *pid = pl_wire_get_part_id (wire, e), *key = pl_wire_get_port_key (wire, e);
      const PlPart *part = g_hash_table_lookup (ctx->parts, pid);
      double q;

      if (part == NULL || pl_render_port_wire_count (ctx, pid, key) != 1
          || !pl_render_port_outflow (ctx, part, key, &q))
        continue;
      /* Below a microlitre per second nothing visibly flows. */
      if (fabs (q) < 1e-9)
        return 0;
      return (q > 0) == (e == 0) ? 1 : -1;
    }
  return 0;
}

/* Ramp colours of wires are drawn in this many steps, so that wires of
 * one step share one stroke: a step is 1/63 of the ramp, about four
 * entries of the 256-entry cividis table, below what the eye tells apart
 * on a thin line. */
#define WIRE_STEPS 64
#define WIRE_CULLED 255
#define WIRE_INK 254

static void
path_range (PlRenderCtx *ctx, GArray *pts, guint from, guint to)
{
  for (guint k = from; k < to; k++)
    {
      PlPoint p = g_array_index (pts, PlPoint, k);

      if (k == from)
        cairo_move_to (ctx->cr, p.x, p.y);
      else
        cairo_line_to (ctx->cr, p.x, p.y);
    }
}

static void
draw_wires (PlRenderCtx *ctx)
{
  guint n = pl_document_get_n_wires (ctx->doc), n_marks = 0;
  g_autoptr (GArray) pts = g_array_new (FALSE, FALSE, sizeof (PlPoint));
  g_autofree guint *first = g_new0 (guint, n + 1);
  g_autofree guint8 *step = g_new (guint8, n + 1);
  gboolean used[WIRE_STEPS] = { FALSE };
  gboolean any_ink = FALSE, any_color = FALSE;

  for (guint i = 0; i < n; i++)
    {
      const PlWire *wire = pl_document_get_wire (ctx->doc, i);
      const PlPart *a = g_hash_table_lookup (ctx->parts, pl_wire_get_part_id (wire, 0));
      const PlPart *b = g_hash_table_lookup (ctx->parts, pl_wire_get_part_id (wire, 1));
      PlRect bb = { INFINITY, INFINITY, -INFINITY, -INFINITY };
      double p;

      first[i] = pts->len;
      step[i] = WIRE_CULLED;
      if (!pl_geometry_route_wire_parts (wire, a, b, ctx->route) || ctx->route->len < 2)
        continue;
      for (guint k = 0; k < ctx->route->len; k++)
        pl_rect_add_point (&bb, g_array_index (ctx->route, PlPoint, k));
      bb.x0 -= 3, bb.y0 -= 3, bb.x1 += 3, bb.y1 += 3;
      if (!pl_rect_intersects (&bb, &ctx->clip))
        continue;
      g_array_append_vals (pts, ctx->route->data, ctx->route->len);
      if (ctx->results != NULL
          && (pl_render_port_pressure (ctx, pl_wire_get_part_id (wire, 0),
                                       pl_wire_get_port_key (wire, 0), &p)
              || pl_render_port_pressure (ctx, pl_wire_get_part_id (wire, 1),
                                          pl_wire_get_port_key (wire, 1), &p)))
        {
          double t = ctx->have_range ? (p - ctx->p_lo) / (ctx->p_hi - ctx->p_lo) : 0.0;

          step[i] = (guint8) lround (CLAMP (isnan (t) ? 0.0 : t, 0.0, 1.0) * (WIRE_STEPS - 1));
          used[step[i]] = any_color = TRUE;
        }
      else
        {
          step[i] = WIRE_INK;
          any_ink = TRUE;
        }
    }
  first[n] = pts->len;

  cairo_set_line_join (ctx->cr, CAIRO_LINE_JOIN_ROUND);
  cairo_set_line_cap (ctx->cr, CAIRO_LINE_CAP_ROUND);
  /* Selection and hover under the wires. */
  for (guint i = 0; i < n; i++)
    {
      const char *id = pl_wire_get_id (pl_document_get_wire (ctx->doc, i));

      if (step[i] == WIRE_CULLED || !(is_selected (ctx, id) || is_hovered (ctx, id)))
        continue;
      path_range (ctx, pts, first[i], first[i + 1]);
      pl_render_set_color_alpha (ctx, &ctx->pal->selection, is_selected (ctx, id) ? 0.45 : 0.25);
      cairo_set_line_width (ctx->cr, pl_render_line_width (ctx, 3.2));
      cairo_stroke (ctx->cr);
    }
  if (any_color)
    {
      /* A casing in ink keeps both ends of the ramp visible on either
       * sheet (cividis' dark end on a dark sheet, its yellow on white). */
      for (guint i = 0; i < n; i++)
        if (step[i] < WIRE_STEPS)
          path_range (ctx, pts, first[i], first[i + 1]);
      pl_render_set_color (ctx, &ctx->pal->ink);
      cairo_set_line_width (ctx->cr, pl_render_line_width (ctx, PL_RENDER_WIRE_MM + 0.5));
      cairo_stroke (ctx->cr);
    }
  cairo_set_line_width (ctx->cr, pl_render_line_width (ctx, PL_RENDER_WIRE_MM));
  if (any_ink)
    {
      for (guint i = 0; i < n; i++)
        if (step[i] == WIRE_INK)
          path_range (ctx, pts, first[i], first[i + 1]);
      pl_render_set_color (ctx, &ctx->pal->ink);
      cairo_stroke (ctx->cr);
    }
  for (guint s = 0; s < WIRE_STEPS; s++)
    {
      PlColor c;

      if (!used[s])
        continue;
      for (guint i = 0; i < n; i++)
        if (step[i] == s)
          path_range (ctx, pts, first[i], first[i + 1]);
      pl_palette_ramp (ctx->pal, s / (double) (WIRE_STEPS - 1), &c);
      pl_render_set_color (ctx, &c);
      cairo_stroke (ctx->cr);
    }
  /* Flow marks in the middle of each coloured wire's longest segment. */
  for (guint i = 0; i < n && any_color; i++)
    {
      guint best = 0;
      double best_len = 0;
      int sign;

      if (step[i] >= WIRE_STEPS)
        continue;
      for (guint k = first[i]; k + 1 < first[i + 1]; k++)
        {
          PlPoint a = g_array_index (pts, PlPoint, k), b = g_array_index (pts, PlPoint, k + 1);
          double len = fabs (b.x - a.x) + fabs (b.y - a.y);

          if (len > best_len)
            best_len = len, best = k;
        }
      if (best_len < 8.0 || (sign = wire_flow_sign (ctx, pl_document_get_wire (ctx->doc, i))) == 0)
        continue;
      {
        PlPoint a = g_array_index (pts, PlPoint, best), b = g_array_index (pts, PlPoint, best + 1);

        pl_render_flow_mark_path (ctx, (PlPoint) { 0.5 * (a.x + b.x), 0.5 * (a.y + b.y) },
                                  sign * (b.x - a.x) / best_len,
                                  sign * (b.y - a.y) / best_len, 2.6);
        n_marks++;
      }
    }
  if (n_marks > 0)
    pl_render_flow_mark_flush (ctx);
}

static void
draw_junctions (PlRenderCtx *ctx)
{
  /* A port with two wires or more is where three lines meet (the part's
   * own connection and the wires): a dot says they join, as opposed to
   * two wires that merely cross. */
  for (guint i = 0; i < pl_document_get_n_parts (ctx->doc); i++)
    {
      const PlPart *part = pl_document_get_part (ctx->doc, i);
      const PlPartType *type = pl_part_get_part_type (part);

      for (guint k = 0; k < type->n_ports; k++)
        {
          PlPoint q;

          if (pl_render_port_wire_count (ctx, pl_part_get_id (part), type->ports[k].key) < 2)
            continue;
          pl_part_get_port_position (part, type->ports[k].key, &q);
          if (!pl_rect_contains_point (&ctx->clip, q))
            continue;
          cairo_new_sub_path (ctx->cr);
          cairo_arc (ctx->cr, q.x, q.y, MAX (1.2, 2.5 * ctx->px), 0, 2 * G_PI);
        }
    }
  pl_render_set_color (ctx, &ctx->pal->ink);
  cairo_fill (ctx->cr);
}

/* --- parts --- */

/* The sides of the part's box, those no port faces first (south, north,
 * east, west within each group): labels go there, clear of the wires. */
static void
label_sides (const PlPart *part, PlSide sides[4])
{
  static const PlSide order[] = { PL_SIDE_SOUTH, PL_SIDE_NORTH, PL_SIDE_EAST, PL_SIDE_WEST };
  const PlPartType *type = pl_part_get_part_type (part);
  guint n = 0;

  for (guint pass = 0; pass < 2; pass++)
    for (guint o = 0; o < G_N_ELEMENTS (order); o++)
      {
        gboolean used = FALSE;

        for (guint k = 0; k < type->n_ports && !used; k++)
          used = pl_part_get_port_side (part, type->ports[k].key) == order[o];
        if (used == (pass == 1))
          sides[n++] = order[o];
      }
}

/* Places a block of w x h next to box on side, gap mm away. */
static void
place_block (const PlRect *box, PlSide side, double w, double h, double gap, PlRect *out)
{
  double cx = 0.5 * (box->x0 + box->x1), cy = 0.5 * (box->y0 + box->y1);

  switch (side)
    {
    case PL_SIDE_NORTH:
      *out = (PlRect) { cx - 0.5 * w, box->y0 - gap - h, cx + 0.5 * w, box->y0 - gap };
      break;
    case PL_SIDE_EAST:
      *out = (PlRect) { box->x1 + gap, cy - 0.5 * h, box->x1 + gap + w, cy + 0.5 * h };
      break;
    case PL_SIDE_WEST:
      *out = (PlRect) { box->x0 - gap - w, cy - 0.5 * h, box->x0 - gap, cy + 0.5 * h };
      break;
    case PL_SIDE_SOUTH:
    default:
      *out = (PlRect) { cx - 0.5 * w, box->y1 + gap, cx + 0.5 * w, box->y1 + gap + h };
      break;
    }
}

/* How far from the symbol a label block may go (mm): beside it, then
 * further out with a leader line back to the symbol. */
static const double label_gaps[] = { 1.2, 6.0, 12.0 };
#define LABEL_NEAR_GAP 1.2

/* A thin line from the middle of the symbol's side to the label moved away
 * from it, so it still reads as the part's. */
static void
draw_leader (PlRenderCtx *ctx, const PlRect *box, PlSide side, const PlRect *block)
{
  double cx = 0.5 * (box->x0 + box->x1), cy = 0.5 * (box->y0 + box->y1);
  double bx = 0.5 * (block->x0 + block->x1), by = 0.5 * (block->y0 + block->y1);

  switch (side)
    {
    case PL_SIDE_NORTH:
      cairo_move_to (ctx->cr, cx, box->y0);
      cairo_line_to (ctx->cr, bx, block->y1);
      break;
    case PL_SIDE_EAST:
      cairo_move_to (ctx->cr, box->x1, cy);
      cairo_line_to (ctx->cr, block->x0, by);
      break;
    case PL_SIDE_WEST:
      cairo_move_to (ctx->cr, box->x0, cy);
      cairo_line_to (ctx->cr, block->x1, by);
      break;
    case PL_SIDE_SOUTH:
    default:
      cairo_move_to (ctx->cr, cx, box->y1);
      cairo_line_to (ctx->cr, bx, block->y0);
      break;
    }
  pl_render_set_color (ctx, &ctx->pal->text_dim);
  cairo_set_line_width (ctx->cr, pl_render_line_width (ctx, 0.2));
  cairo_stroke (ctx->cr);
}

/* Tag, key value and the part's result (gauge reading, dose bar) as one
 * block beside the symbol, upright whatever the part's turn, where it
 * overlaps no symbol and no label placed before it. */
static void
draw_part_labels (PlRenderCtx *ctx, const PlPart *part, const PlRect *box)
{
  const PlPartType *type = pl_part_get_part_type (part);
  double tag_size = pl_render_text_size (ctx, PL_RENDER_TAG_MM);
  double value_size = pl_render_text_size (ctx, PL_RENDER_VALUE_MM);
  g_autofree char *value = NULL;
  double tw = 0, th = 0, vw = 0, vh = 0, ow = 0, oh = 0, w, h;
  PlSide sides[4];
  PlRect cand[G_N_ELEMENTS (label_gaps) * 4], block;
  guint k, n = 0;
  gboolean value_inside = type->kind == PL_PART_PUMP;

  if (tag_size == 0.0)
    return;
  value = pl_render_key_value (part, ctx->opts->units);
  if (value != NULL && value_size > 0.0)
    pl_render_layout_text (ctx, value, value_size, FALSE, &vw, &vh);
  if (value_inside && vw > 0.0)
    {
      /* A pump's ratio is its name on the box: drawn large in the box's
       * middle, clear of the stroke mark along one edge. */
      double cx = 0.5 * (box->x0 + box->x1), cy = 0.5 * (box->y0 + box->y1);

      pl_render_layout_text (ctx, value, tag_size * 1.15, TRUE, &vw, &vh);
      pl_render_show_layout (ctx, cx - 0.5 * vw, cy - 0.5 * vh, &ctx->pal->text);
      vw = vh = 0.0;
    }
  pl_render_part_overlay_size (ctx, part, &ow, &oh);
  pl_render_layout_text (ctx, pl_part_get_tag (part), tag_size, TRUE, &tw, &th);
  w = MAX (MAX (tw, vw), ow);
  h = th + vh + (oh > 0.0 ? oh + 1.0 : 0.0);
  label_sides (part, sides);
  for (guint g = 0; g < G_N_ELEMENTS (label_gaps); g++)
    for (guint s = 0; s < 4; s++)
      place_block (box, sides[s], w, h, label_gaps[g], &cand[n++]);
  k = pl_render_place_label (ctx, cand, n);
  if (k >= n)
    k = 0;
  block = cand[k];
  if (label_gaps[k / 4] > LABEL_NEAR_GAP)
    draw_leader (ctx, box, sides[k % 4], &block);
  {
    PlSide side = sides[k % 4];
    double tx = side == PL_SIDE_EAST ? block.x0
                : side == PL_SIDE_WEST ? block.x1 - tw : 0.5 * (block.x0 + block.x1 - tw);
    double vx = side == PL_SIDE_EAST ? block.x0
                : side == PL_SIDE_WEST ? block.x1 - vw : 0.5 * (block.x0 + block.x1 - vw);

    pl_render_layout_text (ctx, pl_part_get_tag (part), tag_size, TRUE, NULL, NULL);
    pl_render_show_layout (ctx, tx, block.y0, &ctx->pal->text);
    if (vw > 0.0)
      {
        pl_render_layout_text (ctx, value, value_size, FALSE, NULL, NULL);
        pl_render_show_layout (ctx, vx, block.y0 + th, &ctx->pal->text_dim);
      }
  }
  if (oh > 0.0)
    {
      /* Under the tag and value, centred in the block. */
      double cx = 0.5 * (block.x0 + block.x1), y = block.y0 + th + vh + 1.0;
      PlRect overlay = { cx - 0.5 * ow, y, cx + 0.5 * ow, y + oh };

      pl_render_part_overlay (ctx, part, &overlay);
    }
}

static void
outline_box (PlRenderCtx *ctx, const PlRect *box, double grow, double radius)
{
  double x0 = box->x0 - grow, y0 = box->y0 - grow, x1 = box->x1 + grow, y1 = box->y1 + grow;

  cairo_new_sub_path (ctx->cr);
  cairo_arc (ctx->cr, x1 - radius, y0 + radius, radius, -G_PI / 2, 0);
  cairo_arc (ctx->cr, x1 - radius, y1 - radius, radius, 0, G_PI / 2);
  cairo_arc (ctx->cr, x0 + radius, y1 - radius, radius, G_PI / 2, G_PI);
  cairo_arc (ctx->cr, x0 + radius, y0 + radius, radius, G_PI, 1.5 * G_PI);
  cairo_close_path (ctx->cr);
}

/* Labels reach out beyond the box (further when moved aside): cull with
 * room for them. */
static gboolean
part_in_reach (PlRenderCtx *ctx, const PlRect *box, PlRect *reach)
{
  *reach = (PlRect) { box->x0 - 45, box->y0 - 35, box->x1 + 45, box->y1 + 35 };
  return pl_rect_intersects (reach, &ctx->clip);
}

/* Every symbol that will be drawn, so that no label lands on one. */
static void
block_symbols (PlRenderCtx *ctx)
{
  for (guint i = 0; i < pl_document_get_n_parts (ctx->doc); i++)
    {
      PlRect box, reach;

      pl_geometry_part_bounds (pl_document_get_part (ctx->doc, i), &box);
      if (part_in_reach (ctx, &box, &reach))
        pl_label_placer_block (ctx->placer, &box);
    }
}

static void
draw_part (PlRenderCtx *ctx, const PlPart *part)
{
  const PlPartType *type = pl_part_get_part_type (part);
  PlRect box, reach;
  PlSymbolState state;
  const char *id = pl_part_get_id (part);

  pl_geometry_part_bounds (part, &box);
  if (!part_in_reach (ctx, &box, &reach))
    return;
  if (is_selected (ctx, id) || is_hovered (ctx, id))
    {
      outline_box (ctx, &box, 1.5, 2.0);
      if (is_selected (ctx, id))
        {
          pl_render_set_color_alpha (ctx, &ctx->pal->selection, 0.10);
          cairo_fill_preserve (ctx->cr);
          pl_render_set_color (ctx, &ctx->pal->selection);
          cairo_set_dash (ctx->cr, NULL, 0, 0);
        }
      else
        {
          double dash[] = { 1.5, 1.0 };

          pl_render_set_color (ctx, &ctx->pal->hover);
          cairo_set_dash (ctx->cr, dash, 2, 0);
        }
      cairo_set_line_width (ctx->cr, pl_render_line_width (ctx, 0.5));
      cairo_stroke (ctx->cr);
      cairo_set_dash (ctx->cr, NULL, 0, 0);
    }
  if (ctx->scale < PL_RENDER_OUTLINE_SCALE)
    return;   /* drawn by draw_outlines(); labels would be unreadable */
  pl_render_symbol_state (ctx, part, &state);
  cairo_save (ctx->cr);
  cairo_translate (ctx->cr, pl_part_get_x (part), pl_part_get_y (part));
  cairo_rotate (ctx->cr, 0.5 * G_PI * (pl_part_get_rotation (part) % 4));
  if (pl_part_get_mirrored (part))
    cairo_scale (ctx->cr, -1.0, 1.0);
  pl_render_symbol (ctx, type, part, &state);
  cairo_restore (ctx->cr);
  if (type->kind == PL_PART_GAUGE)
    {
      PlPoint centre;

      /* The dial stays upright (a turned scale is hard to read). */
      pl_geometry_transform_point (pl_part_get_x (part), pl_part_get_y (part),
                                   pl_part_get_rotation (part), pl_part_get_mirrored (part),
                                   (PlPoint) { 0.0, -5.0 }, &centre);
      pl_render_gauge_dial (ctx, centre, 11.0, state.gauge_fraction);
    }
  draw_part_labels (ctx, part, &box);
}

static void
draw_outlines (PlRenderCtx *ctx)
{
  for (guint i = 0; i < pl_document_get_n_parts (ctx->doc); i++)
    {
      const PlPart *part = pl_document_get_part (ctx->doc, i);
      PlRect box;

      pl_geometry_part_bounds (part, &box);
      if (!pl_rect_intersects (&box, &ctx->clip))
        continue;
      /* The path outlives save/restore: every outline joins one path. */
      cairo_save (ctx->cr);
      cairo_translate (ctx->cr, pl_part_get_x (part), pl_part_get_y (part));
      cairo_rotate (ctx->cr, 0.5 * G_PI * (pl_part_get_rotation (part) % 4));
      if (pl_part_get_mirrored (part))
        cairo_scale (ctx->cr, -1.0, 1.0);
      pl_render_silhouette (ctx, pl_part_get_part_type (part));
      cairo_restore (ctx->cr);
    }
  cairo_set_fill_rule (ctx->cr, CAIRO_FILL_RULE_WINDING);
  pl_render_set_color (ctx, &ctx->pal->fill);
  cairo_fill_preserve (ctx->cr);
  pl_render_set_color (ctx, &ctx->pal->ink);
  cairo_set_line_width (ctx->cr, ctx->px);
  cairo_stroke (ctx->cr);
}

static void
draw_ports (PlRenderCtx *ctx)
{
  const PlRenderOptions *o = ctx->opts;
  double r = MAX (PL_RENDER_PORT_MM, 3.0 * ctx->px);

  cairo_set_line_width (ctx->cr, pl_render_line_width (ctx, 0.35));
  if (o->show_ports)
    for (guint i = 0; i < pl_document_get_n_parts (ctx->doc); i++)
      {
        const PlPart *part = pl_document_get_part (ctx->doc, i);
        const PlPartType *type = pl_part_get_part_type (part);

        for (guint k = 0; k < type->n_ports; k++)
          {
            PlPoint q;

            pl_part_get_port_position (part, type->ports[k].key, &q);
            if (!pl_rect_contains_point (&ctx->clip, q))
              continue;
            cairo_new_sub_path (ctx->cr);
            cairo_arc (ctx->cr, q.x, q.y, r, 0, 2 * G_PI);
          }
      }
  pl_render_set_color (ctx, &ctx->pal->background);
  cairo_fill_preserve (ctx->cr);
  pl_render_set_color (ctx, &ctx->pal->port);
  cairo_stroke (ctx->cr);
  for (guint i = 0; i < o->n_highlight_ports; i++)
    {
      const PlPart *part = pl_document_find_part (ctx->doc, o->highlight_ports[i].part_id);
      PlPoint q;

      if (part == NULL
          || !pl_part_get_port_position (part, o->highlight_ports[i].port_key, &q))
        continue;
      cairo_new_sub_path (ctx->cr);
      cairo_arc (ctx->cr, q.x, q.y, 1.6 * r, 0, 2 * G_PI);
      pl_render_set_color_alpha (ctx, &ctx->pal->port_highlight, 0.35);
      cairo_fill_preserve (ctx->cr);
      pl_render_set_color (ctx, &ctx->pal->port_highlight);
      cairo_stroke (ctx->cr);
    }
}

static void
draw_notes (PlRenderCtx *ctx)
{
  double size = pl_render_text_size (ctx, 3.2);

  if (size == 0.0)
    return;
  for (guint i = 0; i < pl_document_get_n_notes (ctx->doc); i++)
    {
      const PlNote *note = pl_document_get_note (ctx->doc, i);
      double x = pl_note_get_x (note), y = pl_note_get_y (note), w, h;
      PlRect box;

      if (x > ctx->clip.x1 || y > ctx->clip.y1)
        continue;
      pl_render_layout_text (ctx, pl_note_get_text (note), size, FALSE, &w, &h);
      box = (PlRect) { x, y, x + w, y + h };
      if (!pl_rect_intersects (&box, &ctx->clip))
        continue;
      outline_box (ctx, &box, 1.0, 1.0);
      pl_render_set_color (ctx, &ctx->pal->label_bg);
      cairo_fill_preserve (ctx->cr);
      if (is_selected (ctx, pl_note_get_id (note)) || is_hovered (ctx, pl_note_get_id (note)))
        pl_render_set_color (ctx, is_selected (ctx, pl_note_get_id (note))
                                  ? &ctx->pal->selection : &ctx->pal->hover);
      else
        pl_render_set_color_alpha (ctx, &ctx->pal->text_dim, 0.5);
      cairo_set_line_width (ctx->cr, pl_render_line_width (ctx, 0.3));
      cairo_stroke (ctx->cr);
      pl_render_show_layout (ctx, x, y, &ctx->pal->text);
    }
}

static void
count_port_wires (PlRenderCtx *ctx)
{
  for (guint i = 0; i < pl_document_get_n_wires (ctx->doc); i++)
    {
      const PlWire *wire = pl_document_get_wire (ctx->doc, i);

      for (guint e = 0; e < 2; e++)
        {
          char *key = port_wire_key (pl_wire_get_part_id (wire, e),
                                     pl_wire_get_port_key (wire, e));
          guint n = GPOINTER_TO_UINT (g_hash_table_lookup (ctx->port_wires, key));

          g_hash_table_replace (ctx->port_wires, key, GUINT_TO_POINTER (n + 1));
        }
    }
}

cairo_status_t
pl_render_document (cairo_t *cr, PlDocument *doc, PlResults *results,
                    const PlRenderOptions *opts)
{
  PlRenderCtx ctx = { 0 };
  cairo_matrix_t screen;
  cairo_font_options_t *font_options;
  double dx = 1.0, dy = 0.0;
  cairo_status_t status;

  g_return_val_if_fail (cr != NULL, CAIRO_STATUS_NULL_POINTER);
  g_return_val_if_fail (doc != NULL && opts != NULL, CAIRO_STATUS_NULL_POINTER);
  if (pl_palette_get (opts->style) == NULL)
    return CAIRO_STATUS_INVALID_CONTENT;
  if (cairo_status (cr) != CAIRO_STATUS_SUCCESS)
    return cairo_status (cr);

  cairo_save (cr);
  cairo_get_matrix (cr, &screen);
  if (opts->viewport != NULL)
    {
      cairo_scale (cr, pl_viewport_get_scale (opts->viewport),
                   pl_viewport_get_scale (opts->viewport));
      cairo_translate (cr, -opts->viewport->origin_x, -opts->viewport->origin_y);
    }
  ctx.cr = cr;
  ctx.doc = doc;
  ctx.opts = opts;
  ctx.pal = pl_palette_get (opts->style);
  cairo_user_to_device_distance (cr, &dx, &dy);
  ctx.scale = hypot (dx, dy);
  if (!(isfinite (ctx.scale) && ctx.scale > 0.0))
    ctx.scale = 1.0;
  ctx.px = 1.0 / ctx.scale;
  /* Curves (round joins, dials, nozzles) flattened to a quarter of a
   * device pixel rather than cairo's tenth: no visible difference, about
   * half the polygon edges to rasterise. */
  cairo_set_tolerance (cr, 0.25);
  cairo_clip_extents (cr, &ctx.clip.x0, &ctx.clip.y0, &ctx.clip.x1, &ctx.clip.y1);
  ctx.stale = opts->results_stale
              || (results != NULL
                  && pl_results_get_revision (results) != pl_document_get_revision (doc));
  ctx.results = results != NULL && !ctx.stale ? results : NULL;
  ctx.port_wires = g_hash_table_new_full (g_str_hash, g_str_equal, g_free, NULL);
  ctx.parts = g_hash_table_new (g_str_hash, g_str_equal);
  for (guint i = 0; i < pl_document_get_n_parts (doc); i++)
    {
      const PlPart *part = pl_document_get_part (doc, i);

      g_hash_table_insert (ctx.parts, (gpointer) pl_part_get_id (part), (gpointer) part);
    }
  ctx.route = g_array_new (FALSE, FALSE, sizeof (PlPoint));
  ctx.layout = pango_cairo_create_layout (cr);
  /* Unhinted outlines: text keeps its size relative to the symbols at
   * every zoom and on paper. */
  font_options = cairo_font_options_create ();
  cairo_font_options_set_hint_metrics (font_options, CAIRO_HINT_METRICS_OFF);
  cairo_font_options_set_hint_style (font_options, CAIRO_HINT_STYLE_NONE);
  pango_cairo_context_set_font_options (pango_layout_get_context (ctx.layout), font_options);
  cairo_font_options_destroy (font_options);
  /* Glyph positions rounded to whole user units would be whole mm here. */
  pango_context_set_round_glyph_positions (pango_layout_get_context (ctx.layout), FALSE);
  pango_layout_context_changed (ctx.layout);
  ctx.font = pango_font_description_from_string ("Sans");
  count_port_wires (&ctx);
  if (ctx.results != NULL)
    pl_render_overlay_prepare (&ctx);

  if (opts->paint_background)
    {
      pl_render_set_color (&ctx, &ctx.pal->background);
      cairo_paint (cr);
    }
  if (opts->show_grid)
    draw_grid (&ctx);
  draw_wires (&ctx);
  draw_junctions (&ctx);
  if (ctx.scale < PL_RENDER_OUTLINE_SCALE)
    draw_outlines (&ctx);
  ctx.placer = pl_label_placer_new ();
  if (ctx.scale >= PL_RENDER_OUTLINE_SCALE)
    block_symbols (&ctx);
  for (guint i = 0; i < pl_document_get_n_parts (doc); i++)
    draw_part (&ctx, pl_document_get_part (doc, i));
  draw_ports (&ctx);
  if (ctx.results != NULL)
    for (guint i = 0; i < opts->n_pressure_ports; i++)
      {
        const PlPart *part = pl_document_find_part (doc, opts->pressure_ports[i].part_id);
        PlPoint q;

        if (part != NULL
            && pl_part_get_port_position (part, opts->pressure_ports[i].port_key, &q))
          pl_render_pressure_label (&ctx, q, opts->pressure_ports[i].part_id,
                                    opts->pressure_ports[i].port_key);
      }
  draw_notes (&ctx);

  /* Screen-space marks: in the caller's own units. */
  if (opts->viewport != NULL)
    {
      cairo_set_matrix (cr, &screen);
      ctx.scale = 1.0;
      ctx.px = 1.0;
      ctx.clip = (PlRect) { 0, 0, opts->viewport->width, opts->viewport->height };
      if (ctx.stale)
        pl_render_stale_badge (&ctx);
      if (opts->show_legend && (ctx.have_range || ctx.stale))
        pl_render_legend (cr, opts->viewport->width - 236, opts->viewport->height - 60, 220,
                          44, ctx.p_lo, ctx.have_range ? ctx.p_hi : 0.0, opts->units,
                          opts->style, ctx.stale);
    }
  else if (ctx.stale)
    pl_render_stale_badge (&ctx);

  pl_label_placer_free (ctx.placer);
  pango_font_description_free (ctx.font);
  g_object_unref (ctx.layout);
  g_array_unref (ctx.route);
  g_hash_table_unref (ctx.port_wires);
  g_hash_table_unref (ctx.parts);
  cairo_restore (cr);
  status = cairo_status (cr);
  return status;
}
