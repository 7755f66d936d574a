# Shared by scripts/start and scripts/test: install what is missing, run our own MariaDB
# and the local fakes on loopback. Sourced, not executed. Every step is safe to re-run.

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
cd "$ROOT"

export DB_HOST=127.0.0.1
export DB_PORT="${DB_PORT:-3307}"
export DB_USER="${DB_USER:-gaffline}"
DATA_DIR="$ROOT/.data"
MARIADB_DIR="$DATA_DIR/mariadb"
MARIADB_SOCK="$MARIADB_DIR/mysqld.sock"
LOG_DIR="$DATA_DIR/logs"
mkdir -p "$LOG_DIR"

log() { printf '\033[1m[gaffline]\033[0m %s\n' "$*"; }
die() { printf '[gaffline] error: %s\n' "$*" >&2; exit 1; }

ensure_node_modules() {
  # npm ci when node_modules is missing or older than the lock file.
  if [ ! -d node_modules ] || [ ! -f node_modules/.package-lock.json ] \
     || [ package-lock.json -nt node_modules/.package-lock.json ]; then
    log "installing npm packages (npm ci)"
    npm ci --no-audit --no-fund
  fi
}

apt_install() {
  # apt_install BINARY PACKAGE: install a Debian package when its binary is missing.
  local bin="$1" pkg="$2"
  command -v "$bin" >/dev/null 2>&1 && return 0
  if [ "$(id -u)" -ne 0 ]; then
    die "'$bin' is missing. Install the Debian package '$pkg' (sudo apt-get install -y $pkg) and run again."
  fi
  log "installing $pkg (apt-get)"
  DEBIAN_FRONTEND=noninteractive apt-get update -qq
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq "$pkg" >/dev/null
}

mariadb_root() { mariadb --no-defaults --socket="$MARIADB_SOCK" -uroot "$@"; }

mariadb_running() { [ -S "$MARIADB_SOCK" ] && mariadb_root -e 'select 1' >/dev/null 2>&1; }

MARIADB_STARTED_HERE=0
start_mariadb() {
  apt_install mariadbd mariadb-server
  if [ ! -d "$MARIADB_DIR/mysql" ]; then
    log "initialising MariaDB data directory in .data/mariadb"
    mkdir -p "$MARIADB_DIR"
    mariadb-install-db --no-defaults --datadir="$MARIADB_DIR" \
      --auth-root-authentication-method=normal --skip-test-db >"$LOG_DIR/mariadb-install.log" 2>&1
  fi
  if mariadb_running; then
    log "MariaDB already running on 127.0.0.1:$DB_PORT (ours, .data/mariadb)"
    return 0
  fi
  if (exec 3<>"/dev/tcp/127.0.0.1/$DB_PORT") 2>/dev/null; then
    die "port $DB_PORT is taken by another program; set DB_PORT to a free port"
  fi
  log "starting MariaDB on 127.0.0.1:$DB_PORT"
  local user_flag=()
  [ "$(id -u)" -eq 0 ] && user_flag=(--user=root)
  nohup mariadbd --no-defaults --datadir="$MARIADB_DIR" --port="$DB_PORT" --bind-address=127.0.0.1 \
    --socket="$MARIADB_SOCK" --pid-file="$MARIADB_DIR/mysqld.pid" "${user_flag[@]}" \
    --character-set-server=utf8mb4 --collation-server=utf8mb4_unicode_ci \
    --innodb-buffer-pool-size=256M --max-connections=300 --skip-name-resolve \
    --log-error="$LOG_DIR/mariadb.err" >/dev/null 2>&1 &
  for _ in $(seq 1 60); do
    mariadb_running && { MARIADB_STARTED_HERE=1; return 0; }
    sleep 0.5
  done
  tail -20 "$LOG_DIR/mariadb.err" >&2 || true
  die "MariaDB did not answer within 30 s"
}

stop_mariadb() {
  mariadb-admin --no-defaults --socket="$MARIADB_SOCK" -uroot shutdown >/dev/null 2>&1 || true
}

