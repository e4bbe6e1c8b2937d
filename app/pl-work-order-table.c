/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-work-order-table.c: the tables of the following sheets: measuring,
 * laying them out over as many sheets as they need (the heading and the
 * column headers repeated on each), and drawing one run of rows.
 */
#include "config.h"

#include "pl-work-order-private.h"

#include <glib/gi18n.h>

PlWoTable *
pl_wo_table_new (const char *heading, guint n_cols, const char *const *headers,
                 const double *widths, const char *empty_text)
{
  PlWoTable *t = g_new0 (PlWoTable, 1);

  t->heading = g_strdup (heading);
  t->n_cols = n_cols;
  t->headers = g_new0 (char *, n_cols + 1);
  t->widths = g_new (double, n_cols);
  for (guint i = 0; i < n_cols; i++)
    {
      t->headers[i] = g_strdup (headers[i]);
      t->widths[i] = widths[i];
    }
  t->rows = g_ptr_array_new_with_free_func ((GDestroyNotify) g_strfreev);
  t->empty_text = g_strdup (empty_text);
  t->row_h = g_array_new (FALSE, TRUE, sizeof (double));
  return t;
}

void
pl_wo_table_free (PlWoTable *t)
{
  if (t == NULL)
    return;
  g_free (t->heading);
  g_strfreev (t->headers);
  g_free (t->widths);
  g_ptr_array_unref (t->rows);
  g_free (t->empty_text);
  g_free (t->note);
  g_array_unref (t->row_h);
  g_free (t);
}

void
pl_wo_table_add_row (PlWoTable *t, char **cells)
{
  g_ptr_array_add (t->rows, cells);
}

static double
content_width (PlWorkOrder *wo)
{
  double x0, y0, x1, y1;

  pl_wo_content_box (wo, &x0, &y0, &x1, &y1);
  return x1 - x0;
}

/* Height of a cell's text wrapped in its column. */
static double
cell_height (PlWorkOrder *wo, const char *text, double width, gboolean bold)
{
  g_autoptr (PangoLayout) layout = pl_wo_layout (wo, text, PL_WO_BODY_MM, bold,
                                                 width - 2 * PL_WO_PAD);
  double h;

  pl_wo_layout_size (layout, NULL, &h);
  return h + 2 * PL_WO_PAD;
}

static double
note_height (PlWorkOrder *wo, const char *text)
{
  g_autoptr (PangoLayout) layout = pl_wo_layout (wo, text, PL_WO_SMALL_MM, FALSE,
                                                 content_width (wo));
  double h;

  pl_wo_layout_size (layout, NULL, &h);
  return h + 1.5;
}

void
pl_wo_table_measure (PlWorkOrder *wo, PlWoTable *t)
{
  double width = content_width (wo), h;

  {
    g_autoptr (PangoLayout) layout = pl_wo_layout (wo, t->heading, PL_WO_HEADING_MM, TRUE,
                                                   width);

    pl_wo_layout_size (layout, NULL, &h);
    t->heading_h = h + 1.5;
  }
  t->header_h = 0.0;
  for (guint c = 0; c < t->n_cols; c++)
    t->header_h = MAX (t->header_h, cell_height (wo, t->headers[c], t->widths[c] * width,
                                                 TRUE));
  g_array_set_size (t->row_h, 0);
  if (t->rows->len == 0)
    {
      h = cell_height (wo, t->empty_text, width, FALSE);
      g_array_append_val (t->row_h, h);
    }
  for (guint r = 0; r < t->rows->len; r++)
    {
      char **cells = g_ptr_array_index (t->rows, r);

      h = 0.0;
      for (guint c = 0; c < t->n_cols; c++)
        h = MAX (h, cell_height (wo, cells[c], t->widths[c] * width, FALSE));
      g_array_append_val (t->row_h, h);
    }
  t->note_h = t->note != NULL ? note_height (wo, t->note) : 0.0;
}

void
pl_wo_paginate (PlWorkOrder *wo)
{
  double x0, top, x1, bottom, y;
  guint sheet = 1;

  pl_wo_content_box (wo, &x0, &top, &x1, &bottom);
  g_array_set_size (wo->segments, 0);
  y = top;
  for (guint i = 0; i < wo->tables->len; i++)
    {
      PlWoTable *t = g_ptr_array_index (wo->tables, i);
      guint n = t->row_h->len, r = 0;
      gboolean continued = FALSE;

      while (r < n)
        {
          PlWoSegment seg = { 0 };
          double row = g_array_index (t->row_h, double, r);
          double need = t->heading_h + t->header_h + row + (r + 1 == n ? t->note_h : 0.0);
          double yy;

          /* The heading never stands alone at the foot of a sheet. */
          if (y + need > bottom && y > top)
            {
              sheet++;
              y = top;
            }
          seg = (PlWoSegment) { sheet, t, r, 0, continued, FALSE, y };
          yy = y + t->heading_h + t->header_h;
          while (r < n)
            {
              double h = g_array_index (t->row_h, double, r);
              double extra = r + 1 == n ? t->note_h : 0.0;

              /* At least one row per run, so a tall row cannot stall us. */
              if (yy + h + extra > bottom && seg.n_rows > 0)
                break;
              yy += h;
              seg.n_rows++;
              r++;
            }
          seg.last = r == n;
          g_array_append_val (wo->segments, seg);
          if (r < n)
            {
              sheet++;
              y = top;
              continued = TRUE;
            }
          else
            y = yy + t->note_h + PL_WO_GAP;
        }
    }
  if (y + wo->cautions_h > bottom && y > top)
    {
      sheet++;
      y = top;
    }
  {
    PlWoSegment seg = { sheet, NULL, 0, 0, FALSE, TRUE, y };

    g_array_append_val (wo->segments, seg);
  }
  wo->n_sheets = sheet + 1;
}

