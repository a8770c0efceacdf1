#!/bin/sh
# Numbers stay with their units and a kit's drift reads as a fall's (see number_layout.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/number_layout.py" "$1"
