/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-work-order.h: the work order, a set of sheets a technician takes to
 * the line, drawn with cairo for PDF, SVG, PNG and printing alike.
 *
 * Sheet one: the diagram fitted to the drawing area with its result
 * annotations (pressures at gauges and key nodes, the dose at each
 * applicator), a legend (pressure ramp and the symbols used), the title
 * block (work order, line, site, author, date, revision, file name, program
 * version, sheet) and the units used.  The following sheets: the parts
 * list, the gauges to fit with the readings to expect, the dose per
 * applicator, the design-check findings and the safety cautions.  A table
 * that does not fit continues on a new sheet under its repeated header.
 * Every sheet says "Sheet N of M".  Everything is drawn in the print style
 * (black and greys on white): shape carries the meaning.
 *
 * The sheets are laid out once, when the work order is made, with one Pango
 * context whose metrics do not depend on the target (unhinted), so a
 * printer, a PDF and a PNG get the same pages.
 *
 * Multi-sheet SVG and PNG: neither format has pages, so each sheet is its
 * own file at the paper's size: sheet one in the file named, sheet N in the
 * same name with "-N" before the extension (work.png, work-2.png, ...).
 * Each carries a generator mark, by which a later export with fewer
 * sheets removes the ones left over.  PDF holds every sheet as a page.
 */
#pragma once

#include <cairo.h>
#include <glib-object.h>

#include "pl-document.h"
#include "pl-results.h"
#include "pl-units.h"

G_BEGIN_DECLS

#define PL_WORK_ORDER_ERROR (pl_work_order_error_quark ())
GQuark pl_work_order_error_quark (void);

typedef enum
{
  PL_WORK_ORDER_ERROR_WRITE,     /* the file could not be written */
  PL_WORK_ORDER_ERROR_RENDER,    /* cairo failed (out of memory, ...) */
  PL_WORK_ORDER_ERROR_FORMAT,    /* unknown format or file name extension */
} PlWorkOrderError;

typedef enum
{
  PL_PAPER_A4,
  PL_PAPER_LETTER,
  PL_PAPER_A3,
  PL_N_PAPERS
} PlPaper;

typedef enum
{
  PL_ORIENTATION_PORTRAIT,
  PL_ORIENTATION_LANDSCAPE,
  PL_ORIENTATION_AUTO,        /* by the diagram's shape: pl_orientation_resolve */
  PL_N_ORIENTATIONS
} PlOrientation;

typedef enum
{
  PL_WORK_ORDER_PDF,
  PL_WORK_ORDER_SVG,
  PL_WORK_ORDER_PNG,
  PL_N_WORK_ORDER_FORMATS
} PlWorkOrderFormat;

/* Stable ASCII keys: "a4", "letter", "a3"; "portrait", "landscape", "auto"; "pdf",
 * "svg", "png" (also the file name extensions).  NULL out of range; the
 * from_key functions give the PL_N_ value for an unknown key. */
const char *pl_paper_get_key (PlPaper paper);
PlPaper pl_paper_from_key (const char *key);
/* Translated name, "A4 (210 × 297 mm)". */
const char *pl_paper_get_label (PlPaper paper);
/* Width and height (mm) of the paper in that orientation: ISO 216 A4
 * 210 x 297 and A3 297 x 420; ANSI/ASME Y14.1 Letter 8.5 x 11 in.
 * PL_ORIENTATION_AUTO gives portrait: resolve it first. */
void pl_paper_get_size (PlPaper paper, PlOrientation orientation, double *width_mm,
                        double *height_mm);
/* Portrait or landscape: orientation itself unless it is AUTO; for AUTO
 * landscape when the diagram's extent (pl_geometry_document_bounds) is
 * wider than tall by more than the paper's aspect (long side over short
 * side, about 1.41 for A4), else portrait (an empty layout too). */
PlOrientation pl_orientation_resolve (PlOrientation orientation, PlPaper paper,
                                      PlDocument *doc);
