#!/usr/bin/env bash
# npm run bench: every benchmark in scripts/bench/, each printing its figures
# and ratios to its goal. Benchmarks measure; they never fail the build.
source "$(dirname "$0")/setup.sh"

ensure_modules
ensure_session_secret
ensure_database >/dev/null
export DATABASE_URL=${DATABASE_URL:-$(bash scripts/db.sh url)}
npx tsx scripts/migrate.ts >/dev/null
npx tsx scripts/seed.ts >/dev/null

for bench in scripts/bench/*.ts; do
  case "$(basename "$bench")" in canvas.ts|load.ts|export-load.ts|accounts-load.ts|stalls.ts) continue ;; esac
  echo "== $(basename "$bench" .ts)"
  npx tsx "$bench"
  echo
done

ensure_chromium
ensure_build
# These drive the built server.
echo "== load"
npx tsx scripts/bench/load.ts
echo
echo "== export-load"
npx tsx scripts/bench/export-load.ts
echo
echo "== accounts-load"
npx tsx scripts/bench/accounts-load.ts
echo "== stalls"
npx tsx scripts/bench/stalls.ts
echo
echo "== canvas"
npx tsx scripts/bench/canvas.ts
