#!/usr/bin/env bash
# npm start
exec bash "$(dirname "$0")/bootstrap.sh" scripts/start.ts "$@"
