/* SPDX-License-Identifier: GPL-3.0-or-later */

#include "pressline-solver.h"

const char *
pls_status_string (pls_status status)
{
  switch (status)
    {
    case PLS_OK: return "no error";
    case PLS_ERR_NOMEM: return "out of memory";
    case PLS_ERR_INVALID: return "invalid parameter";
    case PLS_ERR_TOPOLOGY: return "nothing to solve";
    case PLS_ERR_NO_CONVERGENCE: return "no convergence";
    case PLS_ERR_LINALG: return "sparse factorisation failed";
    default: return "unknown status";
    }
}
