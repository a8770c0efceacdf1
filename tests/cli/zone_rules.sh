#!/bin/sh
# The zone's simple rules (see zone_rules.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/zone_rules.py" "$1"