create_database() {
  # create_database NAME: the database and the application user (password auth on 127.0.0.1).
  local name="$1"
  mariadb_root <<SQL
CREATE DATABASE IF NOT EXISTS \`$name\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
CREATE USER IF NOT EXISTS '$DB_USER'@'127.0.0.1' IDENTIFIED BY '$DB_PASSWORD';
ALTER USER '$DB_USER'@'127.0.0.1' IDENTIFIED BY '$DB_PASSWORD';
GRANT ALL PRIVILEGES ON \`$name\`.* TO '$DB_USER'@'127.0.0.1';
FLUSH PRIVILEGES;
SQL
}

# Local fakes for the SMS provider and SMTP, on loopback.
export SMS_FAKE_PORT="${SMS_FAKE_PORT:-4010}"
export SMTP_PORT="${SMTP_PORT:-2525}"
export MAIL_FAKE_HTTP_PORT="${MAIL_FAKE_HTTP_PORT:-4020}"
FAKES_PID=""
start_fakes() {
  if [ -f scripts/fakes/run.ts ]; then
    if curl -fsS "http://127.0.0.1:$SMS_FAKE_PORT/_fake/health" >/dev/null 2>&1; then
      log "fakes already running (SMS :$SMS_FAKE_PORT, SMTP :$SMTP_PORT)"
      return 0
    fi
    log "starting local fakes: SMS API :$SMS_FAKE_PORT, SMTP :$SMTP_PORT, mailbox :$MAIL_FAKE_HTTP_PORT"
    nohup node --import tsx scripts/fakes/run.ts >"$LOG_DIR/fakes.log" 2>&1 &
    FAKES_PID=$!
    for _ in $(seq 1 40); do
      curl -fsS "http://127.0.0.1:$SMS_FAKE_PORT/_fake/health" >/dev/null 2>&1 && return 0
      sleep 0.25
    done
    cat "$LOG_DIR/fakes.log" >&2
    die "the fakes did not start"
  fi
}

stop_fakes() { [ -n "$FAKES_PID" ] && kill "$FAKES_PID" 2>/dev/null || true; }

migrate_and_seed() {
  log "migrating $DB_NAME"
  node --import tsx scripts/db.ts migrate
  log "loading the demo scenario into $DB_NAME"
  node --import tsx scripts/db.ts seed
}

# The app's settings for this machine. A real deployment sets these in its environment
# instead (see README: "Real SMS and e-mail").
# Every signing secret is generated once per installation into the ignored .data folder
# (mode 600); none is written in the repository.
installation_secret() {
  # installation_secret NAME: prints .data/NAME, creating it with 32 random bytes when missing.
  local file="$DATA_DIR/$1"
  if [ ! -s "$file" ]; then
    (umask 077 && head -c 32 /dev/urandom | base64 | tr -d '\n=/+' > "$file")
  fi
  cat "$file"
}
export NEXTAUTH_SECRET="${NEXTAUTH_SECRET:-$(installation_secret nextauth-secret)}"
# The app's database user on our own MariaDB: its password is this installation's too.
export DB_PASSWORD="${DB_PASSWORD:-$(installation_secret db-password)}"
export TWILIO_ACCOUNT_SID="${TWILIO_ACCOUNT_SID:-AC00000000000000000000000000000000}"
# The SMS provider's auth token signs inbound texts (the webhook's only check). With the fakes
# it is this installation's own random token, shared by the app and the SMS fake.
export TWILIO_AUTH_TOKEN="${TWILIO_AUTH_TOKEN:-$(installation_secret sms-auth-token)}"
export TWILIO_FROM_NUMBER="${TWILIO_FROM_NUMBER:-+13205550199}"
export TWILIO_API_BASE="${TWILIO_API_BASE:-http://127.0.0.1:$SMS_FAKE_PORT}"
export SMTP_HOST="${SMTP_HOST:-127.0.0.1}"
export MAIL_FROM="${MAIL_FROM:-Gaffline dispatch <dispatch@cedarprairie.example>}"
# The fakes (and the phone simulator that talks to them) are on for the local demo and tests;
# the app also requires that it is served on loopback before it shows the simulator.
export FAKES_ENABLED="${FAKES_ENABLED:-1}"

APP_PID=""
start_app() {
  # start_app PORT: next start in the background, wait for /api/health.
  local port="$1"
  if (exec 3<>"/dev/tcp/127.0.0.1/$port") 2>/dev/null; then
    die "port $port is taken by another program; stop it or set TEST_PORT to a free port"
  fi
  export NEXTAUTH_URL="http://127.0.0.1:$port"
  export APP_PUBLIC_URL="${APP_PUBLIC_URL:-http://127.0.0.1:$port}"
  # Its own process group, so stopping it also stops the next-server it forks.
  setsid nohup npx next start -H 127.0.0.1 -p "$port" >"$LOG_DIR/app-$port.log" 2>&1 &
  APP_PID=$!
  for _ in $(seq 1 120); do
    curl -fsS "http://127.0.0.1:$port/api/health" >/dev/null 2>&1 && return 0
    kill -0 "$APP_PID" 2>/dev/null || { cat "$LOG_DIR/app-$port.log" >&2; die "the app exited"; }
    sleep 0.5
  done
  cat "$LOG_DIR/app-$port.log" >&2
  die "the app did not answer on :$port within 60 s"
}

stop_app() {
  if [ -n "$APP_PID" ]; then
    kill -- "-$APP_PID" 2>/dev/null || kill "$APP_PID" 2>/dev/null || true
    for _ in $(seq 1 20); do kill -0 -- "-$APP_PID" 2>/dev/null || break; sleep 0.25; done
    kill -9 -- "-$APP_PID" 2>/dev/null || true
    APP_PID=""
  fi
}
