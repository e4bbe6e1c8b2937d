/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-work-order-diagram.c: sheet one: the diagram fitted to its drawing
 * area with the result annotations, the legend (the pressure ramp and the
 * symbols used) and the title block.  Portrait sheets put legend and title
 * block in a band under the drawing; landscape sheets in a column to its
 * right, so the drawing keeps most of the height either way.
 */
#include "config.h"

#include "pl-work-order-private.h"

#include <glib/gi18n.h>
#include <math.h>

#include "pl-geometry.h"
#include "pl-render.h"

/* Room around the parts' boxes for tags, values and result labels: some mm
 * of the drawing (the offsets of labels and dose bars) and some of paper
 * (their text, never under the paper's smallest size); most to the right,
 * where pressure labels and dose figures run.  And the largest
 * magnification of a small layout. */
#define DIAGRAM_ROOM_WORLD 10.0
#define DIAGRAM_ROOM_PAPER 6.0
#define DIAGRAM_RIGHT_WORLD 24.0
#define DIAGRAM_RIGHT_PAPER 18.0
#define DIAGRAM_MAX_SCALE 1.5
#define LEGEND_RAMP_H 14.0
#define LEGEND_ICON 7.0
#define LEGEND_ROW 8.0
#define SIDE_COLUMN_W 100.0

static gboolean
cycle_known (PlWorkOrder *wo)
{
  return wo->results != NULL && pl_results_get_cycle (wo->results) != NULL;
}

/* The part types the layout uses, in shelf order. */
static GPtrArray *
used_types (PlWorkOrder *wo)
{
  GPtrArray *types = g_ptr_array_new ();

  for (guint t = 0; t < pl_part_type_get_n_placeable (); t++)
    {
      const PlPartType *type = pl_part_type_get_placeable (t);

      for (guint i = 0; i < pl_document_get_n_parts (wo->doc); i++)
        if (pl_part_get_part_type (pl_document_get_part (wo->doc, i)) == type)
          {
            g_ptr_array_add (types, (gpointer) type);
            break;
          }
    }
  return types;
}

/* The renderer's key ports less the applicators' inlets: on a sheet their
 * pressure goes with the dose figures under each applicator, where a
 * label at the inlet would meet the text of the line above it. */
static GArray *
sheet_key_ports (PlWorkOrder *wo)
{
  GArray *ports = pl_render_key_ports (wo->doc, wo->results, NULL);

  for (guint i = ports->len; i-- > 0;)
    {
      const PlPortRef *ref = &g_array_index (ports, PlPortRef, i);
      const PlPart *part = pl_document_find_part (wo->doc, ref->part_id);

      if (part != NULL && pl_part_get_part_type (part)->kind == PL_PART_APPLICATOR)
        g_array_remove_index (ports, i);
    }
  return ports;
}

static guint
legend_columns (double width)
{
  return width >= 70.0 ? 2 : 1;
}

static double
legend_height (PlWorkOrder *wo, double width)
{
  g_autoptr (GPtrArray) types = used_types (wo);
  guint cols = legend_columns (width);

  return LEGEND_RAMP_H + 2.0 + 6.0 + LEGEND_ROW * ((types->len + cols - 1) / cols);
}

static void
draw_legend (PlWorkOrder *wo, cairo_t *cr, double x, double y, double width,
             const PlRenderOptions *ro)
{
  g_autoptr (GPtrArray) types = used_types (wo);
  guint cols = legend_columns (width);
  double lo = 0.0, hi = 0.0, col_w = width / cols;
  gboolean have = pl_render_pressure_range (wo->doc, wo->results, ro, &lo, &hi);

  /* The ramp's heading names the unit; it is drawn by the renderer, so
   * the sheet's text gets it here. */
  pl_render_legend (cr, x, y, width, LEGEND_RAMP_H, lo, have ? hi : 0.0, &wo->opts.units,
                    PL_RENDER_STYLE_PRINT, FALSE);
  {
    const PlUnit *u = pl_unit_get (pl_unit_prefs_get_unit (&wo->opts.units,
                                                           PL_QUANTITY_PRESSURE));
    g_autofree char *heading = g_strdup_printf (_("Pressure (%s)"), u->symbol);

    pl_wo_log (wo, heading);
  }
  y += LEGEND_RAMP_H + 2.0;
  y += pl_wo_text (wo, cr, _("Symbols"), PL_WO_BODY_MM, TRUE, x, y, width) + 1.0;
  for (guint i = 0; i < types->len; i++)
    {
      const PlPartType *type = g_ptr_array_index (types, i);
      double cx = x + (i % cols) * col_w, cy = y + (i / cols) * LEGEND_ROW;
      g_autoptr (PangoLayout) name = pl_wo_layout (wo, _(type->name), PL_WO_BODY_MM, FALSE,
                                                   col_w - LEGEND_ICON - 3.0);
      double nh;

      cairo_save (cr);
      cairo_translate (cr, cx, cy);
      pl_render_type_icon (cr, type, LEGEND_ICON, PL_RENDER_STYLE_PRINT);
      cairo_restore (cr);
      pl_wo_layout_size (name, NULL, &nh);
      pl_wo_show (wo, cr, name, cx + LEGEND_ICON + 2.0, cy + 0.5 * (LEGEND_ICON - nh));
    }
}

