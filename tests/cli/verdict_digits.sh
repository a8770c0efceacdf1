#!/bin/sh
# A figure beside its limit reads as the verdict says (see verdict_digits.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/verdict_digits.py" "$1"
