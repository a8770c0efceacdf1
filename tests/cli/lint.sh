#!/bin/sh
# `plumb lint` in JSON, CSV, --units us and -o (see lint.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/lint.py" "$1"
