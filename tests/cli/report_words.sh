#!/bin/sh
# How reports word places, bearings and units (see report_words.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/report_words.py" "$1"
