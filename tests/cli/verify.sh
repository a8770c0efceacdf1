#!/bin/sh
# `plumb verify`: published reference checks (see verify.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/verify.py" "$1"
