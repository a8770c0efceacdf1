#!/bin/sh
# Unconfirmed criteria stay marked "from memory" everywhere (see criteria_status.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/criteria_status.py" "$1"
