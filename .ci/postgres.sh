#!/usr/bin/env bash
# A throwaway PostgreSQL cluster for the run-storage tests: Debian's server binaries, a cluster in
# a temporary folder owned by the unprivileged 'postgres' user (CI runs as root, and PostgreSQL
# refuses to run as root), listening on loopback only.
#
#   bash .ci/postgres.sh start DIR PORT   initialises DIR (if empty), starts the server, creates
#                                         the database 'tectomelt' (user 'tectomelt', password
#                                         'tectomelt') and prints its JDBC URL on the last line
#   bash .ci/postgres.sh createdb DIR PORT NAME   a further empty database owned by 'tectomelt'
#   bash .ci/postgres.sh stop DIR         stops it (the folder can then be removed)
set -euo pipefail

PGBIN="${PGBIN:-$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1)}"
if [ -z "$PGBIN" ] || [ ! -x "$PGBIN/initdb" ]; then
  echo "PostgreSQL server binaries not found (Debian package 'postgresql')" >&2
  exit 1
fi

as_pg() { # runs a command as the postgres user when we are root, directly otherwise
  if [ "$(id -u)" -eq 0 ]; then
    su postgres -s /bin/sh -c "$*"
  else
    sh -c "$*"
  fi
}

cmd="${1:-}"
dir="${2:-}"
case "$cmd" in
  start)
    port="${3:?port}"
    mkdir -p "$dir"
    if [ "$(id -u)" -eq 0 ]; then chown postgres "$dir"; fi
    chmod 700 "$dir"
    if [ ! -f "$dir/PG_VERSION" ]; then
      as_pg "'$PGBIN/initdb' -D '$dir' -U postgres -A trust -E UTF8 --no-locale" >/dev/null
    fi
    as_pg "'$PGBIN/pg_ctl' -D '$dir' -l '$dir/server.log' -w -t 60 -o \"-c listen_addresses=127.0.0.1 -p $port -k '$dir' -c fsync=off -c max_connections=200\" start" >/dev/null
    as_pg "'$PGBIN/psql' -h 127.0.0.1 -p $port -U postgres -d postgres -v ON_ERROR_STOP=1 -q" <<SQL
do \$\$ begin
  if not exists (select from pg_roles where rolname = 'tectomelt') then
    create role tectomelt login password 'tectomelt' createdb;
  end if;
end \$\$;
SQL
    if ! as_pg "'$PGBIN/psql' -h 127.0.0.1 -p $port -U postgres -d postgres -tAc \"select 1 from pg_database where datname = 'tectomelt'\"" | grep -q 1; then
      as_pg "'$PGBIN/createdb' -h 127.0.0.1 -p $port -U postgres -O tectomelt tectomelt"
    fi
    echo "jdbc:postgresql://127.0.0.1:$port/tectomelt"
    ;;
  createdb)
    port="${3:?port}"
    name="${4:?name}"
    as_pg "'$PGBIN/createdb' -h 127.0.0.1 -p $port -U postgres -O tectomelt '$name'"
    echo "jdbc:postgresql://127.0.0.1:$port/$name"
    ;;
  stop)
    as_pg "'$PGBIN/pg_ctl' -D '$dir' -m fast -w stop" >/dev/null || true
    ;;
  *)
    echo "usage: $0 start DIR PORT | stop DIR" >&2
    exit 2
    ;;
esac
