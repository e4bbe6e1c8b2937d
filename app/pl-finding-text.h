/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-finding-text.h: the sentences people read for findings (results
 * panel, work order).
 *
 * The solver writes its findings in English with fixed units; the figure
 * and its limit travel with each finding in SI.  Here every known code gets
 * a translatable sentence that names the part by its tag and restates the
 * figures in the user's units.  Codes this file does not know (and the
 * findings app/ writes itself, already translated) keep their message.
 */
#pragma once

#include <glib.h>

#include "pl-results.h"
#include "pl-units.h"

G_BEGIN_DECLS

/* The sentence for finding (one of results' findings; results gives the
 * tags and the check limits).  prefs may be NULL (SI).  Newly allocated. */
char *pl_finding_format_sentence (const PlFinding *finding, const PlResults *results,
                                  const PlUnitPrefs *prefs);
/* Translated severity word, "Error", "Warning", "Note". */
const char *pl_finding_get_severity_label (pls_severity severity);

G_END_DECLS
