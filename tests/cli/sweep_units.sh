#!/bin/sh
# A sweep's varied values in the report's units (see sweep_units.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/sweep_units.py" "$1"
