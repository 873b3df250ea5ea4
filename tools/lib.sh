# Shared steps for the scripts under tools/. Sourced, not run.
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
script="$(cd "$(dirname "$0")" && pwd)/$(basename "$0")"
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

# -h or --help among the arguments: print the calling script's header comment (its usage) and exit
# before doing anything. Every script under tools/ that package.json names calls this first.
help_if_asked() {
  local a
  for a in "$@"; do
    case "$a" in -h|--help) awk 'NR > 1 && /^#/ { sub(/^# ?/, ""); print; next } NR > 1 { exit }' "$script"; exit 0 ;; esac
  done
}