static void
rule (cairo_t *cr, double x0, double x1, double y, double width)
{
  cairo_move_to (cr, x0, y);
  cairo_line_to (cr, x1, y);
  cairo_set_line_width (cr, width);
  cairo_set_source_rgb (cr, 0.0, 0.0, 0.0);
  cairo_stroke (cr);
}

static void
draw_cells (PlWorkOrder *wo, cairo_t *cr, PlWoTable *t, char **cells, double x, double y,
            double width, gboolean bold)
{
  g_autoptr (GString) line = g_string_new (NULL);

  for (guint c = 0; c < t->n_cols; c++)
    {
      double w = t->widths[c] * width;
      g_autoptr (PangoLayout) layout = pl_wo_layout (wo, cells[c], PL_WO_BODY_MM, bold,
                                                     w - 2 * PL_WO_PAD);

      cairo_set_source_rgb (cr, 0.0, 0.0, 0.0);
      cairo_move_to (cr, x + PL_WO_PAD, y + PL_WO_PAD);
      pango_cairo_show_layout (cr, layout);
      if (c > 0)
        g_string_append (line, " | ");
      g_string_append (line, cells[c]);
      x += w;
    }
  /* A row is one line of the sheet's text, its cells in column order. */
  pl_wo_log (wo, line->str);
}

void
pl_wo_draw_segment (PlWorkOrder *wo, cairo_t *cr, const PlWoSegment *seg)
{
  PlWoTable *t = seg->table;
  double x0, y0, x1, y1, y = seg->y, width, top;

  pl_wo_content_box (wo, &x0, &y0, &x1, &y1);
  width = x1 - x0;
  if (seg->continued)
    {
      /* Translators: the heading of a table that goes on from the sheet
       * before, "Parts list (continued)". */
      g_autofree char *h = g_strdup_printf (_("%s (continued)"), t->heading);

      pl_wo_text (wo, cr, h, PL_WO_HEADING_MM, TRUE, x0, y, width);
    }
  else
    pl_wo_text (wo, cr, t->heading, PL_WO_HEADING_MM, TRUE, x0, y, width);
  y += t->heading_h;
  top = y;

  /* Header on a light grey band: it stays a band in black and white. */
  cairo_rectangle (cr, x0, y, width, t->header_h);
  cairo_set_source_rgb (cr, 0.85, 0.85, 0.85);
  cairo_fill (cr);
  draw_cells (wo, cr, t, t->headers, x0, y, width, TRUE);
  y += t->header_h;
  rule (cr, x0, x1, y, 2 * PL_WO_RULE_MM);

  for (guint r = seg->first_row; r < seg->first_row + seg->n_rows; r++)
    {
      double h = g_array_index (t->row_h, double, r);

      /* Every other row shaded, so a long row reads across. */
      if (r % 2 == 1)
        {
          cairo_rectangle (cr, x0, y, width, h);
          cairo_set_source_rgb (cr, 0.95, 0.95, 0.95);
          cairo_fill (cr);
        }
      if (t->rows->len == 0)
        pl_wo_text (wo, cr, t->empty_text, PL_WO_BODY_MM, FALSE, x0 + PL_WO_PAD,
                    y + PL_WO_PAD, width - 2 * PL_WO_PAD);
      else
        draw_cells (wo, cr, t, g_ptr_array_index (t->rows, r), x0, y, width, FALSE);
      y += h;
      rule (cr, x0, x1, y, PL_WO_RULE_MM);
    }

  /* Column rules and the outline. */
  {
    double x = x0;

    for (guint c = 0; c + 1 < t->n_cols && t->rows->len > 0; c++)
      {
        x += t->widths[c] * width;
        cairo_move_to (cr, x, top);
        cairo_line_to (cr, x, y);
      }
    cairo_rectangle (cr, x0, top, width, y - top);
    cairo_set_line_width (cr, PL_WO_RULE_MM);
    cairo_set_source_rgb (cr, 0.0, 0.0, 0.0);
    cairo_stroke (cr);
  }
  if (seg->last && t->note != NULL)
    pl_wo_text (wo, cr, t->note, PL_WO_SMALL_MM, FALSE, x0, y + 1.0, width);
}