const char *pl_orientation_get_key (PlOrientation orientation);
PlOrientation pl_orientation_from_key (const char *key);
const char *pl_work_order_format_get_key (PlWorkOrderFormat format);
PlWorkOrderFormat pl_work_order_format_from_key (const char *key);
/* From a file name's extension (any case); PL_N_WORK_ORDER_FORMATS if
 * none fits. */
PlWorkOrderFormat pl_work_order_format_from_filename (const char *filename);

/* The resolutions a PNG may have (dots per inch); the default. */
#define PL_WORK_ORDER_MIN_DPI 50.0
#define PL_WORK_ORDER_MAX_DPI 600.0
#define PL_WORK_ORDER_DEFAULT_DPI 150.0

typedef struct
{
  double width_mm, height_mm;   /* the sheet; see pl_paper_get_size */
  PlUnitPrefs units;
  const char *file_name;        /* shown in the title block (its base name);
                                 * NULL: the layout has not been saved */
} PlWorkOrderOptions;

/* A4 portrait, SI units, no file name. */
void pl_work_order_options_init (PlWorkOrderOptions *opts);

#define PL_TYPE_WORK_ORDER (pl_work_order_get_type ())
G_DECLARE_FINAL_TYPE (PlWorkOrder, pl_work_order, PL, WORK_ORDER, GObject)

/* Lays out the sheets of doc with results.  results should be a full solve
 * of doc's present revision (pl_solve_scheduler_solve_sync): readings the
 * snapshot lacks (a cycle that failed or has not run) are printed as not
 * available, never guessed.  results may be NULL (no figures at all).
 * Keeps references to both; doc must not change while the work order
 * lives (copy it for that). */
PlWorkOrder *pl_work_order_new (PlDocument *doc, PlResults *results,
                                const PlWorkOrderOptions *opts);

guint pl_work_order_get_n_sheets (PlWorkOrder *self);
void pl_work_order_get_sheet_size (PlWorkOrder *self, double *width_mm, double *height_mm);
/* Draws sheet index (0-based) with cr, whose user units must be mm with
 * the sheet's top left corner at the origin.  The cairo state is saved
 * and restored.  Returns cr's status afterwards. */
cairo_status_t pl_work_order_draw_sheet (PlWorkOrder *self, cairo_t *cr, guint index);
/* The text drawn on a sheet (title block, tables, notes, cautions; not the
 * diagram's own labels), one item a line, for an SVG's description and
 * for tests.  Newly allocated. */
char *pl_work_order_get_sheet_text (PlWorkOrder *self, guint index);

/* The file name of sheet index for SVG and PNG: filename itself for sheet
 * 0, "NAME-N.EXT" for sheet N - 1.  Newly allocated. */
char *pl_work_order_sheet_filename (const char *filename, guint index);
/* Writes the work order as format to filename (PNG at dpi; dpi is ignored
 * for PDF and SVG).  Every file is rendered in memory first and then
 * written through a temporary file renamed over the target, so a failure
 * never leaves half a file.  FALSE with error naming the file. */
gboolean pl_work_order_write (PlWorkOrder *self, PlWorkOrderFormat format, double dpi,
                              const char *filename, GError **error);
/* The same; then, for SVG and PNG, the sheets an earlier export to the
 * same name left beyond the new sheet count are removed: NAME-K.EXT for
 * K past the count, one after the other while each exists and carries
 * Pressline's generator mark (an SVG <metadata> element, a PNG tEXt
 * "Software" chunk); the first gap or foreign file ends it, and nothing
 * else is ever deleted.  removed (may be NULL) gets the names removed
 * (newly allocated strings; the array frees them with g_free). */
gboolean pl_work_order_write_full (PlWorkOrder *self, PlWorkOrderFormat format, double dpi,
                                   const char *filename, GPtrArray *removed, GError **error);

G_END_DECLS
