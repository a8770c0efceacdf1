#!/bin/sh
# Installs what plumb needs to build (and, with --tests, to test) when it is
# missing, on Debian: probes with pkg-config and a header/module test, then
# runs `apt-get update` once and `apt-get install -y` as root, or through
# sudo. With neither, prints the exact apt line and exits 2.
# Says nothing when nothing is missing; otherwise one line, with apt's own
# output kept in a temporary log that is shown only if the install fails.
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
# the PDF sheet: cairo and pango, and a font for them to embed
pc cairo      || need libcairo2-dev
pc pangocairo || need libpango1.0-dev
[ -f /usr/share/fonts/truetype/dejavu/DejaVuSans.ttf ] || need fonts-dejavu-core
# and one for names in Chinese, Japanese or Korean, which pango takes when
# DejaVu lacks a character (without one the sheet refuses such a name):
# WenQuanYi Micro Hei, 5 MB installed, against 16 MB for fonts-wqy-zenhei,
# 21 MB for fonts-arphic-uming and 91 MB for fonts-noto-cjk (apt-cache show)
for lang in zh ja ko; do
  fc-list ":lang=$lang" family 2>/dev/null | grep -q . || need fonts-wqy-microhei
done
if [ "$want_tests" = 1 ]; then
  pc cmocka || need libcmocka-dev
  # the sheet's tests read the PDF with poppler's tools
  command -v pdftotext >/dev/null 2>&1 || need poppler-utils
  /usr/bin/python3 -c 'import scipy.integrate, numpy' >/dev/null 2>&1 || need python3-scipy
  # the zone's GeoJSON read back by GDAL, its coordinates by PROJ's geodesic
  command -v ogrinfo >/dev/null 2>&1 || need gdal-bin
  /usr/bin/python3 -c 'import pyproj' >/dev/null 2>&1 || need python3-pyproj
fi

missing=$(echo $missing | tr ' ' '\n' | sort -u | tr '\n' ' ')
[ -z "$(echo $missing | tr -d ' ')" ] && exit 0

line="apt-get update && apt-get install -y $missing"
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
# apt's output goes to a log, shown only when something fails.
log=$(mktemp "${TMPDIR:-/tmp}/plumb-deps.XXXXXX") || exit 2
trap 'rm -f "$log"' EXIT
printf 'plumb: installing %s... ' "$missing" >&2
# Another install in progress (a second build, unattended upgrades) holds
# dpkg's lock: wait for it rather than fail.
wait_lock="-o DPkg::Lock::Timeout=600"
# shellcheck disable=SC2086
if $SUDO apt-get update -q $wait_lock >"$log" 2>&1 && $SUDO apt-get install -y -q $wait_lock $missing >>"$log" 2>&1; then
  echo "done" >&2
  exit 0
fi
echo "failed:" >&2
cat "$log" >&2
echo "plumb: could not install the packages; run: $line" >&2
exit 2
