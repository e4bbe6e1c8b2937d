/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-work-order-private.h: what the work order's files share: the sheet
 * geometry, text through one Pango context, tables and their pagination.
 */
#pragma once

#include <pango/pangocairo.h>

#include "pl-work-order.h"

G_BEGIN_DECLS

/* Sizes on the sheet (mm), the project's own choices: text of 3 mm is
 * about 8.5 pt, the smallest a technician reads without effort at arm's
 * length (common practice, no source). */
#define PL_WO_MARGIN 10.0       /* paper edge to the frame */
#define PL_WO_INSET 4.0         /* frame to the content */
#define PL_WO_FOOTER 8.0        /* the strip with the sheet number */
#define PL_WO_TITLE_MM 6.0      /* the sheet's heading */
#define PL_WO_HEADING_MM 4.2    /* a table's heading */
#define PL_WO_BODY_MM 3.0       /* table cells, the title block */
#define PL_WO_SMALL_MM 2.5      /* notes under tables, labels of fields */
#define PL_WO_PAD 1.2           /* inside a table cell */
#define PL_WO_GAP 6.0           /* between blocks */
#define PL_WO_RULE_MM 0.25      /* table rules */
#define PL_WO_FRAME_MM 0.5      /* the frame */

/* A table: a heading, column headers, rows of text, a note under it. */
typedef struct
{
  char *heading;
  guint n_cols;
  char **headers;            /* n_cols strings */
  double *widths;            /* n_cols fractions of the content width */
  GPtrArray *rows;           /* char ** of n_cols strings each */
  char *empty_text;          /* the one row shown when there are none */
  char *note;                /* under the table's last part, or NULL */
  /* measured by pl_wo_table_measure */
  double heading_h, header_h, note_h;
  GArray *row_h;             /* double per row (one row for empty_text) */
} PlWoTable;

/* One piece of the following sheets: a run of a table's rows, or the
 * cautions box (table NULL). */
typedef struct
{
  guint sheet;
  PlWoTable *table;
  guint first_row, n_rows;
  gboolean continued;        /* the table began on an earlier sheet */
  gboolean last;             /* its note follows */
  double y;                  /* top (mm) */
} PlWoSegment;

struct _PlWorkOrder
{
  GObject parent_instance;

  PlDocument *doc;
  PlResults *results;
  PlWorkOrderOptions opts;
  char *file_name;              /* base name shown, or NULL */
  PangoContext *pango;          /* every layout of the sheets */
  GPtrArray *tables;            /* PlWoTable, in sheet order */
  GPtrArray *cautions;          /* char *, one caution each */
  double cautions_h;
  GArray *segments;             /* PlWoSegment */
  guint n_sheets;
  GString *log;                 /* the text of the sheet being drawn, or NULL */
};

/* The content box of every sheet (mm). */
void pl_wo_content_box (PlWorkOrder *wo, double *x0, double *y0, double *x1, double *y1);

/* A layout of text at size mm, bold or not, wrapped at width mm (<= 0: one
 * line); its extent in mm. */
PangoLayout *pl_wo_layout (PlWorkOrder *wo, const char *text, double size, gboolean bold,
                           double width);
void pl_wo_layout_size (PangoLayout *layout, double *width, double *height);
/* Draws layout with its top left at (x, y) in black, and adds its text to
 * the sheet's text. */
void pl_wo_show (PlWorkOrder *wo, cairo_t *cr, PangoLayout *layout, double x, double y);
/* Both in one: returns the height drawn. */
double pl_wo_text (PlWorkOrder *wo, cairo_t *cr, const char *text, double size, gboolean bold,
                   double x, double y, double width);
/* A caption-and-value pair of the title block as one log line. */
void pl_wo_log (PlWorkOrder *wo, const char *text);

/* pl-work-order-frame.c: the frame and footer of every sheet; the title
 * block and units statement of sheet one. */
void pl_wo_draw_frame (PlWorkOrder *wo, cairo_t *cr, guint sheet);
double pl_wo_title_block_height (PlWorkOrder *wo, double width);
void pl_wo_draw_title_block (PlWorkOrder *wo, cairo_t *cr, double x, double y, double width);
/* "Units: pressure bar (gauge), flow L/min, ...", newly allocated. */
char *pl_wo_units_statement (PlWorkOrder *wo);

/* pl-work-order-diagram.c: sheet one. */
void pl_wo_draw_diagram_sheet (PlWorkOrder *wo, cairo_t *cr);

/* pl-work-order-table.c */
PlWoTable *pl_wo_table_new (const char *heading, guint n_cols, const char *const *headers,
                            const double *widths, const char *empty_text);
void pl_wo_table_free (PlWoTable *table);
/* Takes the n_cols strings of cells (a NULL-free vector of n_cols). */
void pl_wo_table_add_row (PlWoTable *table, char **cells);
void pl_wo_table_measure (PlWorkOrder *wo, PlWoTable *table);
/* Lays out the tables and then the cautions box on sheets 1, 2, ... */
void pl_wo_paginate (PlWorkOrder *wo);
void pl_wo_draw_segment (PlWorkOrder *wo, cairo_t *cr, const PlWoSegment *seg);

/* pl-work-order-parts.c: the parts list. */
PlWoTable *pl_wo_parts_table (PlWorkOrder *wo);
/* pl-work-order-gauges.c: the gauges to fit and the dose per applicator. */
PlWoTable *pl_wo_gauges_table (PlWorkOrder *wo);
PlWoTable *pl_wo_doses_table (PlWorkOrder *wo);
/* A figure or the dash of "not available". */
char *pl_wo_format (PlWorkOrder *wo, PlQuantity quantity, gboolean ok, double si);
/* pl-work-order-findings.c: the design-check findings; the cautions. */
PlWoTable *pl_wo_findings_table (PlWorkOrder *wo);
GPtrArray *pl_wo_cautions (void);
void pl_wo_measure_cautions (PlWorkOrder *wo);
void pl_wo_draw_cautions (PlWorkOrder *wo, cairo_t *cr, double y);

G_END_DECLS
