#!/usr/bin/env bash
# Runs the API test suite against PostgreSQL: installs Debian's `postgresql` when it is missing, starts a
# throwaway cluster on 127.0.0.1 (free port, temporary directory, removed on exit), and runs
# `vitest --project api` with TEST_DATABASE_URL pointing at it. Every test app then creates its own
# scratch database in that cluster (api/src/testing/postgres-scratch-database.ts).
#
#   scripts/postgres/run-api-tests.sh [extra vitest arguments]
#   HEADROOM_PG_OPTIONAL=1 …   exit 0 with a notice when PostgreSQL cannot be installed (used by `npm test`)
#
# The cluster runs with fsync off: it holds test data only and is deleted at the end.
set -euo pipefail
cd "$(dirname "$0")/../.."

find_bin_dir() {
  # No match is not an error here: it means PostgreSQL is not installed yet.
  { ls -d /usr/lib/postgresql/*/bin 2>/dev/null || true; } | sort -V | tail -n 1
}

skip_or_fail() {
  if [[ "${HEADROOM_PG_OPTIONAL:-0}" == "1" ]]; then
    echo "PostgreSQL suite skipped: $1" >&2
    exit 0
  fi
  echo "PostgreSQL suite cannot run: $1" >&2
  exit 1
}

bin_dir="$(find_bin_dir)"
if [[ -z "$bin_dir" ]]; then
  if [[ "$(id -u)" -ne 0 ]] || ! command -v apt-get >/dev/null 2>&1; then
    skip_or_fail "PostgreSQL is not installed (apt-get install -y postgresql needs root)"
  fi
  echo "Installing Debian's postgresql package…"
  export DEBIAN_FRONTEND=noninteractive
  apt-get install -y -qq postgresql >/dev/null 2>&1 || { apt-get update -qq && apt-get install -y -qq postgresql >/dev/null; } \
    || skip_or_fail "apt-get install postgresql failed"
  bin_dir="$(find_bin_dir)"
  [[ -n "$bin_dir" ]] || skip_or_fail "postgresql installed but no /usr/lib/postgresql/*/bin found"
fi

# PostgreSQL refuses to run as root: when we are root, the cluster belongs to the `postgres` system user.
as_cluster_owner() {
  if [[ "$(id -u)" -eq 0 ]]; then
    (cd "$work_dir" && runuser -u postgres -- "$@")
  else
    "$@"
  fi
}

work_dir="$(mktemp -d "${TMPDIR:-/tmp}/headroom-pg.XXXXXX")"
if [[ "$(id -u)" -eq 0 ]]; then chown postgres: "$work_dir"; fi
chmod 700 "$work_dir"
data_dir="$work_dir/data"

stop_cluster() {
  if [[ -f "$data_dir/postmaster.pid" ]]; then
    as_cluster_owner "$bin_dir/pg_ctl" -D "$data_dir" -m immediate -w stop >/dev/null 2>&1 || true
  fi
  rm -rf "$work_dir"
}
trap stop_cluster EXIT

port="$(node -e 'const s=require("node:net").createServer();s.listen(0,"127.0.0.1",()=>{console.log(s.address().port);s.close()})')"

as_cluster_owner "$bin_dir/initdb" -D "$data_dir" -U headroom -A trust -E UTF8 --locale=C --no-sync >/dev/null
as_cluster_owner "$bin_dir/pg_ctl" -D "$data_dir" -l "$work_dir/server.log" -w -t 60 start \
  -o "-c listen_addresses=127.0.0.1 -p $port -k $work_dir -c max_connections=300 -c fsync=off -c synchronous_commit=off -c full_page_writes=off" >/dev/null \
  || { cat "$work_dir/server.log" >&2; exit 1; }
"$bin_dir/createdb" -h 127.0.0.1 -p "$port" -U headroom headroom_test

version="$("$bin_dir/postgres" --version)"
echo "PostgreSQL suite: $version on 127.0.0.1:$port"
TEST_DATABASE_URL="postgres://headroom@127.0.0.1:$port/headroom_test" npx vitest run --project api "$@"
