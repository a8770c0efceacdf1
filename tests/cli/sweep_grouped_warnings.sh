#!/bin/sh
# A warning said of every row with other figures is one warning over the rows (see sweep_grouped_warnings.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/sweep_grouped_warnings.py" "$1"
