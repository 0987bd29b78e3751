#!/usr/bin/env bash
# The integration tests against a throwaway PostgreSQL: Debian's server binaries,
# a temporary data directory, a free port on 127.0.0.1, unix sockets inside the
# directory. Each test file creates its own database there (tests/setup.ts).
# The server is stopped and the directory removed on exit; the exit status is vitest's.
#
#   npm run test:postgres                        # the database-touching test folders
#   npm run test:postgres -- tests/services/x.test.ts   # just these files
set -euo pipefail
cd "$(dirname "$0")/.."

bin=""
for dir in $(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V); do
  [ -x "$dir/initdb" ] && [ -x "$dir/pg_ctl" ] && bin="$dir"
done
if [ -z "$bin" ]; then
  echo "test:postgres: no PostgreSQL server under /usr/lib/postgresql/*/bin (Debian: apt-get install -y postgresql)" >&2
  exit 2
fi

# PostgreSQL refuses to run as root: as root, the server runs as the postgres OS user.
if [ "$(id -u)" = 0 ]; then
  id postgres >/dev/null 2>&1 || { echo "test:postgres: running as root, but there is no postgres OS user" >&2; exit 2; }
  as_server() { runuser -u postgres -- "$@"; }
else
  as_server() { "$@"; }
fi

tmp="$(mktemp -d "${TMPDIR:-/tmp}/heatpath-pg-XXXXXX")"
[ "$(id -u)" = 0 ] && chown postgres:postgres "$tmp"
chmod 700 "$tmp"
started=0
cleanup() {
  if [ "$started" = 1 ]; then as_server "$bin/pg_ctl" -D "$tmp/data" -m immediate -w stop >/dev/null 2>&1 || true; fi
  rm -rf "$tmp"
}
trap cleanup EXIT
trap 'exit 130' INT TERM

port="$(node -e 'const s=require("net").createServer().listen(0,"127.0.0.1",()=>{console.log(s.address().port);s.close()})')"

as_server "$bin/initdb" -D "$tmp/data" -U postgres -A trust -E UTF8 --locale=C --no-sync >"$tmp/initdb.log" 2>&1 \
  || { cat "$tmp/initdb.log" >&2; exit 2; }
# A throwaway cluster: durability settings off, loopback only, sockets in the temp directory.
as_server "$bin/pg_ctl" -D "$tmp/data" -l "$tmp/server.log" -w -t 60 \
  -o "-c listen_addresses=127.0.0.1 -p $port -k $tmp -c fsync=off -c synchronous_commit=off -c full_page_writes=off -c max_connections=200" \
  start >/dev/null || { cat "$tmp/server.log" >&2; exit 2; }
started=1
echo "test:postgres: PostgreSQL $("$bin/postgres" --version | awk '{print $NF}') on 127.0.0.1:$port ($tmp)"

export HEATPATH_TEST_PG_ADMIN_URL="postgres://postgres@127.0.0.1:$port/postgres"
unset DATABASE_URL
if [ "$#" -gt 0 ]; then
  targets=("$@")
else
  targets=(tests/services tests/db tests/api tests/seeders tests/lib)
fi
# vitest runs in the background so that a signal (Ctrl-C, CI's timeout) stops it and the server at once.
node_modules/.bin/vitest run --maxWorkers="${HEATPATH_TEST_PG_WORKERS:-2}" "${targets[@]}" &
vitest_pid=$!
trap 'kill "$vitest_pid" 2>/dev/null || true; wait "$vitest_pid" 2>/dev/null || true; exit 130' INT TERM
status=0
wait "$vitest_pid" || status=$?
exit "$status"
