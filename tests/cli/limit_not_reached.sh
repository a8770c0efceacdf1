#!/bin/sh
# A drift limit not reached below the air model's top, and one reached (see limit_not_reached.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/limit_not_reached.py" "$1"
