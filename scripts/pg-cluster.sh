#!/usr/bin/env bash
# A throwaway PostgreSQL cluster on a loopback port, for tests, CI and the load script.
#   scripts/pg-cluster.sh start DIR PORT   # prints the connection string on stdout
#   scripts/pg-cluster.sh stop DIR
# Debian's postgresql refuses to run as root, so the cluster runs as the postgres user
# when started by root. Nothing listens beyond 127.0.0.1.
set -euo pipefail
cmd=${1:?start|stop}; dir=${2:?cluster folder}
bin=$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -1 || true)
[ -n "$bin" ] && [ -x "$bin/initdb" ] || { echo "pg-cluster: no PostgreSQL server (apt-get install -y postgresql)" >&2; exit 2; }
as_pg() { if [ "$(id -u)" = 0 ]; then runuser -u postgres -- "$@"; else "$@"; fi; }
case "$cmd" in
  start)
    port=${3:?port}
    mkdir -p "$dir"
    [ "$(id -u)" = 0 ] && chown postgres "$dir"
    if [ ! -f "$dir/data/PG_VERSION" ]; then
      as_pg "$bin/initdb" -D "$dir/data" -A trust -U postgres -E UTF8 >"$dir/initdb.log" 2>&1 || { cat "$dir/initdb.log" >&2; exit 1; }
    fi
    as_pg "$bin/pg_ctl" -D "$dir/data" -w -t 60 -l "$dir/log" \
      -o "-k $dir -p $port -c listen_addresses=127.0.0.1 -c max_connections=200 -c fsync=off" start >&2 \
      || { cat "$dir/log" >&2; exit 1; }
    echo "postgresql://postgres@127.0.0.1:$port/postgres"
    ;;
  stop)
    [ -f "$dir/data/postmaster.pid" ] && as_pg "$bin/pg_ctl" -D "$dir/data" -m fast -w stop >&2 || true
    ;;
  *) echo "pg-cluster: start|stop" >&2; exit 2 ;;
esac
