#!/usr/bin/env bash
# Runs a command with a throwaway PostgreSQL server on loopback and
# COHESIA_TEST_DATABASE_URL pointing at it; the server and its folder go away afterwards.
# Needs Debian's postgresql package (the server binaries, not only psql).
set -euo pipefail
pg_bin=$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -1)
if [ -z "$pg_bin" ] || [ ! -x "$pg_bin/initdb" ]; then
  echo "PostgreSQL server binaries not found: apt-get install postgresql" >&2
  exit 2
fi
pg_dir=$(mktemp -d)
# A free port unless one is given (another server may be on the usual ones).
pg_port=${PG_PORT:-$(node -e "const s=require('net').createServer().listen(0,'127.0.0.1',()=>{console.log(s.address().port);s.close()})")}
# The server refuses to run as root: run it as the postgres user then.
as_pg() { if [ "$(id -u)" = 0 ]; then su postgres -s /bin/sh -c "$1"; else sh -c "$1"; fi; }
if [ "$(id -u)" = 0 ]; then chown postgres "$pg_dir"; fi
stop() {
  as_pg "'$pg_bin/pg_ctl' -D '$pg_dir/data' -m fast stop >/dev/null 2>&1" || true
  rm -rf "$pg_dir"
}
trap stop EXIT
as_pg "'$pg_bin/initdb' -D '$pg_dir/data' -A trust -U cohesia >/dev/null"
# fsync off: a test server that is thrown away; more connections for the parallel test apps.
as_pg "'$pg_bin/pg_ctl' -D '$pg_dir/data' -l '$pg_dir/log' -w -o \"-p $pg_port -k '$pg_dir' -c listen_addresses=127.0.0.1 -c fsync=off -c max_connections=300\" start >/dev/null"
echo "PostgreSQL $("$pg_bin/postgres" --version | awk '{print $3}') on 127.0.0.1:$pg_port"
# The fault tests restart the server for real with this.
if [ "$(id -u)" = 0 ]; then
  export COHESIA_TEST_PG_RESTART="su postgres -s /bin/sh -c \"'$pg_bin/pg_ctl' -D '$pg_dir/data' -w -m fast restart >/dev/null\""
else
  export COHESIA_TEST_PG_RESTART="'$pg_bin/pg_ctl' -D '$pg_dir/data' -w -m fast restart >/dev/null"
fi
COHESIA_TEST_DATABASE_URL="postgresql://cohesia@127.0.0.1:$pg_port/postgres" "$@"
