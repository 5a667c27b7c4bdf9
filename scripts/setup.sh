#!/usr/bin/env bash
# Installs what Sectionbench needs on a Debian or Ubuntu machine, skipping
# whatever is already there: a Go toolchain new enough to fetch the one
# go.mod asks for, the C headers Fyne's OpenGL driver builds against, and the
# tools the test suite uses (Xvfb for the window check, poppler for reading
# the PDF report, ImageMagick and xdotool for screenshots).
#
#   scripts/setup.sh            # everything
#   scripts/setup.sh --quiet    # less output (CI)
set -euo pipefail
quiet=0
[ "${1:-}" = "--quiet" ] && quiet=1
say() { [ "$quiet" = 1 ] || echo "setup: $*"; }

sudo_cmd=()
if [ "$(id -u)" != 0 ]; then
  if command -v sudo >/dev/null; then sudo_cmd=(sudo); else
    echo "setup: not root and no sudo; install the packages listed in scripts/setup.sh by hand" >&2; exit 1
  fi
fi

# Debian package → a file that shows it is installed.
declare -A want=(
  [gcc]=/usr/bin/gcc
  [pkg-config]=/usr/bin/pkg-config
  [libgl1-mesa-dev]=/usr/include/GL/gl.h
  [xorg-dev]=/usr/include/X11/extensions/Xrandr.h
  [libxxf86vm-dev]=/usr/include/X11/extensions/xf86vmode.h
  [xvfb]=/usr/bin/Xvfb
  [xauth]=/usr/bin/xauth
  [x11-utils]=/usr/bin/xwininfo
  [xdotool]=/usr/bin/xdotool
  [imagemagick]=/usr/bin/import
  [poppler-utils]=/usr/bin/pdftotext
  [ca-certificates]=/etc/ssl/certs/ca-certificates.crt
  [git]=/usr/bin/git
)
missing=()
for pkg in "${!want[@]}"; do
  [ -e "${want[$pkg]}" ] || missing+=("$pkg")
done

# Go: use an installed toolchain if it is 1.21 or newer (it fetches the
# version go.mod names through the module proxy by itself); otherwise ask
# the distribution for one.
export PATH="$PATH:/usr/local/go/bin:$HOME/go/bin"
go_ok() {
  command -v go >/dev/null || return 1
  local v; v=$(go env GOVERSION 2>/dev/null | sed 's/^go//')
  local major=${v%%.*} rest=${v#*.}; local minor=${rest%%.*}
  [ "${major:-0}" -gt 1 ] || [ "${minor:-0}" -ge 21 ]
}
go_ok || missing+=(golang-go)

if [ ${#missing[@]} -gt 0 ]; then
  say "installing ${missing[*]}"
  export DEBIAN_FRONTEND=noninteractive
  "${sudo_cmd[@]}" apt-get update -qq
  "${sudo_cmd[@]}" apt-get install -y -qq --no-install-recommends "${missing[@]}" >/dev/null
fi
if ! go_ok; then
  # Debian 12's own Go is 1.19; its backports carry a newer one.
  codename=$(. /etc/os-release && echo "${VERSION_CODENAME:-}")
  if [ -n "$codename" ] && apt-cache policy "golang-go" 2>/dev/null | grep -q "$codename-backports"; then
    "${sudo_cmd[@]}" apt-get install -y -qq -t "$codename-backports" golang-go >/dev/null
  fi
fi
go_ok || { echo "setup: need Go 1.21 or newer (found: $(go version 2>/dev/null || echo none))" >&2; exit 1; }
export GOTOOLCHAIN=auto
say "Go $(go env GOVERSION); modules"
go mod download
