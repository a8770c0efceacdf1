#!/bin/sh
# Text reports fit 80 columns, names whole, US units throughout (see
# report_width.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/report_width.py" "$1"
