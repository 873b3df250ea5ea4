# Shared steps for tools/start and tools/test. Sourced, not run.
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$root"
export NG_CLI_ANALYTICS=false
export NODE_OPTIONS="${NODE_OPTIONS:-} --max-old-space-size=4096"
step() { printf '\n\033[1m== %s\033[0m\n' "$*"; }

# npm ci when node_modules is missing or older than the lock file.
ensure_node_modules() {
  if [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
    step "installing packages (npm ci)"
    npm ci --no-audit --no-fund
  fi
}

# Debian's chromium for the end-to-end tests; never a browser download.
ensure_chromium() {
  if [ -x /usr/bin/chromium ]; then return 0; fi
  step "installing Debian's chromium"
  if [ "$(id -u)" -ne 0 ]; then echo "chromium is missing: install Debian's 'chromium' package" >&2; return 1; fi
  DEBIAN_FRONTEND=noninteractive apt-get update -qq
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium >/dev/null
}

tsx_run() { node_modules/.bin/tsx --tsconfig tsconfig.server.json "$@"; }
