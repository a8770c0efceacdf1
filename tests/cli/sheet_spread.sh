#!/bin/sh
# plumb sheet: the zone's spread, warnings and degenerate cases (see sheet_spread.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/sheet_spread.py" "$1"
