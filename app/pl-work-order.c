/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-work-order.c: the work order object: papers and keys, gathering the
 * tables, laying out the sheets, drawing one sheet, and the text helpers
 * every part of a sheet uses.
 */
#include "config.h"

#include "pl-work-order.h"
#include "pl-work-order-private.h"
#include "pl-geometry.h"

#include <glib/gi18n.h>
#include <string.h>

G_DEFINE_QUARK (pl-work-order-error-quark, pl_work_order_error)

G_DEFINE_FINAL_TYPE (PlWorkOrder, pl_work_order, G_TYPE_OBJECT)

/* --- papers and keys --- */

/* ISO 216 (A4 210 x 297 mm, A3 297 x 420 mm); ANSI/ASME Y14.1 (Letter
 * 8.5 x 11 in = 215.9 x 279.4 mm). */
static const struct
{
  const char *key;
  const char *label;
  double width, height;
} papers[PL_N_PAPERS] = {
  { "a4", N_("A4 (210 × 297 mm)"), 210.0, 297.0 },
  { "letter", N_("US Letter (8.5 × 11 in)"), 215.9, 279.4 },
  { "a3", N_("A3 (297 × 420 mm)"), 297.0, 420.0 },
};

static const char *const orientation_keys[PL_N_ORIENTATIONS] = { "portrait", "landscape",
                                                                  "auto" };
static const char *const format_keys[PL_N_WORK_ORDER_FORMATS] = { "pdf", "svg", "png" };

static guint
key_index (const char *const *keys, guint n, const char *key)
{
  for (guint i = 0; i < n; i++)
    if (key != NULL && g_str_equal (keys[i], key))
      return i;
  return n;
}

const char *
pl_paper_get_key (PlPaper paper)
{
  return (guint) paper < PL_N_PAPERS ? papers[paper].key : NULL;
}

PlPaper
pl_paper_from_key (const char *key)
{
  for (guint i = 0; i < PL_N_PAPERS; i++)
    if (key != NULL && g_str_equal (papers[i].key, key))
      return i;
  return PL_N_PAPERS;
}

const char *
pl_paper_get_label (PlPaper paper)
{
  return (guint) paper < PL_N_PAPERS ? _(papers[paper].label) : NULL;
}

void
pl_paper_get_size (PlPaper paper, PlOrientation orientation, double *width_mm,
                   double *height_mm)
{
  double w, h;

  g_return_if_fail ((guint) paper < PL_N_PAPERS);
  w = papers[paper].width;
  h = papers[paper].height;
  if (orientation == PL_ORIENTATION_LANDSCAPE)
    {
      double t = w;

      w = h;
      h = t;
    }
  if (width_mm != NULL)
    *width_mm = w;
  if (height_mm != NULL)
    *height_mm = h;
}

PlOrientation
pl_orientation_resolve (PlOrientation orientation, PlPaper paper, PlDocument *doc)
{
  double w, h;
  PlRect extent;

  if (orientation != PL_ORIENTATION_AUTO)
    return orientation;
  g_return_val_if_fail ((guint) paper < PL_N_PAPERS, PL_ORIENTATION_PORTRAIT);
  if (doc == NULL || !pl_geometry_document_bounds (doc, &extent))
    return PL_ORIENTATION_PORTRAIT;
  pl_paper_get_size (paper, PL_ORIENTATION_PORTRAIT, &w, &h);
  return extent.x1 - extent.x0 > (extent.y1 - extent.y0) * (h / w) ? PL_ORIENTATION_LANDSCAPE
                                                : PL_ORIENTATION_PORTRAIT;
}

const char *
pl_orientation_get_key (PlOrientation orientation)
{
  return (guint) orientation < PL_N_ORIENTATIONS ? orientation_keys[orientation] : NULL;
}

PlOrientation
pl_orientation_from_key (const char *key)
{
  return key_index (orientation_keys, PL_N_ORIENTATIONS, key);
}

const char *
pl_work_order_format_get_key (PlWorkOrderFormat format)
{
  return (guint) format < PL_N_WORK_ORDER_FORMATS ? format_keys[format] : NULL;
}

PlWorkOrderFormat
pl_work_order_format_from_key (const char *key)
{
  return key_index (format_keys, PL_N_WORK_ORDER_FORMATS, key);
}

PlWorkOrderFormat
pl_work_order_format_from_filename (const char *filename)
{
  const char *dot = filename != NULL ? strrchr (filename, '.') : NULL;
  g_autofree char *ext = NULL;

  if (dot == NULL || strchr (dot, G_DIR_SEPARATOR) != NULL)
    return PL_N_WORK_ORDER_FORMATS;
  ext = g_ascii_strdown (dot + 1, -1);
  return pl_work_order_format_from_key (ext);
}

