# Sourced by the CLI test scripts (tests/cli/*.sh) before their checks:
#   . "$(dirname "$0")/lib/setup.sh"
# Takes the script's arguments; $1 is the plumb binary (made absolute into
# $bin). Runs from the source root with LC_ALL=C and the source tree's
# criteria, so reports do not depend on where the binary was built.
# Sets here (tests/cli) and root. Set usage_extra first for more arguments.
set -u
LC_ALL=C
export LC_ALL

if [ $# -lt 1 ]; then
  echo "usage: sh $0 PLUMB${usage_extra:-}" >&2
  exit 2
fi
bin=$1
case $bin in /*) ;; *) bin=$(pwd)/$bin ;; esac

here=$(cd "$(dirname "$0")" && pwd)
root=$(cd "$here/../.." && pwd)
cd "$root" || exit 2
PLUMB_CRITERIA_DIR=profiles/criteria
export PLUMB_CRITERIA_DIR
