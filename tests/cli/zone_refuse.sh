#!/bin/sh
# A zone without uncertainty is refused; one whose uncertainty cannot move
# the impact point says so in every format (see zone_refuse.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/zone_refuse.py" "$1"