void
pl_work_order_options_init (PlWorkOrderOptions *opts)
{
  g_return_if_fail (opts != NULL);
  memset (opts, 0, sizeof *opts);
  pl_paper_get_size (PL_PAPER_A4, PL_ORIENTATION_PORTRAIT, &opts->width_mm, &opts->height_mm);
  pl_unit_prefs_init (&opts->units, PL_UNIT_SYSTEM_SI);
}

/* --- text --- */

void
pl_wo_content_box (PlWorkOrder *wo, double *x0, double *y0, double *x1, double *y1)
{
  *x0 = PL_WO_MARGIN + PL_WO_INSET;
  *y0 = PL_WO_MARGIN + PL_WO_INSET;
  *x1 = wo->opts.width_mm - PL_WO_MARGIN - PL_WO_INSET;
  *y1 = wo->opts.height_mm - PL_WO_MARGIN - PL_WO_FOOTER - PL_WO_INSET;
}

PangoLayout *
pl_wo_layout (PlWorkOrder *wo, const char *text, double size, gboolean bold, double width)
{
  PangoLayout *layout = pango_layout_new (wo->pango);
  PangoFontDescription *font = pango_font_description_from_string ("Sans");

  /* Absolute sizes: one Pango unit of size is one user unit, a mm here. */
  pango_font_description_set_absolute_size (font, size * PANGO_SCALE);
  pango_font_description_set_weight (font, bold ? PANGO_WEIGHT_BOLD : PANGO_WEIGHT_NORMAL);
  pango_layout_set_font_description (layout, font);
  pango_font_description_free (font);
  if (width > 0.0)
    {
      pango_layout_set_width (layout, (int) (width * PANGO_SCALE));
      pango_layout_set_wrap (layout, PANGO_WRAP_WORD_CHAR);
    }
  pango_layout_set_text (layout, text != NULL ? text : "", -1);
  return layout;
}

void
pl_wo_layout_size (PangoLayout *layout, double *width, double *height)
{
  PangoRectangle logical;

  pango_layout_get_extents (layout, NULL, &logical);
  if (width != NULL)
    *width = (double) logical.width / PANGO_SCALE;
  if (height != NULL)
    *height = (double) logical.height / PANGO_SCALE;
}

void
pl_wo_log (PlWorkOrder *wo, const char *text)
{
  if (wo->log != NULL && text != NULL && *text != '\0')
    {
      g_string_append (wo->log, text);
      g_string_append_c (wo->log, '\n');
    }
}

void
pl_wo_show (PlWorkOrder *wo, cairo_t *cr, PangoLayout *layout, double x, double y)
{
  cairo_set_source_rgb (cr, 0.0, 0.0, 0.0);
  cairo_move_to (cr, x, y);
  pango_cairo_show_layout (cr, layout);
  pl_wo_log (wo, pango_layout_get_text (layout));
}

double
pl_wo_text (PlWorkOrder *wo, cairo_t *cr, const char *text, double size, gboolean bold,
            double x, double y, double width)
{
  g_autoptr (PangoLayout) layout = pl_wo_layout (wo, text, size, bold, width);
  double h;

  pl_wo_layout_size (layout, NULL, &h);
  pl_wo_show (wo, cr, layout, x, y);
  return h;
}

/* --- the object --- */

static void
pl_work_order_finalize (GObject *object)
{
  PlWorkOrder *self = PL_WORK_ORDER (object);

  g_clear_object (&self->doc);
  g_clear_pointer (&self->results, pl_results_unref);
  g_clear_pointer (&self->file_name, g_free);
  g_clear_object (&self->pango);
  g_clear_pointer (&self->tables, g_ptr_array_unref);
  g_clear_pointer (&self->cautions, g_ptr_array_unref);
  g_clear_pointer (&self->segments, g_array_unref);
  G_OBJECT_CLASS (pl_work_order_parent_class)->finalize (object);
}

static void
pl_work_order_class_init (PlWorkOrderClass *klass)
{
  G_OBJECT_CLASS (klass)->finalize = pl_work_order_finalize;
}

static void
pl_work_order_init (PlWorkOrder *self)
{
  self->tables = g_ptr_array_new_with_free_func ((GDestroyNotify) pl_wo_table_free);
  self->segments = g_array_new (FALSE, FALSE, sizeof (PlWoSegment));
}

/* A Pango context whose metrics do not depend on where the sheets go:
 * unhinted metrics and glyph positions, so a line breaks at the same word
 * on a printer, in a PDF and in a 72 dpi PNG. */
