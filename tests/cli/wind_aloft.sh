#!/bin/sh
# The wind laws used above the boundary layer are warned of (see
# wind_aloft.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/wind_aloft.py" "$1"
