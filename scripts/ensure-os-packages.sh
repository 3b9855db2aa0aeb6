#!/usr/bin/env bash
# Plumbline's OS packages for the tests: Debian's chromium (the browser tests drive /usr/bin/chromium;
# nothing downloads a browser) and gdal-bin (GDAL's command-line tools, an outside reference for the
# terrain data) and poppler-utils (pdftotext: the report's print test reads the text of each printed
# PDF page with it). Run first by `npm test`, so that `npm ci && npm test` is all a fresh machine needs.
#
# When a tool is missing and we are root (or have password-less sudo) on a system with apt-get, it
# runs `apt-get update && apt-get install -y chromium gdal-bin poppler-utils`. Otherwise it prints what to install
# and exits 1. PLUMBLINE_SKIP_OS_PACKAGES=1 skips the check (a machine where the tools live elsewhere).
set -euo pipefail

if [ "${PLUMBLINE_SKIP_OS_PACKAGES:-}" = "1" ]; then
  exit 0
fi

# Where the tools are looked for (tests of this script point it at an empty directory).
BIN="${PLUMBLINE_OS_BIN:-/usr/bin}"

find_missing() {
  missing=()
  [ -x "$BIN/chromium" ] || missing+=("chromium")
  for tool in gdalinfo gdal_grid gdaldem gdallocationinfo; do
    [ -x "$BIN/$tool" ] || missing+=("$tool")
  done
  if [ ! -x "$BIN/gdal_fillnodata" ] && [ ! -x "$BIN/gdal_fillnodata.py" ]; then
    missing+=("gdal_fillnodata")
  fi
  [ -x "$BIN/pdftotext" ] || missing+=("pdftotext")
}
find_missing

if [ "${#missing[@]}" -eq 0 ]; then
  exit 0
fi

echo "plumbline: OS packages: missing ${missing[*]} (in $BIN)" >&2

sudo_cmd=()
if [ "$(id -u)" -ne 0 ]; then
  if command -v sudo >/dev/null 2>&1 && sudo -n true >/dev/null 2>&1; then
    sudo_cmd=(sudo -n)
  else
    sudo_cmd=(none)
  fi
fi

if [ "${PLUMBLINE_OS_DRY_RUN:-}" = "1" ]; then
  # For the script's own test: say what would run, run nothing.
  if [ "${sudo_cmd[0]:-}" = "none" ]; then
    echo "plumbline: would refuse: not root and no password-less sudo" >&2
    exit 1
  fi
  echo "plumbline: would run: ${sudo_cmd[*]:+${sudo_cmd[*]} }apt-get update && ${sudo_cmd[*]:+${sudo_cmd[*]} }apt-get install -y chromium gdal-bin poppler-utils" >&2
  exit 0
fi

if [ "${sudo_cmd[0]:-}" = "none" ] || ! command -v apt-get >/dev/null 2>&1; then
  cat >&2 <<'EOF'
plumbline: cannot install them here (not root, no password-less sudo, or no apt-get).
Install Debian's packages, then run npm test again:
    sudo apt-get update && sudo apt-get install -y chromium gdal-bin poppler-utils
(The tests never download a browser; they drive /usr/bin/chromium.)
EOF
  exit 1
fi

echo "plumbline: installing Debian's chromium, gdal-bin and poppler-utils (apt-get, about a minute)" >&2
export DEBIAN_FRONTEND=noninteractive
"${sudo_cmd[@]}" apt-get update -qq
"${sudo_cmd[@]}" apt-get install -y -qq chromium gdal-bin poppler-utils >/dev/null
find_missing
if [ "${#missing[@]}" -ne 0 ]; then
  echo "plumbline: after apt-get install, still missing ${missing[*]} in $BIN; install them by hand and run npm test again" >&2
  exit 1
fi
echo "plumbline: OS packages installed" >&2
