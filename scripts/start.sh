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
echo "Rootplate is serving on http://localhost:$PORT (Ctrl+C stops it; 'npm run db:stop' stops the database)"
exec node .output/server/index.mjs
