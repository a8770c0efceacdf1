#!/bin/sh
# The two-way sweep's boundary table (see sweep_boundary.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/sweep_boundary.py" "$1"
