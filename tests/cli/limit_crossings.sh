#!/bin/sh
# A limit's crossings print as its answer does, and say when a canopy does not fill (see limit_crossings.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/limit_crossings.py" "$1"
