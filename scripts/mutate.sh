#!/usr/bin/env bash
# npm run mutate: the project's list of deliberate breaks (scripts/mutate/breaks.ts),
# applied one at a time; the narrowest tests of each are run; the file is put back.
# Prints the score last. Not part of npm test. Arguments go to scripts/mutate/run.ts
# (--only id,id  --list).
source "$(dirname "$0")/setup.sh"

ensure_modules
ensure_chromium
ensure_poppler
ensure_session_secret
db_state=$(ensure_database)
stop_db() { if [ "$db_state" = started ]; then bash scripts/db.sh stop || true; fi; }
trap stop_db EXIT
export DATABASE_URL=${DATABASE_URL:-$(bash scripts/db.sh url)}

npx tsx scripts/mutate/run.ts "$@"
