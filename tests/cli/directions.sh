#!/bin/sh
# A direction (wind.from, release.velocity.heading, a wind table's from)
# may be a 16-point compass point alone wherever a value of it is given:
# --set (tests/cli/bad_inputs.sh), the ends of a --vary range and the
# values of an uncertainty. On the 16-point rose each point is 360/16 =
# 22.5 deg clockwise from the one before, N = 0 (the rose's definition;
# common practice, no source), so NW is 315 deg and NE 45 deg: each check
# compares the report with the same degrees written out, which must be
# identical. Errors name the option (README.md "Exit status": exit 2).
#
#   sh tests/cli/directions.sh PLUMB
#
# Ends with one line `cli: N passed, N failed, N skipped`.
. "$(dirname "$0")/lib/setup.sh"
prof=profiles/demo/hand-tool.yaml

tmp=$(mktemp -d "${TMPDIR:-/tmp}/plumb-dir.XXXXXX") || exit 2
trap 'rm -rf "$tmp"' EXIT
trap 'exit 2' INT TERM

pass=0
fail=0
bad() { fail=$((fail + 1)); echo "FAIL: $*"; }

# same NAME -- ARGS_A -- ARGS_B: both runs succeed with identical stdout.
same() {
  name=$1
  shift 2
  a=""
  while [ "$1" != "--" ]; do a="$a $(printf '%s' "$1" | sed "s/'/'\\\\''/g;s/^/'/;s/\$/'/")"; shift; done
  shift
  eval "\"\$bin\" $a" >"$tmp/a.out" 2>"$tmp/a.err"
  ra=$?
  "$bin" "$@" >"$tmp/b.out" 2>"$tmp/b.err"
  rb=$?
  if [ $ra -ne 0 ] || [ $rb -ne 0 ]; then
    bad "$name: exit $ra and $rb: $(cat "$tmp/a.err" "$tmp/b.err" | head -n 2)"
  elif [ ! -s "$tmp/a.out" ] || ! cmp -s "$tmp/a.out" "$tmp/b.out"; then
    bad "$name: the reports differ"
    diff "$tmp/a.out" "$tmp/b.out" | head -n 6
  else
    pass=$((pass + 1))
  fi
}

# refused NAME WANT -- ARGS: exit 2, stderr holds WANT, nothing on stdout.
refused() {
  name=$1
  want=$2
  shift 3
  "$bin" "$@" >"$tmp/r.out" 2>"$tmp/r.err"
  rc=$?
  if [ $rc -ne 2 ]; then
    bad "$name: exit $rc, expected 2"
  elif ! grep -F -q -e "$want" "$tmp/r.err"; then
    bad "$name: stderr lacks '$want': $(head -n 2 "$tmp/r.err")"
  elif [ -s "$tmp/r.out" ]; then
    bad "$name: printed to stdout"
  else
    pass=$((pass + 1))
  fi
}

# ---- --vary: compass points as the ends of a range ---------------------------
# positive STEP turns clockwise, through north when TO lies behind FROM:
# NW:NE is 315 deg to 405 deg (405 deg is the direction of 45 deg)
for fmt in text json csv; do
  same "--vary wind.from=NW:NE:22.5deg ($fmt)" -- sweep "$prof" --vary "wind.from=NW:NE:22.5deg" \
    --format $fmt -- sweep "$prof" --vary "wind.from=315deg:405deg:22.5deg" --format $fmt
done
same "--vary wind.from=NE:NW:-45deg" -- sweep "$prof" --vary "wind.from=NE:NW:-45deg" --format csv \
  -- sweep "$prof" --vary "wind.from=45deg:-45deg:-45deg" --format csv
same "--vary heading=e:S:45 deg" -- sweep "$prof" --vary "release.velocity.heading=e:S:45 deg" \
  --format csv -- sweep "$prof" --vary "release.velocity.heading=90deg:180deg:45deg" --format csv
# a direction swept through north is shown as the bearings it is, 0 to
# 360 deg (405 deg is 45 deg), and the range line says which way it turns
out=$("$bin" sweep "$prof" --vary "wind.from=NW:NE:22.5deg" --format csv 2>&1 | grep -v '^#' |
  sed 1d | cut -d, -f1 | uniq | tr '\n' ' ')
if [ "$out" = "315 337.5 0 22.5 45 " ]; then pass=$((pass + 1)); else bad "sweep through north: values '$out'"; fi
out=$("$bin" sweep "$prof" --vary "wind.from=NW:NE:22.5deg" 2>&1 | tr -s ' \n' '  ')
case $out in
  *"wind.from from 315 to 45 deg clockwise through north in steps of 22.5 deg"*)
    pass=$((pass + 1)) ;;
  *) bad "sweep through north: range line in '$(echo "$out" | cut -c1-200)'" ;;
esac
out=$("$bin" sweep "$prof" --vary "wind.from=NE:NW:-45deg" 2>&1 | tr -s ' \n' '  ')
case $out in
  *"from 45 to 315 deg anticlockwise through north"*) pass=$((pass + 1)) ;;
  *) bad "sweep anticlockwise through north: '$(echo "$out" | cut -c1-200)'" ;;
esac
refused "--vary with a compass STEP" "plumb: --vary:1:15: wind.from: STEP 'NE' is a compass point" \
  -- sweep "$prof" --vary "wind.from=N:E:NE"
refused "--vary a latitude between compass points" "plumb: --vary:1:15: site.latitude: FROM 'N'" \
  -- sweep "$prof" --vary "site.latitude=N:S:10deg"

# ---- uncertainty: a compass point where a direction is given -----------------
same "uncertainty NW +- 20 deg" -- zone "$prof" --samples 400 --format json \
  --set "uncertainty.wind.from=NW +- 20 deg" \
  -- zone "$prof" --samples 400 --format json --set "uncertainty.wind.from=315 deg +- 20 deg"
same "uncertainty {normal: [wsw, 25 deg]}" -- zone "$prof" --samples 400 --format json \
  --set "uncertainty.wind.from={normal: [wsw, 25 deg]}" \
  -- zone "$prof" --samples 400 --format json --set "uncertainty.wind.from={normal: [247.5 deg, 25 deg]}"
# a sector through north, as [350 deg, 10 deg] is
same "uncertainty {uniform: [NW, NE]}" -- zone "$prof" --samples 400 --format json \
  --set "uncertainty.wind.from={uniform: [NW, NE]}" \
  -- zone "$prof" --samples 400 --format json --set "uncertainty.wind.from={uniform: [315 deg, 45 deg]}"
refused "uncertainty: a compass point for a standard deviation" \
  "plumb: --set:1:37: uncertainty.wind.from.normal[1]: " \
  -- zone "$prof" --samples 400 --set "uncertainty.wind.from={normal: [NW, NE]}"
refused "uncertainty: a compass point for a latitude" "uncertainty.site.latitude" \
  -- zone "$prof" --samples 400 --set "uncertainty.site.latitude=N +- 1 deg"

echo "cli: $pass passed, $fail failed, 0 skipped"
[ "$fail" -eq 0 ]
