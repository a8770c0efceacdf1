#!/bin/sh
# Ranges of `plumb sweep --vary` and `plumb air --alt` (see ranges.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/ranges.py" "$1"
