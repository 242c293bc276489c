#!/usr/bin/env bash
# npm start: everything a fresh machine needs to serve the live demo on http://127.0.0.1:8080.
set -euo pipefail
cd "$(dirname "$0")/.."
export PORT=${PORT:-8080}
PG_PORT=${PG_PORT:-54320}
# A second copy (another PORT) needs its own PG_NAME and PG_PORT, or it would share and then
# stop this one's database.
PG_NAME=${PG_NAME:-dev}
tokens=.data/demo-sensors-$PG_NAME.json

bash scripts/ensure-deps.sh
export DATABASE_URL=$(bash scripts/db.sh start "$PG_NAME" "$PG_PORT" drybench)
echo "PostgreSQL running on 127.0.0.1:$PG_PORT (data in the git-ignored .data/)."

pids=()
cleanup() {
  trap - EXIT INT TERM
  for pid in "${pids[@]}"; do kill -TERM "$pid" 2>/dev/null || true; done
  wait 2>/dev/null || true
  bash scripts/db.sh stop "$PG_NAME"
  echo "Stopped the server, the demo sensors, the MQTT broker, the S3 fake and PostgreSQL."
}
trap cleanup EXIT INT TERM

# A per-checkout session secret, made once and kept in .data/ (never committed).
secret_file=.data/session-secret
[ -s "$secret_file" ] || (umask 077 && head -c 48 /dev/urandom | base64 | tr -d '\n' > "$secret_file")
export SESSION_SECRET=$(cat "$secret_file")
# The MQTT broker's service password, shared by the broker and the server, made the same way.
mqtt_secret_file=.data/mqtt-password
[ -s "$mqtt_secret_file" ] || (umask 077 && head -c 33 /dev/urandom | base64 | tr -d '\n/+' > "$mqtt_secret_file")
export MQTT_PASSWORD=$(cat "$mqtt_secret_file")
MQTT_PORT=${MQTT_PORT:-1883}
export WEB_DIR=dist
# Mail goes to the server's own SMTP server on loopback; /dev/outbox shows what it received.
export DEV_OUTBOX=${DEV_OUTBOX:-true}

# Plain node with the tsx loader (not npx): one process each, so $! is the process itself.
run_ts=(node --import tsx)

# Photos go to a local S3 fake (s3rver on loopback, objects in .data/) unless S3_BUCKET names
# real object storage. s3rver accepts only its well-known key pair.
if [ -z "${S3_BUCKET:-}" ]; then
  S3_PORT=${S3_PORT:-54325}
  export S3_ENDPOINT=http://127.0.0.1:$S3_PORT S3_BUCKET=drybench-photos
  export S3_ACCESS_KEY_ID=S3RVER S3_SECRET_ACCESS_KEY=S3RVER
  "${run_ts[@]}" scripts/s3-fake.ts --port "$S3_PORT" --dir ".data/s3-$PG_NAME" --bucket "$S3_BUCKET" &
  pids+=($!)
fi

"${run_ts[@]}" scripts/migrate.ts
"${run_ts[@]}" scripts/seed.ts "$tokens"
bash scripts/build-web.sh
bash scripts/build-server.sh

# Our MQTT broker (server/mqtt/broker.ts) on loopback: sensors' tokens are checked against the
# database, and the server subscribes to it with MQTT_PASSWORD.
MQTT_PORT=$MQTT_PORT "${run_ts[@]}" scripts/broker.ts &
pids+=($!)
export MQTT_URL=mqtt://127.0.0.1:$MQTT_PORT

# The server's Node flags live in one file the bench reads too.
mapfile -t server_flags < <(grep -v '^\s*\(#\|$\)' scripts/server-node-flags)
node --enable-source-maps "${server_flags[@]}" .build/server.mjs &
pids+=($!)
for _ in $(seq 1 100); do
  node -e "fetch('http://127.0.0.1:$PORT/api/v1/health').then((r) => process.exit(r.ok ? 0 : 1), () => process.exit(1))" && break
  sleep 0.2
done
# One demo sensor publishes over MQTT, the others post over HTTP.
"${run_ts[@]}" scripts/simulate.ts --url "http://127.0.0.1:$PORT" --tokens "$tokens" \
  --mqtt "$MQTT_URL" --mqtt-sensors 1 &
pids+=($!)

echo
echo "Drybench is running: http://127.0.0.1:$PORT   (Ctrl-C stops everything)"
echo "MQTT broker for sensors: mqtt://127.0.0.1:$MQTT_PORT"
[ "$DEV_OUTBOX" = true ] && echo "Mail it sent (invitations, password resets): http://127.0.0.1:$PORT/dev/outbox"
echo
wait -n "${pids[@]}" || true
