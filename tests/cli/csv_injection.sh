#!/bin/sh
# CSV text cells that a spreadsheet would run as formulas are neutralised (see csv_injection.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/csv_injection.py" "$1"
