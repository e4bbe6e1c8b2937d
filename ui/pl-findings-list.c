/* SPDX-License-Identifier: GPL-3.0-or-later */

#include "config.h"

#include "pl-findings-list.h"

const char *
pl_finding_get_icon_name (pls_severity severity)
{
  switch (severity)
    {
    case PLS_SEVERITY_ERROR:
      return "dialog-error-symbolic";
    case PLS_SEVERITY_WARNING:
      return "dialog-warning-symbolic";
    case PLS_SEVERITY_INFO:
    default:
      return "dialog-information-symbolic";
    }
}
