# Sourced by start.sh and test.sh: the shared set-up steps.
# Installs what is missing, starts the project's PostgreSQL, keeps a session secret.
set -euo pipefail
ROOT=$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)
cd "$ROOT"
mkdir -p .data

ensure_modules() {
  if [ ! -d node_modules ] || [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
    echo "setup: installing node modules (npm ci)..."
    npm ci --no-fund --no-audit
  fi
}

# Set once, kept in the ignored data folder, so sessions survive restarts.
ensure_session_secret() {
  if [ -z "${NUXT_SESSION_PASSWORD:-}" ]; then
    if [ ! -s .data/session-password ]; then
      (umask 077; node -e "process.stdout.write(require('crypto').randomBytes(32).toString('hex'))" > .data/session-password)
    fi
    NUXT_SESSION_PASSWORD=$(cat .data/session-password)
    export NUXT_SESSION_PASSWORD
  fi
}

# Prints "started" or "running" (see db.sh); uses DATABASE_URL when given.
ensure_database() {
  if [ -n "${DATABASE_URL:-}" ]; then
    echo external
  else
    bash scripts/db.sh start
  fi
}

ensure_chromium() {
  if [ ! -x /usr/bin/chromium ]; then
    [ "$(id -u)" = 0 ] || { echo "setup: Chromium is missing; as root: apt-get install chromium" >&2; exit 1; }
    echo "setup: installing Debian's chromium for the browser tests (once)..."
    DEBIAN_FRONTEND=noninteractive timeout 900 apt-get install -y -qq --no-install-recommends chromium >/dev/null 2>&1 \
      || { apt-get update -qq && DEBIAN_FRONTEND=noninteractive timeout 900 apt-get install -y -qq --no-install-recommends chromium >/dev/null; }
  fi
}

# The template tests render pages with pdftoppm to look at them; they never skip, so it must be here.
ensure_poppler() {
  command -v pdftoppm >/dev/null 2>&1 && return 0
  [ "$(id -u)" = 0 ] || { echo "setup: pdftoppm is missing; as root: apt-get install poppler-utils" >&2; exit 1; }
  echo "setup: installing Debian's poppler-utils (pdftoppm) for the template tests (once)..."
  # A fresh machine often has no package lists yet: read them and try again before giving up.
  DEBIAN_FRONTEND=noninteractive timeout 600 apt-get install -y -qq --no-install-recommends poppler-utils >/dev/null 2>&1 \
    || { apt-get update -qq && DEBIAN_FRONTEND=noninteractive timeout 600 apt-get install -y -qq --no-install-recommends poppler-utils >/dev/null; } \
    || true
  command -v pdftoppm >/dev/null 2>&1 || { echo "setup: could not install poppler-utils (pdftoppm); the template tests need it: apt-get install poppler-utils" >&2; exit 1; }
}

# Builds when there is no build or any source is newer than it.
ensure_build() {
  local stamp=.output/nitro.json
  if [ ! -f "$stamp" ] || [ -n "$(find pages components composables layouts middleware plugins stores server geometry shared assets public app.vue error.vue nuxt.config.ts tailwind.config.ts package-lock.json -newer "$stamp" -type f 2>/dev/null | head -n 1)" ]; then
    echo "setup: building (nuxt build)..."
    npx nuxt build > .data/build.log 2>&1 || { tail -n 40 .data/build.log >&2; echo "setup: the build failed (full log in .data/build.log)" >&2; exit 1; }
  fi
}

# Without SMTP_URL, mail goes to the project's local SMTP fake, which writes
# each message as an .eml file into MAIL_DIR (.data/mail). Its port is
# SMTP_PORT, by default PORT + 1025, so two checkouts on two web ports never
# share one. It lives as long as the shell that started it (see start.sh).
ensure_mail() {
  if [ -n "${SMTP_URL:-}" ]; then return 0; fi
  export MAIL_DIR=${MAIL_DIR:-$ROOT/.data/mail}
  local port=${SMTP_PORT:-$(( ${PORT:-3000} + 1025 ))}
  local pidfile=.data/mail-fake.pid pid fport
  if [ -f "$pidfile" ] && read -r pid fport < "$pidfile" && [ "$fport" = "$port" ] && kill -0 "$pid" 2>/dev/null; then
    echo "setup: reusing the mail fake on port $port (pid $pid)"
  else
    rm -f "$pidfile"
    SMTP_PORT=$port MAIL_FAKE_PID=$pidfile node --import tsx scripts/mail-fake.ts > .data/mail-fake.log 2>&1 &
    MAIL_FAKE_STARTED=$!
    for _ in $(seq 1 150); do
      [ -s "$pidfile" ] && break
      kill -0 "$MAIL_FAKE_STARTED" 2>/dev/null || { cat .data/mail-fake.log >&2; echo "setup: the mail fake did not start" >&2; exit 1; }
      sleep 0.2
    done
    [ -s "$pidfile" ] || { echo "setup: the mail fake did not start in 30 s" >&2; exit 1; }
    echo "setup: mail fake on 127.0.0.1:$port, messages in $MAIL_DIR"
  fi
  export SMTP_URL="smtp://127.0.0.1:$port" MAIL_FAKE=1 NUXT_PUBLIC_MAIL_PAGE=1
}
