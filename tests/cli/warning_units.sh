#!/bin/sh
# A warning's figures are in the report's units: --units us puts the rotor
# wake and the gusts in US units in plumb fall and plumb zone alike, JSON
# stays SI (see warning_units.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/warning_units.py" "$1"
