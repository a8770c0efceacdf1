#!/bin/sh
# A fall with no terminal speed says so in every format (see no_terminal_speed.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/no_terminal_speed.py" "$1"
