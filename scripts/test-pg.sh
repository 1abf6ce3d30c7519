#!/usr/bin/env bash
# Runs the repository and API tests against PostgreSQL (vitest.pg.config.ts).
# Uses HOLDLINE_TEST_PG_URL if set (a server the tests may create and drop databases on);
# otherwise starts a temporary cluster on a free loopback port and stops it on exit.
# Without a PostgreSQL server: fails in CI (CI=true), skips with a message elsewhere.
set -euo pipefail
cd "$(dirname "$0")/.."
if [ -z "${HOLDLINE_TEST_PG_URL:-}" ]; then
  if ! ls /usr/lib/postgresql/*/bin/initdb >/dev/null 2>&1; then
    if [ "${CI:-}" = "true" ]; then echo "test-pg: no PostgreSQL server in CI (apt-get install -y postgresql)" >&2; exit 1; fi
    echo "test-pg: skipped: no PostgreSQL server here (apt-get install -y postgresql, or set HOLDLINE_TEST_PG_URL)" >&2
    exit 0
  fi
  dir=$(mktemp -d /tmp/holdline-pg-XXXXXX)
  port=${HOLDLINE_PG_PORT:-$(node -e 'const s=require("net").createServer();s.listen(0,"127.0.0.1",()=>{console.log(s.address().port);s.close()})')}
  trap 'bash scripts/pg-cluster.sh stop "$dir"; rm -rf "$dir"' EXIT
  HOLDLINE_TEST_PG_URL=$(bash scripts/pg-cluster.sh start "$dir" "$port")
  export HOLDLINE_TEST_PG_URL
fi
echo "test-pg: PostgreSQL at ${HOLDLINE_TEST_PG_URL}" >&2
npx vitest run -c vitest.pg.config.ts "$@"
