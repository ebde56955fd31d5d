# shellcheck shell=bash disable=SC2034 # (globals are read by start.sh / test.sh)
# Shared helpers for scripts/start.sh (npm start) and scripts/test.sh (npm test).
# Source it, don't run it. Safe under `set -euo pipefail`.
#
# Fixed ports (all on 127.0.0.1 only):
#   54329  development PostgreSQL cluster (.data/pg, database "sheetsmith")
#   54339  test PostgreSQL cluster        (.data/test-pg, database "sheetsmith_test")
#   5173   the app (server + built client); PORT overrides it
#
# Our clusters are our own: they never use Debian's system cluster (port 5432)
# that the `postgresql` package creates and starts.

if [[ -n ${SHEETSMITH_LIB_LOADED:-} ]]; then return 0; fi
SHEETSMITH_LIB_LOADED=1

SHEETSMITH_ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd -P)"
SHEETSMITH_DEV_PG_PORT=54329
SHEETSMITH_TEST_PG_PORT=54339
SHEETSMITH_APP_PORT_DEFAULT=5173
SHEETSMITH_DB_USER=sheetsmith
SHEETSMITH_PG_TIMEOUT=60

PG_BIN=""               # directory holding initdb, pg_ctl, postgres (set by find_pg_bin)
PG_RUN_AS=""            # system user that runs initdb/pg_ctl/postgres ("" = the current user)
CLUSTER_DIR=""          # absolute data directory of the last cluster touched
CLUSTER_SOCKET_DIR=""   # its unix socket directory
CLUSTER_LOG=""          # its server log
CLUSTER_STARTED=0       # 1 when the last start_cluster call started the server itself
STARTED_CLUSTERS=()     # every data directory this shell started (stop_started_clusters stops them)
_SHEETSMITH_APT_UPDATED=""

say() { printf '==> %s\n' "$*"; }
warn() { printf '==> WARNING: %s\n' "$*" >&2; }
die() { printf '==> ERROR: %s\n' "$*" >&2; exit 1; }

is_root() { [[ $(id -u) -eq 0 ]]; }

# ---------------------------------------------------------------------------
# System packages

# as_root CMD...: run CMD as root (directly when root, else through sudo).
as_root() {
  if is_root; then
    "$@"
  elif command -v sudo >/dev/null 2>&1; then
    sudo "$@"
  else
    return 127
  fi
}

# apt_install PACKAGE...: apt-get update (once per run) + apt-get install -y.
apt_install() {
  command -v apt-get >/dev/null 2>&1 \
    || die "apt-get is not available: install $* with your system's package manager and run again"
  if ! is_root && ! command -v sudo >/dev/null 2>&1; then
    die "$* is missing and installing it needs root: run 'apt-get update && apt-get install -y $*' as root, then run again"
  fi
  if [[ -z $_SHEETSMITH_APT_UPDATED ]]; then
    say "apt-get update$(is_root || printf ' (through sudo)')"
    as_root env DEBIAN_FRONTEND=noninteractive apt-get update \
      || die "apt-get update failed; install $* yourself ('apt-get install -y $*') and run again"
    _SHEETSMITH_APT_UPDATED=1
  fi
  say "apt-get install -y $*$(is_root || printf ' (through sudo)')"
  as_root env DEBIAN_FRONTEND=noninteractive apt-get install -y "$@" \
    || die "apt-get install -y $* failed; install it yourself and run again"
}

# ---------------------------------------------------------------------------
# Node dependencies

# ensure_node_modules: `npm ci` when node_modules is missing or older than package-lock.json.
ensure_node_modules() {
  local root=$SHEETSMITH_ROOT reason=""
  local stamp=$root/node_modules/.package-lock.json
  if [[ ! -f $root/package-lock.json ]]; then
    say "no package-lock.json: npm install"
    (cd "$root" && npm install --no-audit --no-fund)
    return
  fi
  if [[ ! -d $root/node_modules ]]; then
    reason="node_modules is missing"
  elif [[ ! -f $stamp ]]; then
    reason="node_modules/.package-lock.json is missing"
  elif [[ $stamp -ot $root/package-lock.json ]]; then
    reason="package-lock.json is newer than node_modules"
  fi
  if [[ -z $reason ]]; then
    say "node_modules is up to date"
    return 0
  fi
  say "npm ci ($reason)"
  (cd "$root" && npm ci --no-audit --no-fund)
  # npm writes the hidden lockfile itself; make sure it ends up newer than package-lock.json.
  if [[ -f $stamp ]]; then touch "$stamp"; fi
}

