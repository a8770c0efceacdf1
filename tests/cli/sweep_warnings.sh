#!/bin/sh
# A sweep's warnings mark their rows in text and CSV (see sweep_warnings.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/sweep_warnings.py" "$1"
