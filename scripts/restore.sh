#!/usr/bin/env bash
# npm run restore -- BACKUP [--database NAME] [--uploads-dir DIR] [--replace]
#
# Loads a folder written by scripts/backup.sh into a database and an uploads folder, after
# checking its SHA256SUMS. The instance is the one DB_HOST / DB_PORT name (default: this
# checkout's MariaDB), as root over the socket when it is this checkout's own instance, else
# as the app's account (DB_USER / DB_PASSWORD), which must be allowed to create the
# database; the database defaults to DB_NAME, else the one the backup came
# from. A database that already has tables, or an uploads folder that is not empty, is
# left alone unless --replace is given: then the database is dropped and created afresh and
# the folder emptied first, so nothing from before the restore survives beside it.
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"

usage() { fail "usage: npm run restore -- BACKUP [--database NAME] [--uploads-dir DIR] [--replace]"; }
absolute() { case "$1" in /*) echo "$1" ;; *) echo "${INIT_CWD:-$ROOT}/$1" ;; esac; }

BACKUP="" TARGET_DB="${DB_NAME:-}" TARGET_UPLOADS="${UPLOADS_DIR:-$DATA_DIR/uploads}" REPLACE=0
while [ $# -gt 0 ]; do
	case "$1" in
	--database) TARGET_DB="${2:-}"; shift 2 ;;
	--uploads-dir) TARGET_UPLOADS="$(absolute "${2:-}")"; shift 2 ;;
	--replace) REPLACE=1; shift ;;
	-*) usage ;;
	*) [ -z "$BACKUP" ] || usage; BACKUP="$(absolute "$1")"; shift ;;
	esac
done
[ -n "$BACKUP" ] || usage
[ -f "$BACKUP/database.sql.gz" ] || fail "restore: $BACKUP holds no database.sql.gz"
if [ -z "$TARGET_DB" ]; then
	TARGET_DB="$(sed -n 's/^database: \([^ ]*\) .*/\1/p' "$BACKUP/manifest.txt")"
fi
[[ "$TARGET_DB" =~ ^[A-Za-z0-9_]+$ ]] || fail "restore: '$TARGET_DB' is not a database name this script accepts"

DB_HOST="${DB_HOST:-127.0.0.1}"
[ -n "${DB_PORT:-}" ] || DB_PORT="$(cat "$DATA_DIR/db.port" 2>/dev/null || echo 3307)"
# This checkout's own instance (the one scripts/db.sh runs under SLOTWISE_DATA_DIR): its root
# over the socket, which may create any database. Any other server: the app's account.
SOCKET="$DATA_DIR/mariadb.sock"
if [ "$DB_HOST" = 127.0.0.1 ] &&
	[ "$(mariadb --no-defaults --socket="$SOCKET" -uroot -N -e 'SELECT @@port' 2>/dev/null)" = "$DB_PORT" ]; then
	client() { mariadb --no-defaults --socket="$SOCKET" -uroot "$@"; }
else
	export MYSQL_PWD="${DB_PASSWORD:-slotwise-dev}"
	client() { mariadb --no-defaults -h "$DB_HOST" -P "$DB_PORT" -u "${DB_USER:-slotwise}" "$@"; }
fi

step "Checking $BACKUP against its SHA256SUMS"
(cd "$BACKUP" && sha256sum --check --quiet SHA256SUMS) || fail "restore: the backup's files do not match SHA256SUMS"

tables="$(client -N -e "SELECT COUNT(*) FROM information_schema.tables WHERE table_schema = '$TARGET_DB'")" ||
	fail "restore: cannot reach $DB_HOST:$DB_PORT"
if [ "$tables" != "0" ] && [ "$REPLACE" -ne 1 ]; then
	fail "restore: $TARGET_DB on $DB_HOST:$DB_PORT already has $tables tables (add --replace to drop it first)"
fi
if [ -f "$BACKUP/uploads.tar.gz" ] && [ -n "$(ls -A "$TARGET_UPLOADS" 2>/dev/null)" ] && [ "$REPLACE" -ne 1 ]; then
	fail "restore: $TARGET_UPLOADS is not empty (add --replace to empty it first)"
fi

started=$EPOCHREALTIME
step "Restoring into $TARGET_DB on $DB_HOST:$DB_PORT"
if [ "$REPLACE" -eq 1 ]; then
	client -e "DROP DATABASE IF EXISTS \`$TARGET_DB\`" || fail "restore: drop $TARGET_DB"
fi
client -e "CREATE DATABASE IF NOT EXISTS \`$TARGET_DB\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci" ||
	fail "restore: create $TARGET_DB"
gunzip -c "$BACKUP/database.sql.gz" | client --default-character-set=utf8mb4 "$TARGET_DB" ||
	fail "restore: load the dump into $TARGET_DB"

if [ -f "$BACKUP/uploads.tar.gz" ]; then
	step "Restoring the uploads into $TARGET_UPLOADS"
	if [ "$REPLACE" -eq 1 ] && [ -d "$TARGET_UPLOADS" ]; then
		find "$TARGET_UPLOADS" -mindepth 1 -delete || fail "restore: empty $TARGET_UPLOADS"
	fi
	mkdir -p "$TARGET_UPLOADS"
	tar -C "$TARGET_UPLOADS" -xzf "$BACKUP/uploads.tar.gz" || fail "restore: unpack the uploads"
fi

seconds=$(awk "BEGIN { print $EPOCHREALTIME - $started }")
printf '\nRestored %s into %s on %s:%s in %.1f s\n' "$BACKUP" "$TARGET_DB" "$DB_HOST" "$DB_PORT" "$seconds"
