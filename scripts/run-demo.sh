#!/usr/bin/env bash
# Starts the Sectionbench desktop app on its demo study (a fictional student
# team's rear wing), installing what is missing first.
set -euo pipefail
cd "$(dirname "$0")/.."
scripts/setup.sh --quiet
export PATH="$PATH:/usr/local/go/bin:$HOME/go/bin" GOTOOLCHAIN=auto LANG=en_US.UTF-8
exec go run ./cmd/sectionbench "$@"
