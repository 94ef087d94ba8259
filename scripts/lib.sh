# Shared shell functions for the start, test and database scripts. Source it; do not run it.
# Everything here is safe to run twice.

export NEXT_TELEMETRY_DISABLED=1
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
PG_VERSION_DIR="$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1)"

say() { printf '\033[1m[tautline]\033[0m %s\n' "$*"; }
die() { printf '\033[1;31m[tautline]\033[0m %s\n' "$*" >&2; exit 1; }

as_root() {
  if [ "$(id -u)" -eq 0 ]; then "$@"; else sudo "$@"; fi
}

# Installs Debian packages that are missing. Usage: ensure_debian_packages postgresql chromium
ensure_debian_packages() {
  local missing=()
  for pkg in "$@"; do
    dpkg-query -W -f='${Status}' "$pkg" 2>/dev/null | grep -q "install ok installed" || missing+=("$pkg")
  done
  [ ${#missing[@]} -eq 0 ] && return 0
  say "installing Debian packages: ${missing[*]}"
  as_root apt-get update -qq
  DEBIAN_FRONTEND=noninteractive as_root apt-get install -y -qq --no-install-recommends "${missing[@]}" >/dev/null
  PG_VERSION_DIR="$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1)"
}

# Installs node modules when they are missing or older than the lock file.
ensure_node_modules() {
  cd "$ROOT" || exit 1
  if [ ! -d node_modules ] || [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
    say "installing node modules (npm ci)"
    npm ci --no-audit --no-fund --loglevel=error
  fi
}

# The postgres server refuses to run as root: it runs as the 'postgres' system user, which must
# be able to reach the data folder inside the project.
ensure_postgres_user() {
  id -u postgres >/dev/null 2>&1 || as_root useradd --system --home-dir /var/lib/postgresql --shell /bin/bash postgres
  local dir="$1"
  while [ "$dir" != "/" ]; do
    if ! runuser -u postgres -- test -x "$dir" 2>/dev/null; then
      say "letting the postgres user pass through $dir (chmod o+x)"
      as_root chmod o+x "$dir"
    fi
    dir="$(dirname "$dir")"
  done
}

pg_bin() { printf '%s/%s' "$PG_VERSION_DIR" "$1"; }

# Starts a PostgreSQL server on 127.0.0.1. Usage: pg_up DATA_DIR PORT [fast]
# Creates the cluster (user and password 'tautline') on first use; a running server is left alone.
pg_up() {
  local data="$1" port="$2" mode="${3:-}"
  local run="$data.run"
  [ -n "$PG_VERSION_DIR" ] || die "PostgreSQL binaries not found under /usr/lib/postgresql"
  mkdir -p "$data" "$run"
  ensure_postgres_user "$(dirname "$data")"
  as_root chown postgres:postgres "$data" "$run"
  chmod 700 "$data"
  if [ ! -f "$data/PG_VERSION" ]; then
    say "creating a PostgreSQL cluster in ${data#"$ROOT"/}"
    local pwfile
    pwfile="$(mktemp)"; echo "tautline" >"$pwfile"; chmod 644 "$pwfile"
    runuser -u postgres -- "$(pg_bin initdb)" -D "$data" -U tautline --pwfile="$pwfile" \
      --auth-local=scram-sha-256 --auth-host=scram-sha-256 -E UTF8 --locale=C.UTF-8 >/dev/null
    rm -f "$pwfile"
  fi
  if runuser -u postgres -- "$(pg_bin pg_ctl)" -D "$data" status >/dev/null 2>&1; then
    say "PostgreSQL already running on 127.0.0.1:$port"
  else
    if (exec 3<>"/dev/tcp/127.0.0.1/$port") 2>/dev/null; then
      die "port $port on 127.0.0.1 is taken by another program (another PostgreSQL?): stop it, or set TAUTLINE_PG_PORT to a free port"
    fi
    local opts="-c listen_addresses=127.0.0.1 -c port=$port -c unix_socket_directories=$run"
    if [ "$mode" = "fast" ]; then
      # Throwaway test clusters only: durability traded for speed.
      opts="$opts -c fsync=off -c synchronous_commit=off -c full_page_writes=off"
    fi
    runuser -u postgres -- "$(pg_bin pg_ctl)" -D "$data" -l "$run/postgres.log" -o "$opts" -w -t 30 start >/dev/null \
      || { tail -n 20 "$run/postgres.log" >&2; die "PostgreSQL did not start (log: $run/postgres.log)"; }
    say "PostgreSQL listening on 127.0.0.1:$port"
  fi
  PGPASSWORD=tautline "$(pg_bin psql)" -h 127.0.0.1 -p "$port" -U tautline -d postgres -tAc \
    "select 1 from pg_database where datname = 'tautline'" | grep -q 1 \
    || PGPASSWORD=tautline "$(pg_bin createdb)" -h 127.0.0.1 -p "$port" -U tautline tautline
  # The app's own login (least privilege): owns nothing; the migration
  # 2026-12-10T040000-app-role grants it row access only. Local clusters use password 'tautline_app'.
  PGPASSWORD=tautline "$(pg_bin psql)" -h 127.0.0.1 -p "$port" -U tautline -d postgres -qtAc "
    do \$\$ begin
      if not exists (select 1 from pg_roles where rolname = 'tautline_app') then
        create role tautline_app login password 'tautline_app' nosuperuser nocreatedb nocreaterole noinherit;
      else
        alter role tautline_app login password 'tautline_app';
      end if;
    end \$\$" >/dev/null
}

# Stops the server of a data folder when it runs. Usage: pg_down DATA_DIR
pg_down() {
  local data="$1"
  [ -f "$data/PG_VERSION" ] || return 0
  if runuser -u postgres -- "$(pg_bin pg_ctl)" -D "$data" status >/dev/null 2>&1; then
    runuser -u postgres -- "$(pg_bin pg_ctl)" -D "$data" -m fast -w stop >/dev/null && say "PostgreSQL stopped"
  fi
}

# Starts a command in its own process group, logging to a file; prints nothing, sets LAST_PID.
start_group() {
  local log="$1"; shift
  setsid "$@" >"$log" 2>&1 < /dev/null &
  LAST_PID=$!
}

# Stops a process group started by start_group.
stop_group() {
  local pid="$1"
  [ -n "$pid" ] || return 0
  kill -TERM -- "-$pid" 2>/dev/null || return 0
  for _ in $(seq 1 50); do kill -0 -- "-$pid" 2>/dev/null || return 0; sleep 0.1; done
  kill -KILL -- "-$pid" 2>/dev/null || true
}

# Stops with a clear message when a port on loopback is already taken.
# Usage: require_free_port PORT "what needs it" VARIABLE
require_free_port() {
  if (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null; then
    die "port $1 on 127.0.0.1 (for $2) is taken by another program: stop it, or set $3 to a free port"
  fi
}

# Waits until a URL answers. Usage: wait_for_url URL SECONDS
wait_for_url() {
  local url="$1" seconds="$2"
  for _ in $(seq 1 $((seconds * 4))); do
    curl -fsS -o /dev/null "$url" 2>/dev/null && return 0
    sleep 0.25
  done
  return 1
}
