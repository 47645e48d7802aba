# Shared helpers for start.sh, test.sh and db.sh: logging, Debian packages, node packages, waiting
# for ports. Sourced, not run.

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
DATA_DIR="$ROOT/.data"
export PG_PORT="${TRIMWIRE_PG_PORT:-54329}"

step() { printf '\n\033[1m==> %s\033[0m\n' "$*"; }
info() { printf '    %s\n' "$*"; }
fail() { printf '\033[31mERROR: %s\033[0m\n' "$*" >&2; exit 1; }

# Installs Debian packages that are missing; `apt-get update` runs at most once per script run.
ensure_apt_packages() {
  local missing=()
  local pkg
  for pkg in "$@"; do
    dpkg-query -W -f='${Status}' "$pkg" 2>/dev/null | grep -q 'install ok installed' || missing+=("$pkg")
  done
  [ "${#missing[@]}" -eq 0 ] && return 0
  [ "$(id -u)" -eq 0 ] || fail "Debian packages missing (${missing[*]}); run as root or install them first."
  if [ -z "${TRIMWIRE_APT_UPDATED:-}" ]; then
    info "apt-get update"
    DEBIAN_FRONTEND=noninteractive apt-get update -qq
    export TRIMWIRE_APT_UPDATED=1
  fi
  info "apt-get install ${missing[*]}"
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq "${missing[@]}" >/dev/null
}

# npm ci when node_modules is missing or older than package-lock.json.
ensure_node_modules() {
  if [ ! -d "$ROOT/node_modules" ] || [ "$ROOT/package-lock.json" -nt "$ROOT/node_modules/.package-lock.json" ]; then
    step "Installing node packages (npm ci)"
    (cd "$ROOT" && npm ci --no-audit --no-fund)
  fi
}

# True when something accepts TCP connections on 127.0.0.1:$1.
port_answers() { (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null; }

wait_for_port() {
  local port="$1" what="$2" i
  for i in $(seq 1 100); do
    port_answers "$port" && return 0
    sleep 0.2
  done
  fail "$what did not start listening on 127.0.0.1:$port"
}

# Local fake SMTP server on $1 storing mail in the database $2 (started once, detached with setsid).
ensure_fake_smtp() {
  local port="$1" url="$2"
  if port_answers "$port"; then
    info "fake SMTP already answering on 127.0.0.1:$port"
    return 0
  fi
  mkdir -p "$DATA_DIR"
  info "starting fake SMTP on 127.0.0.1:$port (log: .data/fake-smtp-$port.log)"
  (cd "$ROOT" && FAKE_SMTP_PORT="$port" DATABASE_URL="$url" setsid nohup node_modules/.bin/tsx scripts/fake-smtp.ts \
    >"$DATA_DIR/fake-smtp-$port.log" 2>&1 </dev/null &)
  wait_for_port "$port" "The fake SMTP server"
}

# Exports the web build into dist/ unless the sources' hash matches the last export.
export_web() {
  local stamp="$ROOT/dist/.source-hash" hash p inputs=()
  # Everything the bundle is built from (the client also imports the engine for what-if maths).
  for p in app components assets shared optimizer app.json package-lock.json tsconfig.json babel.config.js metro.config.js; do
    [ -e "$ROOT/$p" ] && inputs+=("$p")
  done
  hash="$(cd "$ROOT" && find "${inputs[@]}" -type f -not -name '*.test.ts' -not -name '*.test.tsx' -print0 \
    | LC_ALL=C sort -z | xargs -0 sha256sum | sha256sum | cut -d' ' -f1)"
  if [ -f "$ROOT/dist/index.html" ] && [ -f "$stamp" ] && [ "$(cat "$stamp")" = "$hash" ]; then
    info "web build is up to date (dist/)"
    return 0
  fi
  info "expo export --platform web → dist/"
  (cd "$ROOT" && EXPO_OFFLINE=1 EXPO_NO_TELEMETRY=1 CI=1 npx expo export --platform web --output-dir dist >"$DATA_DIR/expo-export.log" 2>&1) \
    || { tail -n 40 "$DATA_DIR/expo-export.log" >&2; echo "expo export failed (full log: .data/expo-export.log)" >&2; return 1; }
  echo "$hash" >"$stamp"
}
