#!/usr/bin/env bash
# Runs a command with a throw-away PostgreSQL server (Debian's `postgresql` package) on 127.0.0.1,
# exporting RUNNEL_TEST_PG_URL for the API tests; the server and its folder are removed afterwards.
#   bash scripts/with-postgres.sh npx mocha 'spec/api/**/*.spec.ts'
set -euo pipefail

bin=$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -1 || true)
if [ -z "$bin" ] || [ ! -x "$bin/postgres" ]; then
  echo "Installing PostgreSQL from Debian for the API tests…"
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -qq
  apt-get install -y -qq postgresql >/dev/null
  bin=$(ls -d /usr/lib/postgresql/*/bin | sort -V | tail -1)
fi

port=${RUNNEL_TEST_PG_PORT:-54329}
dir=$(mktemp -d /tmp/runnel-pg-XXXXXX)
# PostgreSQL refuses to run as root: as root, the server runs as the package's postgres user.
as_pg=()
if [ "$(id -u)" = 0 ]; then
  chown postgres "$dir"
  as_pg=(runuser -u postgres --)
fi
stop() {
  "${as_pg[@]}" "$bin/pg_ctl" -D "$dir/data" -m fast stop >/dev/null 2>&1 || true
  rm -rf "$dir"
}
trap stop EXIT

"${as_pg[@]}" "$bin/initdb" -D "$dir/data" -U runnel --auth=trust -E UTF8 --locale=C.UTF-8 >/dev/null
"${as_pg[@]}" "$bin/pg_ctl" -D "$dir/data" -l "$dir/server.log" -w \
  -o "-c listen_addresses=127.0.0.1 -p $port -k $dir -c fsync=off -c max_connections=300" start >/dev/null
"$bin/createdb" -h 127.0.0.1 -p "$port" -U runnel runnel
export RUNNEL_TEST_PG_URL="postgres://runnel@127.0.0.1:$port/runnel"
echo "PostgreSQL $("$bin/postgres" --version | awk '{print $3}') on $RUNNEL_TEST_PG_URL"
"$@"