static void
draw_diagram (PlWorkOrder *wo, cairo_t *cr, double x, double y, double w, double h,
              const PlRenderOptions *ro)
{
  PlRect box;
  double bw, bh, s;

  cairo_rectangle (cr, x, y, w, h);
  cairo_set_line_width (cr, PL_WO_RULE_MM);
  cairo_set_source_rgb (cr, 0.0, 0.0, 0.0);
  cairo_stroke (cr);
  if (!pl_geometry_document_bounds (wo->doc, &box))
    {
      pl_wo_text (wo, cr, _("The layout has no parts."), PL_WO_BODY_MM, FALSE, x + 4.0,
                  y + 4.0, w - 8.0);
      return;
    }
  /* w = s (bw + world room) + paper room, likewise for h. */
  bw = box.x1 - box.x0;
  bh = box.y1 - box.y0;
  s = MIN ((w - DIAGRAM_ROOM_PAPER - DIAGRAM_RIGHT_PAPER)
           / (bw + DIAGRAM_ROOM_WORLD + DIAGRAM_RIGHT_WORLD),
           (h - 2 * DIAGRAM_ROOM_PAPER) / (bh + 2 * DIAGRAM_ROOM_WORLD));
  s = MIN (DIAGRAM_MAX_SCALE, MAX (s, 1e-3));
  box.x0 -= DIAGRAM_ROOM_WORLD + DIAGRAM_ROOM_PAPER / s;
  box.y0 -= DIAGRAM_ROOM_WORLD + DIAGRAM_ROOM_PAPER / s;
  box.x1 += DIAGRAM_RIGHT_WORLD + DIAGRAM_RIGHT_PAPER / s;
  box.y1 += DIAGRAM_ROOM_WORLD + DIAGRAM_ROOM_PAPER / s;
  bw = box.x1 - box.x0;
  bh = box.y1 - box.y0;
  cairo_save (cr);
  cairo_rectangle (cr, x, y, w, h);
  cairo_clip (cr);
  cairo_translate (cr, x + 0.5 * (w - s * bw), y + 0.5 * (h - s * bh));
  cairo_scale (cr, s, s);
  cairo_translate (cr, -box.x0, -box.y0);
  {
    PlRenderOptions scaled = *ro;

    scaled.paper_scale = s;
    pl_render_document (cr, wo->doc, wo->results, &scaled);
  }
  cairo_restore (cr);
}

void
pl_wo_draw_diagram_sheet (PlWorkOrder *wo, cairo_t *cr)
{
  double x0, y0, x1, y1, y, cw, side_w, band_h, legend_h, title_h;
  gboolean landscape = wo->opts.width_mm > wo->opts.height_mm;
  g_autoptr (GArray) ports = sheet_key_ports (wo);
  g_autofree char *heading = NULL;
  g_autoptr (PangoLayout) caption = NULL;
  double caption_h, dw, dh;
  PlRenderOptions ro;

  pl_render_options_init (&ro);
  ro.style = PL_RENDER_STYLE_PRINT;
  ro.units = &wo->opts.units;
  ro.paint_background = FALSE;
  ro.show_grid = FALSE;
  ro.show_legend = FALSE;
  ro.pressure_ports = (const PlPortRef *) (void *) ports->data;
  ro.n_pressure_ports = ports->len;
  /* What the technician watches for: the lowest reading while firing;
   * without a cycle, the idle pressure, and the caption says so. */
  ro.pressure_kind = cycle_known (wo) ? PL_PRESSURE_CYCLE_MIN : PL_PRESSURE_IDLE;
  ro.show_dose_details = TRUE;

  pl_wo_content_box (wo, &x0, &y0, &x1, &y1);
  cw = x1 - x0;
  /* Translators: the heading of a work order's first sheet; %s is the
   * line's name. */
  heading = g_strdup_printf (_("Work order: %s"),
                             *pl_part_get_text (pl_document_get_title (wo->doc), "line")
                             ? pl_part_get_text (pl_document_get_title (wo->doc), "line")
                             : _("unnamed line"));
  y = y0 + pl_wo_text (wo, cr, heading, PL_WO_TITLE_MM, TRUE, x0, y0, cw) + 2.0;

  side_w = landscape ? MIN (SIDE_COLUMN_W, 0.4 * cw) : MIN (110.0, 0.56 * cw);
  title_h = pl_wo_title_block_height (wo, side_w);
  legend_h = legend_height (wo, landscape ? side_w : cw - side_w - 4.0);
  caption = pl_wo_layout (wo, cycle_known (wo)
                              ? _("On the drawing: the lowest pressure while firing at each "
                                  "gauge and pump outlet; under each applicator, a bar of "
                                  "its shot against the mean shot, then its lowest inlet "
                                  "pressure while firing, its shot's mass and the "
                                  "difference from the mean.")
                              : _("On the drawing: the pressure at idle at each gauge, pump "
                                  "outlet and applicator. The firing cycle was not solved, "
                                  "so no figure while firing is shown."),
                          PL_WO_SMALL_MM, FALSE, landscape ? cw - side_w - 4.0 : cw);
  pl_wo_layout_size (caption, NULL, &caption_h);

  if (landscape)
    {
      double sx = x1 - side_w;

      dw = cw - side_w - 4.0;
      dh = y1 - y - caption_h - 2.0;
      draw_diagram (wo, cr, x0, y, dw, dh, &ro);
      pl_wo_show (wo, cr, caption, x0, y + dh + 1.5);
      draw_legend (wo, cr, sx, y, side_w, &ro);
      pl_wo_draw_title_block (wo, cr, sx, y1 - title_h, side_w);
    }
  else
    {
      band_h = MAX (title_h, legend_h);
      dw = cw;
      dh = y1 - band_h - 4.0 - caption_h - 2.0 - y;
      draw_diagram (wo, cr, x0, y, dw, dh, &ro);
      pl_wo_show (wo, cr, caption, x0, y + dh + 1.5);
      draw_legend (wo, cr, x0, y1 - band_h, cw - side_w - 4.0, &ro);
      pl_wo_draw_title_block (wo, cr, x1 - side_w, y1 - title_h, side_w);
    }
}
