#!/usr/bin/env bash
# Shared steps of scripts/demo.sh and scripts/test.sh: install what is missing on a fresh machine.
# Sourced, not run.

# npm packages: install from the lock file when node_modules is missing or older than the lock.
ensure_node_modules() {
  if [ ! -d node_modules ] || [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
    echo "[setup] installing npm packages (npm ci)"
    npm ci --no-audit --no-fund
  fi
}

# Debian packages, each given as "command:package"; one apt-get update for all that are missing.
ensure_debian_packages() {
  local missing=() pair cmd pkg
  for pair in "$@"; do
    cmd="${pair%%:*}"; pkg="${pair#*:}"
    if ! command -v "$cmd" >/dev/null 2>&1 && [ ! -x "/usr/sbin/$cmd" ] && [ ! -x "/usr/bin/$cmd" ]; then missing+=("$pkg"); fi
  done
  if [ "${#missing[@]}" -gt 0 ]; then
    echo "[setup] installing Debian packages: ${missing[*]}"
    export DEBIAN_FRONTEND=noninteractive
    apt-get update -qq >/dev/null
    apt-get install -y -qq "${missing[@]}" >/dev/null
  fi
}

# SciPy must be importable by Debian's python3 (the one the reference tests call).
ensure_scipy() {
  if ! /usr/bin/python3 -c 'import scipy.signal' >/dev/null 2>&1; then
    echo "[setup] installing Debian's python3-scipy"
    export DEBIAN_FRONTEND=noninteractive
    apt-get update -qq >/dev/null
    apt-get install -y -qq python3-scipy >/dev/null
  fi
}

# Wait until an HTTP URL answers 2xx (uses Node's fetch: no curl needed).
wait_for_url() {
  local url="$1" tries="${2:-240}"
  for _ in $(seq 1 "$tries"); do
    if node -e "fetch(process.argv[1]).then(r=>process.exit(r.ok?0:1),()=>process.exit(1))" "$url"; then return 0; fi
    sleep 0.5
  done
  echo "[setup] $url did not answer" >&2
  return 1
}
