#!/usr/bin/env bash
# npm run dev: database, migrations, seed, the local mail fake, then nuxt dev with hot reload.
source "$(dirname "$0")/setup.sh"

ensure_modules
ensure_session_secret
ensure_database >/dev/null
export DATABASE_URL=${DATABASE_URL:-$(bash scripts/db.sh url)}
npx tsx scripts/migrate.ts
npx tsx scripts/seed.ts
MAIL_FAKE_STARTED=
ensure_mail
stop_mail() { if [ -n "$MAIL_FAKE_STARTED" ]; then kill "$MAIL_FAKE_STARTED" 2>/dev/null || true; fi; }
trap stop_mail EXIT
npx nuxt dev
