#!/bin/sh
# plumb sweep and plumb limit end to end (see sweep_limit.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/sweep_limit.py" "$1"
