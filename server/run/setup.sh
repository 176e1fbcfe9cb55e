#!/usr/bin/env bash
# Shared set-up for `npm start` and `npm test`: system packages, node modules, PostgreSQL,
# migrations, the demo seed and the production build. Source it; it exports the environment.
#   setup.sh <database-name> [--with-browser] [--no-build]
set -euo pipefail
ROOT=$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)
cd "$ROOT"
DB_NAME=${1:?database name}
shift
WITH_BROWSER=0; BUILD=1
for a in "$@"; do
  case "$a" in --with-browser) WITH_BROWSER=1 ;; --no-build) BUILD=0 ;; esac
done
export NEXT_TELEMETRY_DISABLED=1

# 1. System packages from Debian (PostgreSQL is installed by db/cluster.sh when needed).
need=()
[ "$WITH_BROWSER" = 1 ] && [ ! -x /usr/bin/chromium ] && need+=(chromium)
[ "$WITH_BROWSER" = 1 ] && ! command -v mosquitto >/dev/null && [ ! -x /usr/sbin/mosquitto ] && need+=(mosquitto)
# gcc (with the C library headers) compiles every exported C header in the tests; never skipped.
[ "$WITH_BROWSER" = 1 ] && [ ! -x /usr/bin/gcc ] && need+=(gcc)
[ "$WITH_BROWSER" = 1 ] && [ ! -f /usr/include/stdio.h ] && need+=(libc6-dev)
if [ ${#need[@]} -gt 0 ]; then
  if [ "$(id -u)" = 0 ]; then
    echo "Installing Debian packages: ${need[*]}"
    apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq "${need[@]}" >/dev/null
  else
    echo "Missing packages. Run as root: apt-get update && apt-get install -y ${need[*]}" >&2; exit 1
  fi
fi

# 2. Node modules, installed from the lock file when missing or stale.
if [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
  echo "Installing node modules…"
  npm ci --no-audit --no-fund --loglevel=error
fi

# 3. The session secret: from the environment, or generated once into a git-ignored file that only
#    this user may read (0600; a secret readable by others lets them forge any session).
mkdir -p .data
if [ -z "${SESSION_SECRET:-}" ]; then
  [ -s .data/session-secret ] || (umask 077 && node -e 'process.stdout.write(require("crypto").randomBytes(32).toString("hex"))' > .data/session-secret)
  chown "$(id -u):$(id -g)" .data/session-secret
  chmod 600 .data/session-secret
  SESSION_SECRET=$(cat .data/session-secret)
  export SESSION_SECRET
fi

# 4. PostgreSQL on loopback unless DATABASE_URL points elsewhere: migrations and the seed run as the
#    schema's owner, the app connects as a role that owns nothing (see db/cluster.sh).
if [ -z "${DATABASE_URL:-}" ]; then
  bash db/cluster.sh start "$DB_NAME"
  MIGRATION_DATABASE_URL=$(bash db/cluster.sh url "$DB_NAME")
  DATABASE_URL=$(bash db/cluster.sh url "$DB_NAME" --app)
  export DATABASE_URL MIGRATION_DATABASE_URL
fi

# 5. Schema (with the app role's grants) and demo data.
node --import tsx migrations/run.ts
if [ "${DEMO:-1}" = 1 ]; then node --import tsx db/seed-run.ts; fi

# 6. Production build, redone only when a source file changed.
if [ "$BUILD" = 1 ]; then
  if [ ! -f .next/BUILD_ID ] || [ -n "$(find app components lib db next.config.ts tailwind.config.ts package-lock.json -newer .next/BUILD_ID -print -quit 2>/dev/null)" ]; then
    echo "Building the web app…"
    node_modules/.bin/next build
  fi
fi
