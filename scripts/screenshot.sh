#!/usr/bin/env bash
# screenshot.sh — build the desktop workbench, start it on a virtual X
# display, wait for its window and save PNG screenshots.
#
#   scripts/screenshot.sh OUTDIR [study.json]
#
# Environment:
#   FYNE_SCALE=2       draw at twice the size (HiDPI check)
#   FYNE_THEME=dark    dark theme (light is the default)
#   SHOT_WAIT=8        seconds to let the first solve and render settle
#   SHOT_TIMEOUT=60    seconds to wait for the window before giving up
#   SHOT_NAME=main     base name of the PNG files
#   SHOT_BIN=path      use this sectionbench binary instead of building one
#
# Needs xvfb (Xvfb), xdotool, imagemagick (import, convert) and the Fyne
# build dependencies (libgl1-mesa-dev, xorg-dev). Exits non-zero if the
# window never appears.
set -euo pipefail
export LANG=${LANG:-en_US.UTF-8}
[ "$LANG" = C.UTF-8 ] && export LANG=en_US.UTF-8  # Fyne cannot parse the C locale

out=${1:?usage: scripts/screenshot.sh OUTDIR [study.json]}
study=${2:-}
wait_s=${SHOT_WAIT:-8}
timeout_s=${SHOT_TIMEOUT:-60}
name=${SHOT_NAME:-main}
scale=${FYNE_SCALE:-1}

for tool in Xvfb xdotool import; do
	command -v "$tool" >/dev/null || { echo "screenshot.sh: $tool not found (apt-get install xvfb xdotool imagemagick)" >&2; exit 2; }
done

root=$(cd "$(dirname "$0")/.." && pwd)
mkdir -p "$out"
out=$(cd "$out" && pwd)
bin=$(mktemp -d)/sectionbench
if [ -n "${SHOT_BIN:-}" ]; then
	cp "$SHOT_BIN" "$bin"
else
	echo "building cmd/sectionbench…" >&2
	(cd "$root" && go build -o "$bin" ./cmd/sectionbench)
fi

# The screen is the window size times the scale, plus room for decorations.
w=$(awk -v s="$scale" 'BEGIN { printf "%d", 1280 * s + 64 }')
h=$(awk -v s="$scale" 'BEGIN { printf "%d", 800 * s + 64 }')

# Pick a free display number.
disp=99
while [ -e "/tmp/.X${disp}-lock" ]; do disp=$((disp + 1)); done
Xvfb ":$disp" -screen 0 "${w}x${h}x24" -nolisten tcp >/dev/null 2>&1 &
xvfb_pid=$!
app_pid=
cleanup() {
	if [ -n "$app_pid" ]; then
		kill "$app_pid" 2>/dev/null || true
		wait "$app_pid" 2>/dev/null || true
	fi
	kill "$xvfb_pid" 2>/dev/null || true
	wait "$xvfb_pid" 2>/dev/null || true
	rm -rf "$(dirname "$bin")"
}
trap cleanup EXIT
export DISPLAY=":$disp"
for _ in $(seq 50); do xdpyinfo >/dev/null 2>&1 && break; sleep 0.1; done

# A fresh settings directory so the user's own Fyne preferences do not leak in.
export XDG_CONFIG_HOME=$(dirname "$bin")/config
mkdir -p "$XDG_CONFIG_HOME"
export FYNE_SCALE="$scale"
[ -n "${FYNE_THEME:-}" ] && export FYNE_THEME

if [ -n "$study" ]; then
	"$bin" "$study" >"$out/$name.log" 2>&1 &
else
	"$bin" >"$out/$name.log" 2>&1 &
fi
app_pid=$!

win=
deadline=$((SECONDS + timeout_s))
while [ $SECONDS -lt $deadline ]; do
	if ! kill -0 "$app_pid" 2>/dev/null; then
		echo "screenshot.sh: the app exited early; log:" >&2
		cat "$out/$name.log" >&2
		exit 1
	fi
	win=$(xdotool search --onlyvisible --name 'Sectionbench' 2>/dev/null | head -n1 || true)
	[ -n "$win" ] && break
	sleep 0.5
done
if [ -z "$win" ]; then
	echo "screenshot.sh: no Sectionbench window within ${timeout_s}s; log:" >&2
	cat "$out/$name.log" >&2
	exit 1
fi

sleep "$wait_s"
import -window root "$out/$name-screen.png"
import -window "$win" "$out/$name.png"
echo "$out/$name.png" "$out/$name-screen.png"
