#!/usr/bin/env bash
# The integration tests, then the PostgreSQL part of the browser suite, against a
# throwaway PostgreSQL: Debian's server binaries, a temporary data directory, a free
# port on 127.0.0.1, unix sockets inside the directory. Each integration test file
# creates its own database there (tests/setup.ts); each browser app server set gets
# its own too (tests/browser/server.ts), started with DATABASE_URL. The server is
# stopped and the directory removed on exit; the exit status is the first failure's.
#
#   npm run test:postgres                                # integration folders + browser subset
#   npm run test:postgres -- tests/services/x.test.ts   # just these files
#   npm run test:postgres -- tests/browser/cases.test.ts  # browser files run in the browser project
#   HEATPATH_TEST_PG_BROWSER=0 npm run test:postgres     # the integration folders only
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
unit=()
browser=()
if [ "$#" -gt 0 ]; then
  for arg in "$@"; do
    case "$arg" in
      tests/browser/*) browser+=("$arg") ;;
      *) unit+=("$arg") ;;
    esac
  done
else
  unit=(tests/services tests/db tests/api tests/seeders tests/lib)
  # The PostgreSQL subset of the browser suite: the app on DATABASE_URL, two app servers on one
  # database with mail claimed once, the engineer → reviewer and steward four-eyes journeys.
  # Not here: the SQLite crash test, and pages whose database use the journeys already cover.
  if [ "${HEATPATH_TEST_PG_BROWSER:-1}" != 0 ]; then
    browser=(tests/browser/database.test.ts tests/browser/concurrency.test.ts tests/browser/cases.test.ts tests/browser/library.test.ts tests/browser/foundation.test.ts)
  fi
fi

# vitest runs in the background so that a signal (Ctrl-C, CI's timeout) stops it and the server at once.
run_vitest() {
  node_modules/.bin/vitest run "$@" &
  vitest_pid=$!
  trap 'kill "$vitest_pid" 2>/dev/null || true; wait "$vitest_pid" 2>/dev/null || true; exit 130' INT TERM
  local rc=0
  wait "$vitest_pid" || rc=$?
  trap 'exit 130' INT TERM
  return "$rc"
}

status=0
if [ "${#unit[@]}" -gt 0 ]; then
  started_at=$SECONDS
  run_vitest --maxWorkers="${HEATPATH_TEST_PG_WORKERS:-2}" "${unit[@]}" || status=$?
  echo "test:postgres: integration tests took $((SECONDS - started_at)) s"
fi
if [ "${#browser[@]}" -gt 0 ]; then
  node scripts/check-chromium.mjs || exit 1
  started_at=$SECONDS
  # The one Next build is reused (built by npm test's browser run, or here if sources changed).
  run_vitest --config vitest.browser.config.mts "${browser[@]}" || { rc=$?; [ "$status" = 0 ] && status=$rc; }
  echo "test:postgres: browser tests on PostgreSQL took $((SECONDS - started_at)) s"
fi
exit "$status"
