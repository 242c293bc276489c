#!/usr/bin/env bash
# Starts and stops the project's own PostgreSQL on loopback, never the system service.
#   scripts/db.sh start <name> <port> <database>   e.g. start dev 54320 drybench
#   scripts/db.sh stop <name>
#   scripts/db.sh url <name> <port> <database>     prints the connection URL
# PostgreSQL refuses to run as root, so as root every server command runs as `postgres`.
set -euo pipefail

cmd=${1:?usage: db.sh start|stop|url NAME [PORT DATABASE]}
name=${2:?name, e.g. dev or test}
port=${3:-}
database=${4:-drybench}
project=$(cd "$(dirname "$0")/.." && pwd)

as_pg() {
  if [ "$(id -u)" = 0 ]; then (cd / && runuser -u postgres -- "$@"); else "$@"; fi
}

# The data lives in the project's git-ignored .data/ when the postgres user can reach it; a
# checkout under a mode-700 home cannot be reached, so fall back to a per-checkout /var/tmp dir.
data_root() {
  local root="$project/.data"
  if [ "$(id -u)" = 0 ]; then
    mkdir -p "$root"
    if ! (cd / && runuser -u postgres -- test -x "$root"); then
      root="/var/tmp/drybench-$(printf '%s' "$project" | sha256sum | cut -c1-12)"
    fi
  fi
  mkdir -p "$root"
  [ "$(id -u)" = 0 ] && chown postgres:postgres "$root"
  printf '%s' "$root"
}

pg_bin() {
  local bin
  bin=$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1 || true)
  if [ -z "$bin" ]; then
    if [ "$(id -u)" = 0 ] && command -v apt-get >/dev/null; then
      echo "PostgreSQL server not found; installing Debian's postgresql package…" >&2
      apt-get update -qq >&2 && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq postgresql >&2
      bin=$(ls -d /usr/lib/postgresql/*/bin | sort -V | tail -n 1)
    else
      echo "PostgreSQL's server is not installed. Run: sudo apt-get install -y postgresql" >&2
      exit 1
    fi
  fi
  printf '%s' "$bin"
}

# Readings are partitioned by pg_partman (migration 0014), which Debian packages per server
# major version (postgresql-15-partman): install it beside the server, as root, when missing.
ensure_partman() {
  local bin=$1 major
  major=$(basename "$(dirname "$bin")")
  [ -f "/usr/share/postgresql/$major/extension/pg_partman.control" ] && return 0
  if [ "$(id -u)" = 0 ] && command -v apt-get >/dev/null; then
    echo "pg_partman not found; installing Debian's postgresql-$major-partman package…" >&2
    DEBIAN_FRONTEND=noninteractive apt-get install -y -qq "postgresql-$major-partman" >&2 ||
      { apt-get update -qq >&2 && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq "postgresql-$major-partman" >&2; }
  else
    echo "pg_partman is not installed. Run: sudo apt-get install -y postgresql-$major-partman" >&2
    exit 1
  fi
}

case "$cmd" in
  url)
    echo "postgres://postgres@127.0.0.1:${port:?port}/$database"
    ;;
  start)
    : "${port:?port}"
    bin=$(pg_bin)
    ensure_partman "$bin"
    root=$(data_root)
    data="$root/pg-$name"
    sock="$root/sock-$name"
    if [ ! -f "$data/PG_VERSION" ]; then
      mkdir -p "$data"
      [ "$(id -u)" = 0 ] && chown postgres:postgres "$data"
      # Trust on loopback only: this server listens on 127.0.0.1 and a private socket dir.
      as_pg "$bin/initdb" -D "$data" -U postgres --auth=trust -E UTF8 --locale=C.UTF-8 >/dev/null
    fi
    mkdir -p "$sock"
    [ "$(id -u)" = 0 ] && chown postgres:postgres "$sock"
    if ! as_pg "$bin/pg_ctl" -D "$data" status >/dev/null 2>&1; then
      # 9>&- : a caller's flock descriptor must not be inherited by the server.
      as_pg "$bin/pg_ctl" -D "$data" -l "$data/server.log" -w -t 30 \
        -o "-h 127.0.0.1 -p $port -k $sock ${PG_EXTRA_OPTS:-}" start >/dev/null 9>&-
    fi
    for _ in $(seq 1 50); do
      "$bin/pg_isready" -q -h 127.0.0.1 -p "$port" -U postgres -d postgres && break
      sleep 0.2
    done
    if ! "$bin/psql" -qtA -h 127.0.0.1 -p "$port" -U postgres -d postgres \
      -c "select 1 from pg_database where datname = '$database'" | grep -q 1; then
      "$bin/psql" -q -h 127.0.0.1 -p "$port" -U postgres -d postgres -c "create database \"$database\""
    fi
    echo "postgres://postgres@127.0.0.1:$port/$database"
    ;;
  stop)
    bin=$(pg_bin)
    data="$(data_root)/pg-$name"
    if [ -f "$data/PG_VERSION" ] && as_pg "$bin/pg_ctl" -D "$data" status >/dev/null 2>&1; then
      as_pg "$bin/pg_ctl" -D "$data" -m fast -w stop >/dev/null
    fi
    ;;
  *)
    echo "usage: db.sh start|stop|url NAME [PORT DATABASE]" >&2
    exit 2
    ;;
esac
