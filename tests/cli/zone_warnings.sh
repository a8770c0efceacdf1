#!/bin/sh
# A zone's warnings are printed whole, as plumb fall prints them, in text,
# JSON and CSV (see zone_warnings.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/zone_warnings.py" "$1"
