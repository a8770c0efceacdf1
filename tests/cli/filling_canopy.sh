#!/bin/sh
# A canopy still filling at impact is reported as such in every report
# (see filling_canopy.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/filling_canopy.py" "$1"
