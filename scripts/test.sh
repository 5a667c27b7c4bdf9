#!/usr/bin/env bash
# The whole Sectionbench test suite, from a fresh machine: installs what is
# missing (scripts/setup.sh), then runs every package's tests, the solver and
# UI tests again under the race detector, each fuzz target for a short
# time, the CGO-free build of the command-line tool, and the real window
# under Xvfb (scripts/screenshot.sh).
#
#   scripts/test.sh                 # everything
#   FUZZTIME=60s scripts/test.sh    # longer fuzzing
set -euo pipefail
cd "$(dirname "$0")/.."
export LANG=en_US.UTF-8
scripts/setup.sh --quiet
export PATH="$PATH:/usr/local/go/bin:$HOME/go/bin" GOTOOLCHAIN=auto
fuzztime=${FUZZTIME:-15s}

# The report's tests read the PDF back with poppler (its golden text among
# them); without it they would fail one by one, so say it once here.
for t in pdfinfo pdftotext pdftoppm; do
  command -v "$t" >/dev/null || { echo "test.sh: $t not found: install poppler-utils (scripts/setup.sh)" >&2; exit 1; }
done

echo "== unit, validation and headless UI tests"
go test -count=1 -timeout 20m ./...

echo "== race detector: solver and UI (rendering runs off the UI goroutine)"
# -short leaves out the long numerical polars, which have no concurrency of
# their own and run ten times slower under the detector.
go test -count=1 -timeout 20m -race -short ./solver/... ./ui/...

echo "== fuzzing, $fuzztime per target"
for pkg in ./model/ ./cmd/sectionbench-cli/; do
  for target in $(go test -list '^Fuzz' "$pkg" | grep '^Fuzz' || true); do
    echo "-- $pkg $target"
    # The fuzzing engine can end a run that found nothing with "context
    # deadline exceeded" when its time runs out mid-input (a Go fuzzing
    # flake; FuzzDecodeStudy on 2026-12-05, no failing input written). A
    # run that found an input writes it under testdata/fuzz and says
    # "Failing input written to": that fails at once; the flake is run
    # again, once.
    log=$(mktemp)
    if ! go test -run '^$' -fuzz "^${target}\$" -fuzztime "$fuzztime" "$pkg" 2>&1 | tee "$log"; then
      if grep -q 'Failing input written to' "$log" || ! grep -q 'context deadline exceeded' "$log"; then
        rm -f "$log"
        exit 1
      fi
      echo "-- $pkg $target again: the run above ended on the fuzzing engine's deadline without a failing input"
      go test -run '^$' -fuzz "^${target}\$" -fuzztime "$fuzztime" "$pkg"
    fi
    rm -f "$log"
  done
done

echo "== the command-line tool builds without cgo"
CGO_ENABLED=0 go build -o /dev/null ./cmd/sectionbench-cli

echo "== the desktop window appears under Xvfb"
scripts/screenshot.sh "${SCREENSHOT_DIR:-$(mktemp -d)}"
echo "all checks passed"
