#!/bin/sh
# A kit zone says of its clearance radius what its figures show (see
# zone_kit_reach.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/zone_kit_reach.py" "$1"
