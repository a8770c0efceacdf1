#!/bin/sh
# A sweep row that cannot be computed is that row's error (see sweep_rows.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/sweep_rows.py" "$1"
