/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-work-order-frame.c: what frames every sheet (border, footer with the
 * sheet number) and the title block of sheet one with the units used.
 */
#include "config.h"

#include "pl-work-order-private.h"

#include <glib/gi18n.h>

static const char *
unit_symbol (PlWorkOrder *wo, PlQuantity q)
{
  const PlUnit *u = pl_unit_get (pl_unit_prefs_get_unit (&wo->opts.units, q));

  return u != NULL ? u->symbol : "";
}

char *
pl_wo_units_statement (PlWorkOrder *wo)
{
  /* Translators: the units of a work order; the %s are unit symbols:
   * pressure, flow, small lengths, line lengths, mass, time. */
  return g_strdup_printf (_("Pressures are gauge pressures in %s; flows in %s; bores and "
                            "orifices in %s; lengths in %s; masses in %s; times in %s."),
                          unit_symbol (wo, PL_QUANTITY_PRESSURE),
                          unit_symbol (wo, PL_QUANTITY_FLOW),
                          unit_symbol (wo, PL_QUANTITY_LENGTH),
                          unit_symbol (wo, PL_QUANTITY_LINE_LENGTH),
                          unit_symbol (wo, PL_QUANTITY_MASS),
                          unit_symbol (wo, PL_QUANTITY_TIME));
}

static const char *
title_text (PlWorkOrder *wo, const char *key)
{
  const char *text = pl_part_get_text (pl_document_get_title (wo->doc), key);

  return text != NULL && *text != '\0' ? text : "–";
}

/* "DEMO-0001 · Board laminator 2": how the footer names the set. */
static char *
set_name (PlWorkOrder *wo)
{
  /* Translators: the footer of every sheet: the work order's number and
   * the line's name. */
  return g_strdup_printf (_("Pressline work order %s · %s"), title_text (wo, "work-order"),
                          title_text (wo, "line"));
}

static char *
sheet_number (PlWorkOrder *wo, guint sheet)
{
  /* Translators: the page number of a work order, "Sheet 2 of 3". */
  return g_strdup_printf (_("Sheet %u of %u"), sheet + 1, wo->n_sheets);
}

void
pl_wo_draw_frame (PlWorkOrder *wo, cairo_t *cr, guint sheet)
{
  double w = wo->opts.width_mm, h = wo->opts.height_mm, fy = h - PL_WO_MARGIN - PL_WO_FOOTER;
  g_autofree char *name = set_name (wo);
  g_autofree char *number = sheet_number (wo, sheet);
  g_autoptr (PangoLayout) right = pl_wo_layout (wo, number, PL_WO_BODY_MM, TRUE, -1);
  double rw, rh;

  cairo_rectangle (cr, PL_WO_MARGIN, PL_WO_MARGIN, w - 2 * PL_WO_MARGIN, h - 2 * PL_WO_MARGIN);
  cairo_move_to (cr, PL_WO_MARGIN, fy);
  cairo_line_to (cr, w - PL_WO_MARGIN, fy);
  cairo_set_line_width (cr, PL_WO_FRAME_MM);
  cairo_set_source_rgb (cr, 0.0, 0.0, 0.0);
  cairo_stroke (cr);

  pl_wo_layout_size (right, &rw, &rh);
  pl_wo_show (wo, cr, right, w - PL_WO_MARGIN - PL_WO_INSET - rw,
              fy + 0.5 * (PL_WO_FOOTER - rh));
  {
    g_autoptr (PangoLayout) left = pl_wo_layout (wo, name, PL_WO_SMALL_MM, FALSE, -1);
    double lh, room = w - 2 * (PL_WO_MARGIN + PL_WO_INSET) - rw - 4.0;

    /* A long line name is cut short rather than run into the number. */
    pango_layout_set_width (left, (int) (room * PANGO_SCALE));
    pango_layout_set_ellipsize (left, PANGO_ELLIPSIZE_END);
    pl_wo_layout_size (left, NULL, &lh);
    pl_wo_show (wo, cr, left, PL_WO_MARGIN + PL_WO_INSET, fy + 0.5 * (PL_WO_FOOTER - lh));
  }
}

/* --- the title block --- */

#define TITLE_LABEL_W 24.0

typedef struct
{
  const char *label;
  char *value;
} TitleRow;