# ---------------------------------------------------------------------------
# PostgreSQL binaries

_pg_bin_ok() { [[ -x $1/initdb && -x $1/pg_ctl && -x $1/postgres ]]; }

# find_pg_bin: set PG_BIN to the directory of initdb/pg_ctl: PATH first (symlinks resolved),
# else the newest /usr/lib/postgresql/*/bin. Returns 1 when there is none.
find_pg_bin() {
  local found dir
  if found=$(command -v initdb 2>/dev/null); then
    dir=$(dirname "$(readlink -f "$found")")
    if _pg_bin_ok "$dir"; then PG_BIN=$dir; return 0; fi
  fi
  if found=$(command -v pg_ctl 2>/dev/null); then
    dir=$(dirname "$(readlink -f "$found")")
    if _pg_bin_ok "$dir"; then PG_BIN=$dir; return 0; fi
  fi
  while IFS= read -r dir; do
    if _pg_bin_ok "$dir"; then PG_BIN=$dir; return 0; fi
  done < <(compgen -G '/usr/lib/postgresql/*/bin' | sort -t/ -k5,5 -V -r)
  return 1
}

# pg_tool NAME: path of a PostgreSQL program, preferring the one next to initdb.
pg_tool() {
  if [[ -n $PG_BIN && -x $PG_BIN/$1 ]]; then
    printf '%s\n' "$PG_BIN/$1"
  elif command -v "$1" >/dev/null 2>&1; then
    command -v "$1"
  else
    die "PostgreSQL program '$1' not found (looked in ${PG_BIN:-<no PostgreSQL bin dir>} and PATH)"
  fi
}

_pg_major() { "$1/postgres" --version | sed -E 's/.* ([0-9]+)(\.[0-9]+)*.*/\1/'; }

# ensure_postgres: make sure the PostgreSQL server programs exist (apt-get install postgresql if not).
ensure_postgres() {
  if ! find_pg_bin; then
    say "PostgreSQL server programs (initdb, pg_ctl) not found"
    apt_install postgresql
    find_pg_bin || die "the postgresql package is installed but initdb/pg_ctl are still not found (looked in PATH and /usr/lib/postgresql/*/bin)"
    say "note: Debian's postgresql package sets up its own cluster on port 5432; Sheetsmith does not use it"
  fi
  say "PostgreSQL: $("$PG_BIN/postgres" --version) ($PG_BIN)"
}

# ensure_chromium: make sure Chromium exists for the e2e tests (apt-get install chromium if not).
ensure_chromium() {
  local path=${CHROMIUM_PATH:-/usr/bin/chromium}
  if [[ -x $path ]]; then
    say "Chromium: $path"
    return 0
  fi
  if [[ $path != /usr/bin/chromium ]]; then
    die "CHROMIUM_PATH=$path does not exist; unset it to use /usr/bin/chromium (apt package 'chromium')"
  fi
  say "Chromium not found at /usr/bin/chromium"
  apt_install chromium
  [[ -x /usr/bin/chromium ]] || die "the chromium package is installed but /usr/bin/chromium is still missing"
}

# ---------------------------------------------------------------------------
# Our own PostgreSQL clusters

# pg_run CMD...: run a server-side program (initdb, pg_ctl) as PG_RUN_AS. PostgreSQL refuses
# to run as root, so as root that is the `postgres` system user (or the cluster's owner).
pg_run() {
  if [[ -z $PG_RUN_AS ]]; then
    "$@"
  elif command -v runuser >/dev/null 2>&1; then
    (cd / && runuser -u "$PG_RUN_AS" -- "$@")
  else
    (cd / && su -s /bin/sh "$PG_RUN_AS" -c "$(printf '%q ' "$@")")
  fi
}

_ensure_postgres_user() {
  if ! id -u postgres >/dev/null 2>&1; then
    say "creating the 'postgres' system user (PostgreSQL refuses to run as root)"
    useradd --system --user-group --no-create-home --home-dir /var/lib/postgresql \
      --shell /usr/sbin/nologin postgres || die "could not create the 'postgres' system user"
  fi
}

# Prints the first of the given directories that PG_RUN_AS cannot traverse (nothing when all are fine).
_first_blocked_dir() {
  # shellcheck disable=SC2016 # expanded by the inner sh
  pg_run sh -c 'for d in "$@"; do [ -x "$d" ] || { printf "%s\n" "$d"; exit 0; }; done' sh "$@" 2>/dev/null || true
}

