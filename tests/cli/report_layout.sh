#!/bin/sh
# Title lines, verdict columns, sweep headers and the steady descent line
# of the text reports (see report_layout.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/report_layout.py" "$1"
