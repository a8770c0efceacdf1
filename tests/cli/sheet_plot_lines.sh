#!/bin/sh
# plumb sheet: the energy plot's lines (see sheet_plot_lines.py). $1: plumb.
exec /usr/bin/python3 "$(dirname "$0")/sheet_plot_lines.py" "$1"
