#!/usr/bin/env bash
# `npm run -s cli -- ...`: runs the command-line interface (server/cli/main.ts) from a bundle made by
# esbuild (installed with tsx), rebuilt when any server/ or shared/ source is newer than it. Node
# starts the bundle in ~0.1 s against ~1 s through tsx's loader, and its cross-validation worker
# threads start without the loader too. Packages are bundled in (their many small CommonJS files are
# slow to load one by one); the banner gives their require() calls Node's require.
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
build="$root/.lariat/build"
out="$build/cli.mjs"
worker="$build/cv-worker.mjs"

stale() {
  [[ ! -f "$out" || ! -f "$worker" ]] && return 0
  [[ -n "$(find "$root/server" "$root/shared" "$root/package-lock.json" -newer "$out" \( -name '*.ts' -o -name '*.json' \) -print -quit 2>/dev/null)" ]]
}

bundle() { # entry, output: written beside it, then renamed, so concurrent runs never see half a file
  local tmp="$2.$$.tmp"
  "$root/node_modules/.bin/esbuild" "$1" --bundle --platform=node --format=esm --target=node20 \
    "--banner:js=import { createRequire as lariatRequire } from 'node:module'; const require = lariatRequire(import.meta.url);" \
    --log-level=error --outfile="$tmp"
  mv -f "$tmp" "$2"
}

if stale; then
  mkdir -p "$build"
  bundle "$root/server/engine-runner/worker.ts" "$worker"
  bundle "$root/server/cli/main.ts" "$out"
fi
exec node "$out" "$@"
