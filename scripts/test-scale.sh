#!/usr/bin/env bash
# npm run test:scale: a throwaway PostgreSQL cluster and redis-server on loopback, then the API and socket tests
# on PostgreSQL and the multi-process tests (tests/scale). Everything is stopped and removed at the end.
#   scripts/test-scale.sh --env   start the services and print DATABASE_URL/REDIS_URL; stop with Ctrl-C
set -euo pipefail
cd "$(dirname "$0")/.."

PG_BIN="${PG_BIN:-$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1)}"
PG_PORT="${HOLDFIRE_SCALE_PG_PORT:-54329}"
REDIS_PORT="${HOLDFIRE_SCALE_REDIS_PORT:-63799}"

if [[ -z "$PG_BIN" || ! -x "$PG_BIN/initdb" ]] || ! command -v redis-server >/dev/null; then
  if [[ "$(id -u)" == 0 ]] && command -v apt-get >/dev/null; then
    echo "test:scale: installing postgresql and redis-server from Debian"
    apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq postgresql redis-server >/dev/null
    PG_BIN="$(ls -d /usr/lib/postgresql/*/bin | sort -V | tail -n 1)"
  else
    echo "test:scale needs PostgreSQL (initdb, pg_ctl) and redis-server: apt-get install postgresql redis-server" >&2
    exit 1
  fi
fi

WORK="$(mktemp -d /tmp/holdfire-scale-XXXXXX)"
chmod 755 "$WORK"
# PostgreSQL refuses to run as root: the cluster belongs to the postgres account (or to us when we are not root).
as_pg() {
  if [[ "$(id -u)" == 0 ]]; then runuser -u postgres -- "$@"; else "$@"; fi
}
PG_USER=holdfire
cleanup() {
  as_pg "$PG_BIN/pg_ctl" -D "$WORK/pg/data" -m immediate stop >/dev/null 2>&1 || true
  [[ -f "$WORK/redis.pid" ]] && kill "$(cat "$WORK/redis.pid")" 2>/dev/null || true
  sleep 0.2
  rm -rf "$WORK"
}
trap cleanup EXIT
trap 'exit 130' INT TERM

mkdir "$WORK/pg"
[[ "$(id -u)" == 0 ]] && chown postgres "$WORK/pg"
as_pg "$PG_BIN/initdb" -D "$WORK/pg/data" -U "$PG_USER" --auth=trust -E UTF8 --no-locale >/dev/null
# A test cluster: durability matters less than speed here (the log's own code asks for a durable commit either way).
as_pg "$PG_BIN/pg_ctl" -D "$WORK/pg/data" -l "$WORK/pg/server.log" -w start \
  -o "-h 127.0.0.1 -p $PG_PORT -k $WORK/pg -c fsync=off -c synchronous_commit=off -c full_page_writes=off -c max_connections=300" >/dev/null

redis-server --port "$REDIS_PORT" --bind 127.0.0.1 --save '' --appendonly no --daemonize yes \
  --pidfile "$WORK/redis.pid" --logfile "$WORK/redis.log" --dir "$WORK"
for _ in $(seq 50); do [[ -s "$WORK/redis.pid" ]] && break; sleep 0.1; done

export DATABASE_URL="postgres://$PG_USER@127.0.0.1:$PG_PORT/postgres"
export REDIS_URL="redis://127.0.0.1:$REDIS_PORT"

if [[ "${1:-}" == "--env" ]]; then
  echo "export DATABASE_URL=$DATABASE_URL"
  echo "export REDIS_URL=$REDIS_URL"
  echo "(Ctrl-C stops both and removes $WORK)"
  sleep infinity &
  wait $!
fi

# (a) API and socket tests on PostgreSQL: each test app makes and drops its own database; tests that only make
#     sense on a SQLite file skip themselves (onPostgres in tests/helpers/app.ts). Every file here takes about
#     3 minutes on PostgreSQL on a loaded 2-core machine, which with (b) passes the 4-minute budget, so by default
#     a subset runs: access (every route of every route file, for every role), the count, socket and log suites,
#     the races, sessions, uploads (evidence), sensor data (bytea) and anomalies (BIGINT instants), plus one
#     functional file per remaining route family. HOLDFIRE_SCALE_ALL=1 runs every file of tests/api.
# (b) Two processes on one PostgreSQL behind the Redis adapter, and the PostgreSQL log writer (tests/scale).
API_SUBSET=(
  access counts count-socket count-export socket races
  auth setup people profile session-end session-touch
  hazards evidence sensors anomalies stations-crew notifications
)
if [[ $# -gt 0 ]]; then
  npx vitest run "$@"
else
  if [[ -n "${HOLDFIRE_SCALE_ALL:-}" ]]; then files=(tests/api); else files=("${API_SUBSET[@]/#/tests/api/}"); files=("${files[@]/%/.test.ts}"); fi
  REDIS_URL= npx vitest run --project node "${files[@]}"
  npx vitest run --project scale
fi
