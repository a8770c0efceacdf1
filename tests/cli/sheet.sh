#!/bin/sh
# plumb sheet end to end, the PDF read back with poppler (see sheet.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/sheet.py" "$1"
