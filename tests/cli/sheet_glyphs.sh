#!/bin/sh
# plumb sheet: characters no installed font has, and CJK names (see sheet_glyphs.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/sheet_glyphs.py" "$1"
