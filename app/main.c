/* SPDX-License-Identifier: GPL-3.0-or-later */

#include "config.h"

#include "pl-cli.h"

int
main (int argc, char **argv)
{
  return pl_cli_run (argc, argv);
}
