#!/bin/sh
# The size of the body in inches in US reports (see body_sizes.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/body_sizes.py" "$1"