# Ancestors of an absolute path, from / down to its parent.
_ancestors() {
  local path=$1 acc="" part
  local -a parts
  printf '/\n'
  IFS=/ read -ra parts <<<"${path#/}"
  for part in "${parts[@]:0:${#parts[@]}-1}"; do
    [[ -n $part ]] || continue
    acc+="/$part"
    printf '%s\n' "$acc"
  done
}

# _resolve_cluster DIR: set CLUSTER_DIR (absolute, symlinks resolved), CLUSTER_SOCKET_DIR,
# CLUSTER_LOG and PG_RUN_AS, without changing anything on disk.
_resolve_cluster() {
  local dir=$1 owner
  [[ -n $dir ]] || die "no cluster directory given"
  [[ $dir == /* ]] || dir=$SHEETSMITH_ROOT/$dir
  dir=${dir%/}
  if [[ -L $dir ]]; then dir=$(readlink -f "$dir"); fi
  CLUSTER_DIR=$dir
  CLUSTER_LOG=$dir/server.log
  CLUSTER_SOCKET_DIR=$(dirname "$dir")/run/$(basename "$dir")
  # A unix socket path must fit in 107 bytes; fall back to a short directory under /tmp.
  if ((${#CLUSTER_SOCKET_DIR} + 18 > 107)); then
    CLUSTER_SOCKET_DIR=/tmp/sheetsmith-$(printf '%s' "$dir" | cksum | cut -d' ' -f1)
  fi
  PG_RUN_AS=""
  if [[ -e $dir ]]; then owner=$(stat -c %U "$dir"); else owner=""; fi
  if is_root; then
    if [[ -f $dir/PG_VERSION && -n $owner && $owner != root && $owner != UNKNOWN ]]; then
      PG_RUN_AS=$owner   # an existing cluster keeps running as whoever created it
    else
      PG_RUN_AS=postgres
    fi
  elif [[ -f $dir/PG_VERSION && $owner != "$(id -un)" ]]; then
    die "$dir belongs to user '$owner' (made by a run as root?); remove it ('sudo rm -rf $dir') or run as root"
  fi
}

# _prepare_cluster_dirs: create the data/socket directories, owned by PG_RUN_AS and reachable by it.
_prepare_cluster_dirs() {
  local dir=$CLUSTER_DIR parent blocked key fallback fixed=""
  local -a ancestors
  parent=$(dirname "$dir")
  mkdir -p "$parent"
  if [[ -n $PG_RUN_AS ]]; then
    [[ $PG_RUN_AS != postgres ]] || _ensure_postgres_user
    # The postgres user must be able to traverse every parent of the data directory.
    while mapfile -t ancestors < <(_ancestors "$dir") && blocked=$(_first_blocked_dir "${ancestors[@]}") && [[ -n $blocked ]]; do
      if [[ $blocked == "$SHEETSMITH_ROOT" || $blocked == "$SHEETSMITH_ROOT"/* ]]; then
        [[ $blocked != "${fixed:-}" ]] || die "the '$PG_RUN_AS' user still cannot enter $blocked after chmod o+x (ACL? mount options?)"
        say "chmod o+x $blocked (so the '$PG_RUN_AS' user can reach $dir)"
        chmod o+x "$blocked"
        fixed=$blocked
        continue
      fi
      # A parent outside the repository (e.g. /root) is closed: keep the data elsewhere.
      key=$(printf '%s' "$SHEETSMITH_ROOT" | cksum | cut -d' ' -f1)
      fallback=/var/lib/sheetsmith/$key/$(basename "$dir")
      say "the '$PG_RUN_AS' user cannot enter $blocked; keeping this cluster in $fallback instead (symlinked from $dir)"
      if [[ -d $dir && ! -L $dir ]]; then
        rmdir "$dir" 2>/dev/null || die "$dir is not empty and the '$PG_RUN_AS' user cannot reach it; move it away and run again"
      fi
      install -d -m 755 "$(dirname "$fallback")"
      mkdir -p "$fallback"
      ln -sfn "$fallback" "$dir"
      _resolve_cluster "$dir"
      dir=$CLUSTER_DIR
      mapfile -t ancestors < <(_ancestors "$dir")
      blocked=$(_first_blocked_dir "${ancestors[@]}")
      [[ -z $blocked ]] || die "the '$PG_RUN_AS' user cannot enter $blocked either; run as a normal user or move the repository"
      break
    done
  fi
  mkdir -p "$dir" "$CLUSTER_SOCKET_DIR"
  if [[ -n $PG_RUN_AS ]]; then
    chown "$PG_RUN_AS:" "$dir" "$CLUSTER_SOCKET_DIR"
    if [[ $CLUSTER_SOCKET_DIR != /tmp/* ]]; then chmod o+x "$(dirname "$CLUSTER_SOCKET_DIR")"; fi
  fi
  chmod 700 "$dir"
  chmod 755 "$CLUSTER_SOCKET_DIR"
}

# Prints the pid of the live postmaster of data directory $1; returns 1 when none is running.
_cluster_pid() {
  local dir=$1 pid stat comm state cmdline
  [[ -f $dir/postmaster.pid ]] || return 1
  pid=$(head -n 1 "$dir/postmaster.pid" 2>/dev/null) || return 1
  [[ $pid =~ ^[0-9]+$ ]] || return 1
  # kill -0 is not enough: it can fail with EPERM, and a killed postmaster may linger as a zombie.
  stat=$(cat "/proc/$pid/stat" 2>/dev/null) || return 1
  comm=${stat#*(}
  comm=${comm%)*}
  state=${stat##*) }
  state=${state%% *}
  [[ $state != [ZX] ]] || return 1
  [[ $comm == postgres* || $comm == postmaster* ]] || return 1
  # A postgres with another -D is a different cluster that got the same pid after a crash.
  cmdline=$(tr '\0' '\n' <"/proc/$pid/cmdline" 2>/dev/null) || cmdline=""
  if grep -qx -- '-D' <<<"$cmdline" && ! grep -qxF -- "$dir" <<<"$cmdline"; then return 1; fi
  printf '%s\n' "$pid"
}

# After a crash of the postmaster its child processes exit by themselves within moments; wait
# for them (they all have the data directory as their cwd) before starting a new postmaster.
_wait_for_leftover_backends() {
  local dir=$1 i cwd_link found
  for ((i = 0; i < 100; i++)); do
    found=""
    for cwd_link in /proc/[0-9]*/cwd; do
      if [[ $(readlink "$cwd_link" 2>/dev/null) == "$dir" ]]; then found=$cwd_link; break; fi
    done
    [[ -n $found ]] || return 0
    ((i > 0)) || say "waiting for the crashed server's processes to exit"
    sleep 0.1
  done
  die "processes of a crashed PostgreSQL still use $dir (e.g. ${found%/cwd}); stop them and run again"
}

_port_open() { (: <"/dev/tcp/127.0.0.1/$1") 2>/dev/null; }

_show_log_tail() {
  if [[ -f $CLUSTER_LOG ]]; then
    printf '==> last lines of %s:\n' "$CLUSTER_LOG" >&2
    tail -n 30 "$CLUSTER_LOG" >&2 || true
  else
    printf '==> (no server log at %s)\n' "$CLUSTER_LOG" >&2
  fi
}

# _wait_ready PORT: wait until pg_isready answers on 127.0.0.1:PORT (60 s).
_wait_ready() {
  local port=$1 deadline=$((SECONDS + SHEETSMITH_PG_TIMEOUT)) isready
  isready=$(pg_tool pg_isready)
  until "$isready" -q -h 127.0.0.1 -p "$port" -U "$SHEETSMITH_DB_USER" -d postgres -t 2; do
    if ((SECONDS >= deadline)); then
      _show_log_tail
      die "PostgreSQL ($CLUSTER_DIR) did not answer on 127.0.0.1:$port within ${SHEETSMITH_PG_TIMEOUT}s"
    fi
    sleep 0.5
  done
}

_initdb() {
  local dir=$CLUSTER_DIR locale=C out
  if [[ -n $(ls -A "$dir" 2>/dev/null) ]]; then
    die "$dir is not empty but holds no PostgreSQL cluster (no PG_VERSION); remove it and run again"
  fi
  if locale -a 2>/dev/null | grep -qiE '^c\.utf-?8$'; then locale=C.UTF-8; fi
  say "creating a PostgreSQL cluster in $dir (user $SHEETSMITH_DB_USER, trust auth, UTF8, locale $locale${PG_RUN_AS:+, run as $PG_RUN_AS})"
  if ! out=$(pg_run "$PG_BIN/initdb" -D "$dir" --auth=trust --username="$SHEETSMITH_DB_USER" \
    --encoding=UTF8 --locale="$locale" 2>&1); then
    printf '%s\n' "$out" >&2
    die "initdb failed for $dir"
  fi
}

# start_cluster DIR PORT [NAME=VALUE...]: start (or reuse) our own cluster in DIR listening on
# 127.0.0.1:PORT only; extra NAME=VALUE settings are passed as -c options.
# Sets CLUSTER_STARTED=1 (and adds DIR to STARTED_CLUSTERS) only when this call started it.
start_cluster() {
  local port=${2:-} pid running_port version major opts setting
  [[ $# -ge 2 ]] || die "usage: start_cluster DIR PORT [NAME=VALUE...]"
  [[ $port =~ ^[0-9]+$ ]] || die "start_cluster: bad port '$port'"
  [[ -n $PG_BIN ]] || find_pg_bin || die "PostgreSQL is not installed (call ensure_postgres first)"
  CLUSTER_STARTED=0
  _resolve_cluster "$1"
  shift 2
  _prepare_cluster_dirs
  local dir=$CLUSTER_DIR
  [[ $dir != *"'"* && $CLUSTER_SOCKET_DIR != *"'"* ]] || die "paths with a single quote are not supported: $dir"

  if [[ ! -f $dir/PG_VERSION ]]; then
    _initdb
  else
    # Use the PostgreSQL version that created the cluster when it is installed.
    version=$(<"$dir/PG_VERSION")
    major=$(_pg_major "$PG_BIN")
    if [[ $version != "$major" ]]; then
      if _pg_bin_ok "/usr/lib/postgresql/$version/bin"; then
        PG_BIN=/usr/lib/postgresql/$version/bin
        say "$dir was created by PostgreSQL $version: using $PG_BIN"
      else
        die "$dir was created by PostgreSQL $version but only PostgreSQL $major is installed; remove $dir (its data is lost) or install PostgreSQL $version"
      fi
    fi
  fi

  if pid=$(_cluster_pid "$dir"); then
    running_port=$(sed -n 4p "$dir/postmaster.pid")
    if [[ $running_port != "$port" ]]; then
      die "the cluster in $dir is already running (pid $pid) on port $running_port, not $port; stop it with: $PG_BIN/pg_ctl -D $dir stop${PG_RUN_AS:+ (as $PG_RUN_AS)}"
    fi
    say "PostgreSQL in $dir is already running (pid $pid): reusing it on 127.0.0.1:$port"
    _wait_ready "$port"
    return 0
  fi

  if [[ -f $dir/postmaster.pid ]]; then
    say "removing stale $dir/postmaster.pid (pid $(head -n 1 "$dir/postmaster.pid") is not a running server of this cluster: unclean stop?)"
    _wait_for_leftover_backends "$dir"
    rm -f "$dir/postmaster.pid" "$CLUSTER_SOCKET_DIR/.s.PGSQL.$port" "$CLUSTER_SOCKET_DIR/.s.PGSQL.$port.lock"
  fi
  if _port_open "$port"; then
    die "127.0.0.1:$port is already taken by another program (not the cluster in $dir); stop it and run again"
  fi

  opts="-c listen_addresses=127.0.0.1 -c port=$port -c unix_socket_directories='$CLUSTER_SOCKET_DIR'"
  for setting in "$@"; do
    [[ $setting =~ ^[a-z_.]+=[A-Za-z0-9_.:-]+$ ]] || die "start_cluster: bad setting '$setting'"
    opts+=" -c $setting"
  done
  say "starting PostgreSQL in $dir on 127.0.0.1:$port${PG_RUN_AS:+ (as $PG_RUN_AS)}; log: $CLUSTER_LOG"
  _forget_started "$dir"
  STARTED_CLUSTERS+=("$dir")
  CLUSTER_STARTED=1
  # Fd 9 is the lock that test.sh holds: the server must not inherit it.
  if ! pg_run "$PG_BIN/pg_ctl" -D "$dir" -l "$CLUSTER_LOG" -o "$opts" -w -t "$SHEETSMITH_PG_TIMEOUT" -s start 9>&-; then
    _show_log_tail
    if _cluster_pid "$dir" >/dev/null; then pg_run "$PG_BIN/pg_ctl" -D "$dir" -m immediate -s stop 9>&- || true; fi
    die "PostgreSQL did not start in $dir (port $port)"
  fi
  _wait_ready "$port"
  say "PostgreSQL is ready on 127.0.0.1:$port"
}

_forget_started() {
  local kept=() d
  for d in "${STARTED_CLUSTERS[@]}"; do [[ $d == "$1" ]] || kept+=("$d"); done
  STARTED_CLUSTERS=("${kept[@]}")
}

# stop_cluster DIR: fast shutdown of the cluster in DIR (no-op when it is not running).
stop_cluster() {
  local pid
  [[ $# -ge 1 ]] || die "usage: stop_cluster DIR"
  [[ -n $PG_BIN ]] || find_pg_bin || { warn "PostgreSQL not found: cannot stop $1"; return 0; }
  _resolve_cluster "$1"
  _forget_started "$CLUSTER_DIR"
  if ! pid=$(_cluster_pid "$CLUSTER_DIR"); then
    say "PostgreSQL in $CLUSTER_DIR is not running"
    return 0
  fi
  say "stopping PostgreSQL in $CLUSTER_DIR (pid $pid)"
  pg_run "$PG_BIN/pg_ctl" -D "$CLUSTER_DIR" -m fast -w -t "$SHEETSMITH_PG_TIMEOUT" -s stop \
    || warn "pg_ctl stop failed for $CLUSTER_DIR (see $CLUSTER_LOG)"
}

# stop_started_clusters: stop every cluster this shell started (for EXIT traps).
stop_started_clusters() {
  local dir
  for dir in "${STARTED_CLUSTERS[@]}"; do stop_cluster "$dir"; done
  STARTED_CLUSTERS=()
}

# ---------------------------------------------------------------------------
# Databases (client programs from the same bin dir, over TCP as user sheetsmith)

_check_db_name() {
  [[ $1 =~ ^[a-z_][a-z0-9_]*$ ]] || die "bad database name '$1' (use lower-case letters, digits and _)"
}

_psql() {
  local port=$1
  shift
  PGCONNECT_TIMEOUT=10 "$(pg_tool psql)" -X -q -v ON_ERROR_STOP=1 \
    -h 127.0.0.1 -p "$port" -U "$SHEETSMITH_DB_USER" "$@"
}

# ensure_database PORT NAME: create database NAME when it does not exist.
ensure_database() {
  local port=$1 name=$2 exists
  _check_db_name "$name"
  exists=$(_psql "$port" -d postgres -tAc "SELECT 1 FROM pg_database WHERE datname = '$name'") \
    || die "cannot connect to PostgreSQL on 127.0.0.1:$port"
  if [[ $exists == 1 ]]; then
    say "database $name exists"
  else
    say "creating database $name"
    "$(pg_tool createdb)" -h 127.0.0.1 -p "$port" -U "$SHEETSMITH_DB_USER" "$name"
  fi
}

# recreate_database PORT NAME: drop NAME if it exists and create it empty (throw-away databases only).
recreate_database() {
  local port=$1 name=$2 dropdb
  _check_db_name "$name"
  case $name in
    sheetsmith | postgres | template0 | template1)
      die "recreate_database refuses to drop '$name' (only throw-away databases, e.g. sheetsmith_test)" ;;
  esac
  dropdb=$(pg_tool dropdb)
  say "recreating database $name (throw-away)"
  if "$dropdb" --help 2>/dev/null | grep -q -- '--force'; then
    PGOPTIONS='-c client_min_messages=warning' "$dropdb" --if-exists --force -h 127.0.0.1 -p "$port" -U "$SHEETSMITH_DB_USER" "$name"
  else
    PGOPTIONS='-c client_min_messages=warning' "$dropdb" --if-exists -h 127.0.0.1 -p "$port" -U "$SHEETSMITH_DB_USER" "$name"
  fi
  "$(pg_tool createdb)" -h 127.0.0.1 -p "$port" -U "$SHEETSMITH_DB_USER" "$name"
}

# ---------------------------------------------------------------------------
# Misc

# acquire_lock NAME: hold .data/NAME.lock (fd 9) for the rest of this shell, waiting for other holders.
acquire_lock() {
  local lock=$SHEETSMITH_ROOT/.data/$1.lock
  command -v flock >/dev/null 2>&1 || { warn "flock not found: not locking $lock"; return 0; }
  mkdir -p "$SHEETSMITH_ROOT/.data"
  exec 9>>"$lock"
  if ! flock -n 9; then
    say "another run holds $lock (npm test in this checkout?); waiting for it to finish"
    flock 9
  fi
}

# format_duration SECONDS -> "1m 05s"
format_duration() {
  local s=$1
  if ((s >= 60)); then printf '%dm %02ds' $((s / 60)) $((s % 60)); else printf '%ds' "$s"; fi
}
