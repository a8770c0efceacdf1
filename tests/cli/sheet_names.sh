#!/bin/sh
# plumb sheet: long item names without spaces in the table (see sheet_names.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/sheet_names.py" "$1"