static GArray *
title_rows (PlWorkOrder *wo)
{
  const PlPartType *type = pl_part_get_part_type (pl_document_get_title (wo->doc));
  GArray *rows = g_array_new (FALSE, FALSE, sizeof (TitleRow));
  static const char *const keys[] = { "work-order", "line", "site", "author", "date",
                                      "revision" };
  TitleRow row;

  for (guint i = 0; i < G_N_ELEMENTS (keys); i++)
    {
      const PlParamSpec *spec = pl_part_type_find_param (type, keys[i], NULL);

      row = (TitleRow) { spec != NULL ? _(spec->label) : keys[i],
                         g_strdup (title_text (wo, keys[i])) };
      g_array_append_val (rows, row);
    }
  row = (TitleRow) { _("File"), g_strdup (wo->file_name != NULL ? wo->file_name
                                                                : _("not saved")) };
  g_array_append_val (rows, row);
  row = (TitleRow) { _("Program"), g_strdup ("Pressline " PACKAGE_VERSION) };
  g_array_append_val (rows, row);
  row = (TitleRow) { _("Sheet"), g_strdup_printf (_("%u of %u"), 1, wo->n_sheets) };
  g_array_append_val (rows, row);
  row = (TitleRow) { _("Units"), pl_wo_units_statement (wo) };
  g_array_append_val (rows, row);
  return rows;
}

static void
title_rows_free (GArray *rows)
{
  for (guint i = 0; i < rows->len; i++)
    g_free (g_array_index (rows, TitleRow, i).value);
  g_array_unref (rows);
}

static double
row_height (PlWorkOrder *wo, const TitleRow *row, double width, PangoLayout **label,
            PangoLayout **value)
{
  double lh, vh;

  *label = pl_wo_layout (wo, row->label, PL_WO_SMALL_MM, FALSE, TITLE_LABEL_W - PL_WO_PAD);
  *value = pl_wo_layout (wo, row->value, PL_WO_BODY_MM, TRUE,
                         width - TITLE_LABEL_W - 2 * PL_WO_PAD);
  pl_wo_layout_size (*label, NULL, &lh);
  pl_wo_layout_size (*value, NULL, &vh);
  return MAX (lh, vh) + 2 * PL_WO_PAD;
}

static double
heading_height (PlWorkOrder *wo, double width, PangoLayout **layout)
{
  double h;

  *layout = pl_wo_layout (wo, _("Work order"), PL_WO_HEADING_MM, TRUE,
                          width - 2 * PL_WO_PAD);
  pl_wo_layout_size (*layout, NULL, &h);
  return h + 2 * PL_WO_PAD;
}

double
pl_wo_title_block_height (PlWorkOrder *wo, double width)
{
  GArray *rows = title_rows (wo);
  PangoLayout *a, *b;
  double h = heading_height (wo, width, &a);

  g_object_unref (a);
  for (guint i = 0; i < rows->len; i++)
    {
      h += row_height (wo, &g_array_index (rows, TitleRow, i), width, &a, &b);
      g_object_unref (a);
      g_object_unref (b);
    }
  title_rows_free (rows);
  return h;
}

void
pl_wo_draw_title_block (PlWorkOrder *wo, cairo_t *cr, double x, double y, double width)
{
  GArray *rows = title_rows (wo);
  PangoLayout *a, *b;
  double top = y, h = heading_height (wo, width, &a);

  cairo_rectangle (cr, x, y, width, h);
  cairo_set_source_rgb (cr, 0.85, 0.85, 0.85);
  cairo_fill (cr);
  pl_wo_show (wo, cr, a, x + PL_WO_PAD, y + PL_WO_PAD);
  g_object_unref (a);
  y += h;
  cairo_set_line_width (cr, PL_WO_RULE_MM);
  for (guint i = 0; i < rows->len; i++)
    {
      g_autofree char *line = NULL;

      h = row_height (wo, &g_array_index (rows, TitleRow, i), width, &a, &b);
      cairo_set_source_rgb (cr, 0.0, 0.0, 0.0);
      cairo_move_to (cr, x, y);
      cairo_line_to (cr, x + width, y);
      cairo_stroke (cr);
      /* Drawn without the log: the pair goes in as one line. */
      cairo_move_to (cr, x + PL_WO_PAD, y + PL_WO_PAD);
      pango_cairo_show_layout (cr, a);
      cairo_move_to (cr, x + TITLE_LABEL_W + PL_WO_PAD, y + PL_WO_PAD);
      pango_cairo_show_layout (cr, b);
      line = g_strdup_printf ("%s: %s", pango_layout_get_text (a), pango_layout_get_text (b));
      pl_wo_log (wo, line);
      g_object_unref (a);
      g_object_unref (b);
      y += h;
    }
  cairo_move_to (cr, x + TITLE_LABEL_W, top + heading_height (wo, width, &a));
  g_object_unref (a);
  cairo_line_to (cr, x + TITLE_LABEL_W, y);
  cairo_rectangle (cr, x, top, width, y - top);
  cairo_set_line_width (cr, 2 * PL_WO_RULE_MM);
  cairo_stroke (cr);
  title_rows_free (rows);
}
