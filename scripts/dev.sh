#!/usr/bin/env bash
# npm run dev
exec bash "$(dirname "$0")/bootstrap.sh" scripts/dev.ts "$@"