static PangoContext *
measuring_context (void)
{
  PangoFontMap *map = pango_cairo_font_map_get_default ();
  PangoContext *context = pango_font_map_create_context (map);
  cairo_font_options_t *options = cairo_font_options_create ();

  cairo_font_options_set_hint_metrics (options, CAIRO_HINT_METRICS_OFF);
  cairo_font_options_set_hint_style (options, CAIRO_HINT_STYLE_NONE);
  pango_cairo_context_set_font_options (context, options);
  cairo_font_options_destroy (options);
  pango_context_set_round_glyph_positions (context, FALSE);
  pango_context_set_language (context, pango_language_get_default ());
  return context;
}

PlWorkOrder *
pl_work_order_new (PlDocument *doc, PlResults *results, const PlWorkOrderOptions *opts)
{
  PlWorkOrder *self;

  g_return_val_if_fail (PL_IS_DOCUMENT (doc), NULL);
  g_return_val_if_fail (opts != NULL, NULL);
  g_return_val_if_fail (opts->width_mm > 4 * PL_WO_MARGIN && opts->height_mm > 4 * PL_WO_MARGIN,
                        NULL);

  self = g_object_new (PL_TYPE_WORK_ORDER, NULL);
  self->doc = g_object_ref (doc);
  self->results = results != NULL ? pl_results_ref (results) : NULL;
  self->opts = *opts;
  self->file_name = opts->file_name != NULL ? g_path_get_basename (opts->file_name) : NULL;
  self->opts.file_name = self->file_name;
  self->pango = measuring_context ();

  g_ptr_array_add (self->tables, pl_wo_parts_table (self));
  g_ptr_array_add (self->tables, pl_wo_gauges_table (self));
  g_ptr_array_add (self->tables, pl_wo_doses_table (self));
  g_ptr_array_add (self->tables, pl_wo_findings_table (self));
  for (guint i = 0; i < self->tables->len; i++)
    pl_wo_table_measure (self, g_ptr_array_index (self->tables, i));
  self->cautions = pl_wo_cautions ();
  pl_wo_measure_cautions (self);
  pl_wo_paginate (self);
  return self;
}

guint
pl_work_order_get_n_sheets (PlWorkOrder *self)
{
  g_return_val_if_fail (PL_IS_WORK_ORDER (self), 0);
  return self->n_sheets;
}

void
pl_work_order_get_sheet_size (PlWorkOrder *self, double *width_mm, double *height_mm)
{
  g_return_if_fail (PL_IS_WORK_ORDER (self));
  if (width_mm != NULL)
    *width_mm = self->opts.width_mm;
  if (height_mm != NULL)
    *height_mm = self->opts.height_mm;
}

static void
draw_sheet (PlWorkOrder *self, cairo_t *cr, guint index)
{
  cairo_save (cr);
  cairo_rectangle (cr, 0, 0, self->opts.width_mm, self->opts.height_mm);
  cairo_clip (cr);
  cairo_set_source_rgb (cr, 1.0, 1.0, 1.0);
  cairo_paint (cr);
  pl_wo_draw_frame (self, cr, index);
  if (index == 0)
    pl_wo_draw_diagram_sheet (self, cr);
  else
    for (guint i = 0; i < self->segments->len; i++)
      {
        const PlWoSegment *seg = &g_array_index (self->segments, PlWoSegment, i);

        if (seg->sheet != index)
          continue;
        if (seg->table != NULL)
          pl_wo_draw_segment (self, cr, seg);
        else
          pl_wo_draw_cautions (self, cr, seg->y);
      }
  cairo_restore (cr);
}

cairo_status_t
pl_work_order_draw_sheet (PlWorkOrder *self, cairo_t *cr, guint index)
{
  g_return_val_if_fail (PL_IS_WORK_ORDER (self), CAIRO_STATUS_NULL_POINTER);
  g_return_val_if_fail (cr != NULL, CAIRO_STATUS_NULL_POINTER);
  g_return_val_if_fail (index < self->n_sheets, CAIRO_STATUS_INVALID_INDEX);

  if (cairo_status (cr) != CAIRO_STATUS_SUCCESS)
    return cairo_status (cr);
  draw_sheet (self, cr, index);
  return cairo_status (cr);
}

char *
pl_work_order_get_sheet_text (PlWorkOrder *self, guint index)
{
  cairo_surface_t *surface;
  cairo_t *cr;

  g_return_val_if_fail (PL_IS_WORK_ORDER (self), NULL);
  g_return_val_if_fail (index < self->n_sheets, NULL);

  /* Draw into nothing and keep what was written. */
  surface = cairo_recording_surface_create (CAIRO_CONTENT_COLOR_ALPHA, NULL);
  cr = cairo_create (surface);
  self->log = g_string_new (NULL);
  draw_sheet (self, cr, index);
  cairo_destroy (cr);
  cairo_surface_destroy (surface);
  return g_string_free (g_steal_pointer (&self->log), FALSE);
}
