#!/usr/bin/env bash
# `npm run bench [-- part ...]`: like `npm test`, sets up what the chosen parts need and stops what
# it started. Every part: npm dependencies. The engine part: Debian's python3-sklearn (the numerical
# reference it is timed against). The ingest parts: the project-local PostgreSQL cluster (the ingest
# benchmark starts a real server on a fresh database in it), and so do the fits and scoring parts. Parts are bench/*.bench.ts prefixes.
source "$(dirname "$0")/lib.sh"

wants() { # part: true when no part is named or one of the named parts starts the part's name
  [ "$#" -gt 1 ] || return 0
  local part="$1"; shift
  local w
  for w in "$@"; do [[ "$part" == "$w"* ]] && return 0; done
  return 1
}

ensure_node_modules
if wants engine "$@"; then
  [ -x /usr/bin/python3 ] && /usr/bin/python3 -c 'import sklearn' 2>/dev/null || apt_install python3-sklearn
fi
if wants ingest "$@" || wants fits "$@" || wants scoring "$@"; then
  ensure_cluster
  export LARIAT_TEST_DATABASE_ADMIN_URL="$(database_url postgres)"
fi
trap stop_started EXIT

cd "$LARIAT_ROOT"
status=0
npx tsx bench/run.ts "$@" || status=$?
exit "$status"
