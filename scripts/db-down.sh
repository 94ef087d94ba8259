#!/usr/bin/env bash
# Stops the local PostgreSQL started by db-up.sh. Harmless when it is not running.
set -euo pipefail
source "$(dirname "$0")/lib.sh"
pg_down "${TAUTLINE_PG_DATA:-$ROOT/.data/pg}"
