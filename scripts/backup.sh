#!/usr/bin/env bash
# npm run backup [-- DEST]: one consistent copy of the database and the uploads folder.
#
#   DEST/database.sql.gz   mariadb-dump --single-transaction --routines --triggers --events
#                          (one InnoDB snapshot: rows committed before the dump began, none
#                          after; no table locks, so the app keeps writing meanwhile)
#   DEST/uploads.tar.gz    the uploads folder, when it exists
#   DEST/manifest.txt      what was copied, from where, when
#   DEST/SHA256SUMS        checked by scripts/restore.sh before it touches anything
#
# DEST defaults to .data/backups/<database>-<UTC time>. The dump runs as the app's account
# over TCP (DB_HOST, DB_PORT, DB_USER, DB_PASSWORD, DB_NAME; the port defaults to this
# checkout's MariaDB), so the same command works against a deployment's server. DDL (a
# migration) must not run during a dump: --single-transaction does not isolate it.
# Restore with: npm run restore -- DEST
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"

DB_NAME="${DB_NAME:-slotwise}"
DB_HOST="${DB_HOST:-127.0.0.1}"
[ -n "${DB_PORT:-}" ] || DB_PORT="$(cat "$DATA_DIR/db.port" 2>/dev/null || echo 3307)"
UPLOADS_DIR="${UPLOADS_DIR:-$DATA_DIR/uploads}"
export MYSQL_PWD="${DB_PASSWORD:-slotwise-dev}"

# npm runs scripts from the package root; a relative DEST is meant from where npm was called.
absolute() { case "$1" in /*) echo "$1" ;; *) echo "${INIT_CWD:-$ROOT}/$1" ;; esac; }
DEST="$(absolute "${1:-$DATA_DIR/backups/$DB_NAME-$(date -u +%Y%m%dT%H%M%SZ)}")"
if [ -e "$DEST" ] && [ -n "$(ls -A "$DEST" 2>/dev/null)" ]; then
	fail "backup: $DEST exists and is not empty"
fi
mkdir -p "$DEST"

started=$EPOCHREALTIME
step "Dumping $DB_NAME from $DB_HOST:$DB_PORT"
mariadb-dump --no-defaults -h "$DB_HOST" -P "$DB_PORT" -u "${DB_USER:-slotwise}" \
	--single-transaction --routines --triggers --events --hex-blob \
	--default-character-set=utf8mb4 --no-tablespaces "$DB_NAME" | gzip -6 >"$DEST/database.sql.gz" ||
	fail "backup: mariadb-dump of $DB_NAME"

uploads="none"
if [ -d "$UPLOADS_DIR" ]; then
	step "Archiving the uploads in $UPLOADS_DIR"
	tar -C "$UPLOADS_DIR" -czf "$DEST/uploads.tar.gz" . || fail "backup: archive $UPLOADS_DIR"
	uploads="$UPLOADS_DIR ($(find "$UPLOADS_DIR" -type f | wc -l) files)"
fi

cat >"$DEST/manifest.txt" <<MANIFEST
database: $DB_NAME on $DB_HOST:$DB_PORT (MariaDB $(mariadb --no-defaults -h "$DB_HOST" -P "$DB_PORT" -u "${DB_USER:-slotwise}" -N -e 'SELECT VERSION()' "$DB_NAME"))
uploads: $uploads
taken: $(date -u +%Y-%m-%dT%H:%M:%SZ)
dump: mariadb-dump --single-transaction --routines --triggers --events --hex-blob
MANIFEST
(cd "$DEST" && sha256sum database.sql.gz $([ -f uploads.tar.gz ] && echo uploads.tar.gz) manifest.txt >SHA256SUMS)

seconds=$(awk "BEGIN { print $EPOCHREALTIME - $started }")
printf '\nBackup of %s written to %s in %.1f s (%s)\n' "$DB_NAME" "$DEST" "$seconds" "$(du -sh "$DEST" | cut -f1)"
