#!/usr/bin/env bash
# `npm test`: the same set-up as `npm start` against test databases, then Vitest and Playwright.
set -uo pipefail
ROOT=$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)
cd "$ROOT"
set -e
# End-to-end runs start from a fresh demo database so earlier runs leave nothing behind.
if [ -z "${DATABASE_URL:-}" ]; then
  bash db/cluster.sh start >/dev/null
  bash db/cluster.sh drop tapwright_e2e
fi
source server/run/setup.sh tapwright_e2e --with-browser
set +e
E2E_DATABASE_URL=$DATABASE_URL
if [ -z "${TEST_DATABASE_URL:-}" ]; then
  bash db/cluster.sh start tapwright_test >/dev/null
  TEST_DATABASE_URL=$(bash db/cluster.sh url tapwright_test)
  # The database-role tests connect as the app's role too.
  TEST_APP_DATABASE_URL=$(bash db/cluster.sh url tapwright_test --app)
  export TEST_DATABASE_URL TEST_APP_DATABASE_URL
fi
mkdir -p .data/reports

# Lint first: an error (or a warning) fails the run, and its report is printed here.
npm run --silent lint
lint=$?
node_modules/.bin/vitest run --reporter=default --reporter=json --outputFile.json=.data/reports/vitest.json
unit=$?
DATABASE_URL=$E2E_DATABASE_URL PLAYWRIGHT_JSON_OUTPUT_NAME=.data/reports/playwright.json \
  node_modules/.bin/playwright test --reporter=list,json
e2e=$?

LINT_STATUS=$lint node -e '
const fs = require("fs");
const read = (f) => { try { return JSON.parse(fs.readFileSync(f, "utf8")); } catch { return null; } };
const v = read(".data/reports/vitest.json"), p = read(".data/reports/playwright.json");
const passed = (v?.numPassedTests ?? 0) + (p?.stats?.expected ?? 0);
const failed = (v ? v.numFailedTests : 1) + (p ? p.stats.unexpected : 1) + (process.env.LINT_STATUS === "0" ? 0 : 1);
const skipped = (v?.numPendingTests ?? 0) + (p?.stats?.skipped ?? 0);
console.log(`${passed} passed, ${failed} failed, ${skipped} skipped`);
'
[ "$lint" = 0 ] && [ "$unit" = 0 ] && [ "$e2e" = 0 ]
