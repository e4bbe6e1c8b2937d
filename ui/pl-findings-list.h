/* SPDX-License-Identifier: GPL-3.0-or-later
 *
 * pl-findings-list.h: how the results panel marks findings.  The sentences
 * themselves come from app/ (pl-finding-text.h), shared with the work order.
 */
#pragma once

#include <gtk/gtk.h>

#include "pl-finding-text.h"

G_BEGIN_DECLS

/* A themed icon name for the severity. */
const char *pl_finding_get_icon_name (pls_severity severity);

G_END_DECLS
