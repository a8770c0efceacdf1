#!/bin/sh
# The zone on the map and where the impacts land (see zone_map.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/zone_map.py" "$1"
