/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-work-order-findings.c: the design-check findings (the same sentences
 * as the editor's results panel) and the safety cautions box.
 */
#include "config.h"

#include "pl-work-order-private.h"

#include <glib/gi18n.h>

#include "pl-finding-text.h"

PlWoTable *
pl_wo_findings_table (PlWorkOrder *wo)
{
  const char *headers[] = { _("Severity"), _("Part"), _("Finding") };
  static const double widths[] = { 0.12, 0.09, 0.79 };
  PlWoTable *t = pl_wo_table_new (_("Findings of the design checks"), 3, headers, widths,
                                  wo->results != NULL ? _("No findings: every check passed.")
                                                      : _("The layout was not solved."));
  PlCompiled *compiled;

  if (wo->results == NULL)
    return t;
  compiled = pl_results_get_compiled (wo->results);
  for (guint i = 0; i < pl_results_get_n_findings (wo->results); i++)
    {
      const PlFinding *f = pl_results_get_finding (wo->results, i);
      const PlCompiledPart *p = f->part_id != NULL ? pl_compiled_find_part (compiled,
                                                                            f->part_id)
                                                   : NULL;
      char **cells = g_new0 (char *, 4);

      cells[0] = g_strdup (pl_finding_get_severity_label (f->severity));
      cells[1] = g_strdup (p != NULL ? p->tag : "–");
      cells[2] = pl_finding_format_sentence (f, wo->results, &wo->opts.units);
      pl_wo_table_add_row (t, cells);
    }
  return t;
}

/* The usual cautions for high-pressure fluid lines, in the words of this
 * project; they defer to local codes and qualified practice. */
GPtrArray *
pl_wo_cautions (void)
{
  GPtrArray *list = g_ptr_array_new_with_free_func (g_free);

  g_ptr_array_add (list, g_strdup (_("Injection hazard: fluid at high pressure can pierce "
                                     "the skin and cause serious injury. Never put a hand "
                                     "or any part of the body in front of an applicator, a "
                                     "leak or a loose fitting. An injection needs a doctor "
                                     "at once, even if it looks small.")));
  g_ptr_array_add (list, g_strdup (_("Stored energy: accumulators and hoses hold fluid "
                                     "under pressure after the pump stops, and an "
                                     "accumulator's gas keeps its charge even when the line "
                                     "is empty.")));
  g_ptr_array_add (list, g_strdup (_("Before breaking any connection, lock out the air and "
                                     "drain the line (dump valve or drain open), and verify "
                                     "zero pressure on a gauge.")));
  g_ptr_array_add (list, g_strdup (_("This sheet supports, and does not replace, local codes "
                                     "and qualified practice: local codes and qualified "
                                     "practice govern.")));
  return list;
}

static double
cautions_width (PlWorkOrder *wo)
{
  double x0, y0, x1, y1;

  pl_wo_content_box (wo, &x0, &y0, &x1, &y1);
  return x1 - x0;
}

/* The box: a heading, then each caution after a filled triangle. */
#define CAUTION_PAD 3.0
#define CAUTION_MARK 6.0

static double
caution_text_width (PlWorkOrder *wo)
{
  return cautions_width (wo) - 2 * CAUTION_PAD - CAUTION_MARK;
}

void
pl_wo_measure_cautions (PlWorkOrder *wo)
{
  double h = 2 * CAUTION_PAD, th;

  {
    g_autoptr (PangoLayout) l = pl_wo_layout (wo, _("Safety cautions"), PL_WO_HEADING_MM,
                                              TRUE, -1);

    pl_wo_layout_size (l, NULL, &th);
    h += th + 1.5;
  }
  for (guint i = 0; i < wo->cautions->len; i++)
    {
      g_autoptr (PangoLayout) l = pl_wo_layout (wo, g_ptr_array_index (wo->cautions, i),
                                                PL_WO_BODY_MM, FALSE, caution_text_width (wo));

      pl_wo_layout_size (l, NULL, &th);
      h += th + 1.5;
    }
  wo->cautions_h = h;
}

/* A warning mark of our own: a filled triangle with a white bar and dot. */
static void
caution_mark (cairo_t *cr, double x, double y, double size)
{
  cairo_move_to (cr, x + 0.5 * size, y);
  cairo_line_to (cr, x + size, y + 0.9 * size);
  cairo_line_to (cr, x, y + 0.9 * size);
  cairo_close_path (cr);
  cairo_set_source_rgb (cr, 0.0, 0.0, 0.0);
  cairo_fill (cr);
  cairo_set_source_rgb (cr, 1.0, 1.0, 1.0);
  cairo_rectangle (cr, x + 0.44 * size, y + 0.3 * size, 0.12 * size, 0.33 * size);
  cairo_rectangle (cr, x + 0.44 * size, y + 0.7 * size, 0.12 * size, 0.1 * size);
  cairo_fill (cr);
}

void
pl_wo_draw_cautions (PlWorkOrder *wo, cairo_t *cr, double y)
{
  double x0, y0, x1, y1, yy = y + CAUTION_PAD;

  pl_wo_content_box (wo, &x0, &y0, &x1, &y1);
  /* A doubled outline sets the box apart from the tables. */
  cairo_rectangle (cr, x0, y, x1 - x0, wo->cautions_h);
  cairo_set_line_width (cr, 1.0);
  cairo_set_source_rgb (cr, 0.0, 0.0, 0.0);
  cairo_stroke (cr);
  cairo_rectangle (cr, x0 + 1.0, y + 1.0, x1 - x0 - 2.0, wo->cautions_h - 2.0);
  cairo_set_line_width (cr, PL_WO_RULE_MM);
  cairo_stroke (cr);

  yy += pl_wo_text (wo, cr, _("Safety cautions"), PL_WO_HEADING_MM, TRUE, x0 + CAUTION_PAD,
                    yy, -1) + 1.5;
  for (guint i = 0; i < wo->cautions->len; i++)
    {
      double h;

      caution_mark (cr, x0 + CAUTION_PAD, yy + 0.2, 0.75 * CAUTION_MARK * 0.7);
      h = pl_wo_text (wo, cr, g_ptr_array_index (wo->cautions, i), PL_WO_BODY_MM, FALSE,
                      x0 + CAUTION_PAD + CAUTION_MARK, yy, caution_text_width (wo));
      yy += h + 1.5;
    }
}
