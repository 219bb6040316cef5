#!/usr/bin/env bash
# Everything `npm start` and `npm test` need before they run, each step skipped when already done:
# packages, PostgreSQL, the local fakes, migrations, the demo studio, the web export.
#   scripts/setup.sh             all of it
#   scripts/setup.sh --services  packages, PostgreSQL and the fakes only
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/env.sh"
cd "$ROOT"

hash_of() { cat "$@" 2>/dev/null | sha256sum | cut -c1-64; }

# 1. Packages: npm ci when node_modules is missing or older than the lock file.
want="$(hash_of package.json package-lock.json)"
if [[ ! -d node_modules || "$(cat node_modules/.basted-installed 2>/dev/null)" != "$want" ]]; then
  say "installing packages (npm ci) ..."
  npm ci --no-audit --no-fund --loglevel=error
  echo "$want" >node_modules/.basted-installed
fi

# 2. Services.
bash scripts/pg.sh start
bash scripts/fakes.sh start
[[ "${1:-}" == "--services" ]] && exit 0

# 3. Schema and demo data (both idempotent). The seed reads the local fakes' settings, which the
#    server configuration allows only with NODE_ENV=development (not set for the whole script:
#    expo export reads NODE_ENV too).
NODE_ENV=development node --import tsx db/cli.ts migrate
NODE_ENV=development node --import tsx db/cli.ts seed

# 4. The production server bundle (esbuild), rebuilt only when the server's sources changed.
server_hash="$(find server db -type f -name '*.ts' 2>/dev/null | LC_ALL=C sort | xargs cat | cat - scripts/build-server.mjs package-lock.json | sha256sum | cut -c1-64)"
if [[ ! -f dist-server/index.js || "$(cat dist-server/.source-hash 2>/dev/null)" != "$server_hash" ]]; then
  say "building the server (esbuild) ..."
  node scripts/build-server.mjs
  echo "$server_hash" >dist-server/.source-hash
fi

# 5. The web app, rebuilt only when its sources changed.
sources="$(find app components hooks constants assets server/domain -type f 2>/dev/null | LC_ALL=C sort;
  echo app.json babel.config.js metro.config.js tsconfig.json package-lock.json)"
web_hash="$(echo "$sources" | xargs cat 2>/dev/null | cat - <(echo "$sources") | sha256sum | cut -c1-64)"
if [[ ! -f dist/index.html || "$(cat dist/.source-hash 2>/dev/null)" != "$web_hash" ]]; then
  say "exporting the web app (expo export) ..."
  rm -rf dist
  expo export --platform web --output-dir dist >"$BASTED_DATA_DIR/logs/web-export.log" 2>&1 \
    || { tail -n 40 "$BASTED_DATA_DIR/logs/web-export.log" >&2; say "web export failed"; exit 1; }
  node scripts/precompress.mjs dist >>"$BASTED_DATA_DIR/logs/web-export.log"
  echo "$web_hash" >dist/.source-hash
fi
