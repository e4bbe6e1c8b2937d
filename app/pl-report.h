/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-report.h: a results snapshot as text for people, CSV for spreadsheets
 * and JSON for programs.
 *
 *  - text: translated labels, values in the units that prefs pick
 *    (pl-units.h), grouped by part, then the findings;
 *  - CSV (RFC 4180, comma, CRLF line ends, '.' decimals whatever the
 *    locale): one table, columns
 *      part_id,tag,type,item,quantity,case,value,unit,note
 *    documented in app/data/report-json.md beside the JSON keys;
 *  - JSON: SI base units always (prefs are ignored), stable keys, format
 *    version PL_REPORT_JSON_VERSION, documented at the top of pl-report.c
 *    and in app/data/report-json.md.  A figure that is not available (not
 *    solved, not run yet, not finite) is null, never NaN.
 */
#pragma once

#include <glib.h>

#include "pl-results.h"
#include "pl-units.h"

G_BEGIN_DECLS

#define PL_REPORT_JSON_VERSION 1

typedef enum
{
  PL_REPORT_TEXT,
  PL_REPORT_CSV,
  PL_REPORT_JSON,
  PL_N_REPORT_FORMATS
} PlReportFormat;

/* "text", "csv", "json"; NULL out of range. */
const char *pl_report_format_get_key (PlReportFormat format);
/* PL_N_REPORT_FORMATS for an unknown key. */
PlReportFormat pl_report_format_from_key (const char *key);

/* The report, newly allocated UTF-8.  source names the layout (a file
 * name; NULL: none); prefs may be NULL (SI defaults). */
char *pl_report_write (const PlResults *results, PlReportFormat format,
                       const PlUnitPrefs *prefs, const char *source);

char *pl_report_write_text (const PlResults *results, const PlUnitPrefs *prefs,
                            const char *source);
char *pl_report_write_csv (const PlResults *results, const PlUnitPrefs *prefs);
char *pl_report_write_json (const PlResults *results, const char *source);

G_END_DECLS
