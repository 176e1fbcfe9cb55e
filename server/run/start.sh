#!/usr/bin/env bash
# `npm start`: set everything up, then run the web app, the local mail catcher and the sidecar
# (broker, live filters, deployments, outbox, demo rig) under a supervisor that restarts whichever dies.
set -euo pipefail
ROOT=$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)
cd "$ROOT"
# The demo starts with a production filter on one channel (see DEMO_PRODUCTION in lib/demo/lab.ts).
export DEMO_PRODUCTION=${DEMO_PRODUCTION:-1}
source server/run/setup.sh tapwright
export PORT=${PORT:-3000}

cat <<MSG

  Tapwright is starting on http://127.0.0.1:$PORT
  (sidecar http://127.0.0.1:${SIDECAR_PORT:-3001}/health, MQTT 127.0.0.1:${MQTT_PORT:-1883}, mail catcher 127.0.0.1:${SMTP_PORT:-2525})
  Demo accounts (password: ${DEMO_PASSWORD:-tapwright-demo}):
    operator@tapwright.test   engineer@tapwright.test
    lead@tapwright.test       admin@tapwright.test
  A process that dies is restarted with a back-off; Ctrl-C stops all.
  PostgreSQL keeps running; stop it with: bash db/cluster.sh stop

MSG
exec node --import tsx server/run/supervise-main.ts
