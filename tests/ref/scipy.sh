#!/bin/sh
# Independent cross-check of `plumb fall` against SciPy (see scipy_ref.py).
# $1: the plumb binary. Debian's python3-scipy lives in /usr/bin/python3.
exec /usr/bin/python3 "$(dirname "$0")/scipy_ref.py" "$1"
