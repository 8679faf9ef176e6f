#!/usr/bin/env bash
# npm start: install what is missing, start PostgreSQL, migrate, seed the demo
# on an empty database, build if needed, serve on http://localhost:${PORT:-3000}.
source "$(dirname "$0")/setup.sh"

ensure_modules
ensure_session_secret
ensure_database >/dev/null
export DATABASE_URL=${DATABASE_URL:-$(bash scripts/db.sh url)}
npx tsx scripts/migrate.ts
npx tsx scripts/seed.ts
ensure_build

export PORT=${PORT:-3000}
MAIL_FAKE_STARTED=
ensure_mail
# The mail fake we started ends with the server; the database keeps running.
stop_mail() { if [ -n "$MAIL_FAKE_STARTED" ]; then kill "$MAIL_FAKE_STARTED" 2>/dev/null || true; fi; }
trap stop_mail EXIT
echo "Rootplate is serving on http://localhost:$PORT (Ctrl+C stops it; 'npm run db:stop' stops the database)"
if [ "${MAIL_FAKE:-}" = 1 ]; then echo "Mail goes to the local fake: see http://localhost:$PORT/dev/mail (signed in as a lead) or $MAIL_DIR"; fi
node .output/server/index.mjs
