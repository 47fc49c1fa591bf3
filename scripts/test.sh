#!/usr/bin/env bash
# npm test
exec bash "$(dirname "$0")/bootstrap.sh" scripts/test.ts "$@"
