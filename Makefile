# Yokeline: two commands do everything. `make start` serves the demo; `make test` runs every test.
SHELL := /bin/bash
.DEFAULT_GOAL := help
export AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED := true

.PHONY: help start stop test dev db-reset lint deps deps-test build build-api build-web bench backup restore

help:
	@echo "make start    install what is missing, start database and fakes, migrate, seed, serve http://127.0.0.1:$${PORT:-3000}"
	@echo "make test     the same set-up on its own ports, then lint, type-check, unit, API and browser tests"
	@echo "make stop     stop what make start started"
	@echo "make dev      Vite dev server with proxy + API in watch mode"
	@echo "make db-reset drop and recreate the demo database"
	@echo "make lint     eslint with type-aware rules and import boundaries"
	@echo "make backup   dump the demo database and object storage to backups/<time>"
	@echo "make restore FILE=backups/<folder>  put a backup back"
	@echo "make bench    run the benchmarks (not part of make test)"

deps:
	@scripts/ensure-deps.sh

deps-test:
	@scripts/ensure-deps.sh --browser

build-api:
	@npx tsc -p tsconfig.api.json

build-web:
	@npx vite build --config vite.config.mts --logLevel warn

build: build-api build-web

start: deps build
	@scripts/stack.sh serve dev

stop:
	@scripts/stack.sh down dev

test: deps-test build
	@scripts/test.sh

dev: deps build-api
	@scripts/stack.sh up dev
	@node dist/server/src-api/seed/seed.js
	@echo "Vite on http://127.0.0.1:5173 (proxying /api to :$${PORT:-3000})"
	@trap 'kill 0' INT TERM; \
	  eval "$$(scripts/stack.sh env dev)"; \
	  npx tsc -p tsconfig.api.json --watch --preserveWatchOutput & \
	  node --watch-path=dist/server dist/server/src-api/main.js & \
	  npx vite --config vite.config.mts & \
	  wait

db-reset: deps build-api
	@eval "$$(scripts/stack.sh env dev)"; scripts/pg.sh start dev; \
	  psql -q -h 127.0.0.1 -p $$PGPORT -U postgres -d postgres -c 'drop database if exists yokeline with (force)'; \
	  node dist/server/src-api/db/migrate.js && node dist/server/src-api/seed/seed.js

lint: deps
	@npx eslint . --max-warnings=0

backup:
	@scripts/backup.sh backup dev

restore:
	@test -n "$(FILE)" || { echo "usage: make restore FILE=backups/<folder>"; exit 2; }
	@scripts/backup.sh restore dev "$(FILE)"

bench: deps-test build
	@PGPORT=$${PGPORT:-55434} scripts/pg.sh start bench >/dev/null
	@PGPORT=$${PGPORT:-55434} node dist/server/bench/run.js $(ONLY)
