#!/bin/sh
# Installs what plumb needs to build (and, with --tests, to test) when it is
# missing, on Debian: probes with pkg-config and a header/module test, then
# runs `apt-get update` once and `apt-get install -y` as root, or through
# sudo. With neither, prints the exact apt line and exits 2.
set -u
want_tests=0
[ "${1:-}" = "--tests" ] && want_tests=1

missing=""
need() { missing="$missing $1"; }

command -v pkg-config >/dev/null 2>&1 || need pkg-config
command -v cc >/dev/null 2>&1 || need gcc
command -v make >/dev/null 2>&1 || need make
pc() { pkg-config --exists "$1" 2>/dev/null; }
pc gsl       || need libgsl-dev
pc yaml-0.1  || need libyaml-dev
pc udunits   || need libudunits2-dev
[ -f /usr/include/udunits2/udunits2.h ] || [ -f /usr/include/udunits2.h ] || need libudunits2-dev
pc jansson   || need libjansson-dev
if [ "$want_tests" = 1 ]; then
  pc cmocka || need libcmocka-dev
  /usr/bin/python3 -c 'import scipy.integrate, numpy' >/dev/null 2>&1 || need python3-scipy
fi

missing=$(echo $missing | tr ' ' '\n' | sort -u | tr '\n' ' ')
[ -z "$(echo $missing | tr -d ' ')" ] && exit 0

line="apt-get update && apt-get install -y $missing"
echo "plumb: installing missing packages: $missing" >&2
if [ "$(id -u)" = 0 ]; then
  SUDO=""
elif command -v sudo >/dev/null 2>&1 && sudo -n true 2>/dev/null; then
  SUDO="sudo"
else
  echo "plumb: cannot install packages (not root, no sudo). Run as root:" >&2
  echo "  $line" >&2
  exit 2
fi
export DEBIAN_FRONTEND=noninteractive
$SUDO apt-get update -qq >&2 || { echo "plumb: apt-get update failed; run: $line" >&2; exit 2; }
# shellcheck disable=SC2086
$SUDO apt-get install -y -qq $missing >&2 || { echo "plumb: install failed; run: $line" >&2; exit 2; }
exit 0
