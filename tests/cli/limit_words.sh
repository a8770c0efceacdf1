#!/bin/sh
# A limit answer's words in the report's units (see limit_words.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/limit_words.py" "$1"
