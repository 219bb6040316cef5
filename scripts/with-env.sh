#!/usr/bin/env bash
# Runs one command with the local ports and folders of scripts/env.sh (the database, the fake
# S3 and SMTP servers), e.g. the database commands and the mail clock from package.json.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/env.sh"
# These commands work on the local services, whose defaults only development allows.
export NODE_ENV="${NODE_ENV:-development}"
exec "$@"
