#!/bin/sh
# Every command's --help lists every option it accepts (see help.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/help.py" "$1"
