#!/usr/bin/env bash
# npm test: the same set-up as npm start (plus Chromium), then every test:
# unit, Nuxt, API end-to-end against the real PostgreSQL, browser tests.
# Exits non-zero when anything fails. Extra arguments go to vitest.
source "$(dirname "$0")/setup.sh"

ensure_modules
ensure_chromium
ensure_poppler
ensure_session_secret
db_state=$(ensure_database)
stop_db() { if [ "$db_state" = started ]; then bash scripts/db.sh stop || true; fi; }
trap stop_db EXIT

# The tests use their own database beside it (<name>_test), dropped and made anew.
export DATABASE_URL=${DATABASE_URL:-$(bash scripts/db.sh url)}

echo "test: type-checking the geometry library (strict) and the app"
npx tsc -p geometry/tsconfig.json
npx nuxt typecheck

ensure_build

npx vitest run "$@"
