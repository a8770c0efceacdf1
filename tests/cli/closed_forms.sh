#!/bin/sh
# `plumb limit` and `plumb sweep` against closed forms, not only against
# `plumb fall` (agreeing with `plumb fall` alone would not catch an
# error they share). Every expected value is computed here, in
# Python, from its published formula; the source is named beside each
# check. Inputs are invented and deliberately not round.
#
# Sources:
#   - work-energy theorem, drag-free fall: 1/2 m v^2 = 1/2 m v0^2 + m g H for
#     any direction of the release velocity v0, so the height for an impact
#     energy E is H = E/(m g) - v0^2/(2 g); standard gravity g0 = 9.80665
#     m/s^2 (3rd CGPM, 1901, by definition).
#   - drag-free projectile: a level throw at v0 from H lands after
#     t = sqrt(2 H / g), v0 t from the release point.
#   - WGS 84 normal gravity (NIMA TR8350.2, eq. 4-1, transcribed) less the
#     free-air gradient 3.086e-6 s^-2 per metre (NIMA TR8350.2, transcribed):
#     g(alt) = gamma(phi) - c alt, so the work of gravity from H to 0 with
#     the strike level at elevation e is m (gamma H - c (e H + H^2/2)),
#     and H for an energy is the smaller root of that quadratic.
#   - constant density, vertical fall from rest with quadratic drag
#     (closed-form solution of m dv/dt = m g - rho Cd A v^2 / 2):
#     v_t = sqrt(2 m g / (rho Cd A)),
#     v(H) = v_t sqrt(1 - exp(-2 g H / v_t^2)), hence
#     H(v) = -(v_t^2 / (2 g)) ln(1 - v^2 / v_t^2), and from
#     y(t) = (v_t^2/g) ln cosh(g t / v_t): t(H) = (v_t/g) arccosh(exp(g H / v_t^2)).
#     v(H) < v_t for every H, so a speed limit above v_t is never reached.
#   - units by definition (1959 international yard and pound agreement,
#     CGPM 1901): 1 ft = 0.3048 m, 1 ft lbf = 0.3048 x 0.45359237 x 9.80665 J.
#   - README "plumb sweep": the values of FROM:TO:STEP are FROM + i STEP for
#     every value not above TO.
#
# Tolerances, fixed before running, from the documented accuracy of a fall
# (README "The model": impact speed and time within 1e-9 relative of the
# closed form; limit's Brent tolerance 1e-10 relative on the key). A height
# found from a speed in drag is as good as the speed times the condition
# number kappa = v H'(v) / H of H(v), so those checks allow
# 1e-9 kappa + 2e-10. A drag-free fall in constant gravity is a polynomial
# in time, which the 8th-order stepper follows exactly: 1e-12 on its
# energies and speeds (far inside the 1e-9 README.md "The model"
# promises), 1e-10 on times and drifts (the impact is
# located to the event tolerance, 1e-10).
#
#   sh tests/cli/closed_forms.sh PLUMB
#
# Ends with one line `cli: N passed, N failed`; exit 0 only if none failed.
. "$(dirname "$0")/lib/setup.sh"
set -f # the Python expressions below hold '*'
py=/usr/bin/python3

tmp=$(mktemp -d "${TMPDIR:-/tmp}/plumb-closed.XXXXXX") || exit 2
trap 'rm -rf "$tmp"' EXIT
trap 'exit 2' INT TERM

pass=0
fail=0
bad() { fail=$((fail + 1)); echo "FAIL: $*"; }

# The checks are collected while plumb runs and evaluated at the end by one
# Python process (one start instead of forty):
#   check NAME GOT WANT TOL SOURCE [NAME=VALUE...]
#     GOT is read from the last report (`d`); WANT is computed from the
#     closed forms and the NAME=VALUE inputs (evaluated in order); passes
#     when |GOT - WANT| <= TOL |WANT|, element by element for lists of
#     equal, nonzero length.
#   cond NAME CONDITION
#     passes when the Python condition on the last report `d` holds.
# A report with NaN or infinity in it fails every check on it.
checks=$tmp/checks
: >"$checks"
out=
record() { # record KIND NAME ARGS...: one record; fields end in \037, records in \036
  printf '%s\037' "$1" "$2" "$out" >>"$checks"
  shift 2
  for a in "$@"; do printf '%s\037' "$a" >>"$checks"; done
  printf '\036' >>"$checks"
}
check() { record rel "$@"; }
cond() { record cond "$@"; }

# run ARGS...: plumb ARGS into a new report file $out; a failure is counted.
n_runs=0
run() {
  n_runs=$((n_runs + 1))
  out=$tmp/report$n_runs.json
  "$bin" "$@" >"$out" 2>"$tmp/stderr"
  rc=$?
  [ "$rc" -eq 0 ] && return 0
  bad "plumb $* exited $rc ($(cat "$tmp/stderr"))"
  return 1
}

cat >"$tmp/checks.py" <<'EOF'
import json, math, sys

def no_constant(name):
    raise ValueError(f"non-finite number {name} in the report")

CONSTANTS = {
    "sqrt": math.sqrt, "log": math.log, "exp": math.exp, "acosh": math.acosh,
    "sin": math.sin, "radians": math.radians,
    # standard gravity, m/s^2 (3rd CGPM, 1901)
    "g0": 9.80665,
    # 1 ft and 1 ft lbf by definition (1959 agreement)
    "FT": 0.3048, "FT_LBF": 0.3048 * 0.45359237 * 9.80665,
    # WGS 84 normal gravity (NIMA TR8350.2, transcribed), free-air gradient
    "GAMMA_E": 9.7803253359, "K_WGS": 0.00193185265241, "E2_WGS": 0.00669437999013,
    "FREE_AIR": 3.086e-6,
}
reports = {}

def report(path):
    if path not in reports:
        with open(path) as f:
            reports[path] = json.load(f, parse_constant=no_constant)
    return reports[path]

def rel(env, got_expr, want_expr, tol_expr, source, *inputs):
    for a in inputs:
        k, v = a.split("=", 1)
        env[k] = eval(v, env)
    got, want, tol = (eval(e, env) for e in (got_expr, want_expr, tol_expr))
    if not isinstance(got, list):
        got, want = [got], [want]
    ok = len(got) == len(want) and len(got) > 0
    worst = 0.0
    for g, w in zip(got, want):
        r = abs(g - w) / abs(w) if w != 0 else abs(g - w)
        worst = max(worst, r)
        ok = ok and r <= tol
    return ok, (f"[{source}] got {got[:3]} want {want[:3]} "
                f"(worst relative error {worst:.2e}, allowed {tol:.2e})")

def cond(env, condition):
    return bool(eval(condition, env)), condition

passed = failed = 0
with open(sys.argv[1]) as f:
    records = [r for r in f.read().split("\036") if r]
for r in records:
    kind, name, path, *args = r.split("\037")[:-1]
    try:
        env = dict(CONSTANTS, d=report(path))
        ok, what = (rel if kind == "rel" else cond)(env, *args)
    except Exception as e:
        ok, what = False, f"error: {e!r}"
    if ok:
        passed += 1
    else:
        failed += 1
        print(f"FAIL: {name}")
    print(f"    {'ok  ' if ok else 'FAIL'} {what}")
print(f"py: {passed} {failed}")
EOF

# ---- profiles (invented) ----------------------------------------------------

# drag_free FILE VELOCITY [EXTRA]: a 2.385 kg payload without drag (cd 0),
# released at 31.6 m with the given release velocity map.
drag_free() {
  cat >"$1" <<EOF
# Invented test profile: a drag-free 2.385 kg payload.
name: drag-free payload
payload:
  mass: 2.385 kg
  drag: {cd: 0, area: 0.0117 m^2}
release:
  height: 31.6 m
  velocity: $2
${3:-}
criteria: [us-part107-cat3]
EOF
}

# Constant air: two table rows of equal density, so rho = 1.2041 kg/m^3 at
# every altitude; still air, from rest.
cat >"$tmp/air.yaml" <<'EOF'
# Invented test profile: 2.385 kg, Cd 0.87 on 0.0213 m^2, in constant air.
name: constant-air payload
payload:
  mass: 2.385 kg
  drag: {cd: 0.87, area: 0.0213 m^2}
release:
  height: 31.6 m
atmosphere:
  model: table
  table:
    - {altitude: -1000 m, density: 1.2041 kg/m^3, temperature: 293.15 K}
    - {altitude: 40000 m, density: 1.2041 kg/m^3, temperature: 293.15 K}
criteria: [us-part107-cat3]
EOF
air="m=2.385 rho=1.2041 cda=0.87*0.0213 vt=sqrt(2*m*g0/(rho*cda))"
# H(v) in constant air, and its condition number kappa = v H'(v) / H
h_of_v="-(vt**2/(2*g0))*log(1-v*v/(vt*vt))"
kappa="2*(v/vt)**2/((1-(v/vt)**2)*(-log(1-(v/vt)**2)))"

we="work-energy theorem, H = E/(m g0) - v0^2/(2 g0)"
lim="d['limit']['items'][0]"
rows="d['rows']"

# ---- limit: drag-free height for an energy -----------------------------------

for dir in east up down; do
  case $dir in
    east) vel="{east: 7.3 m/s, north: 0 m/s, up: 0 m/s}" ;;
    up) vel="{east: 0 m/s, north: 0 m/s, up: 7.3 m/s}" ;;
    down) vel="{east: 0 m/s, north: 0 m/s, up: -7.3 m/s}" ;;
  esac
  drag_free "$tmp/free-$dir.yaml" "$vel"
  if run limit "$tmp/free-$dir.yaml" --find release.height --energy-max "913.7 J" \
      --format json; then
    cond "limit, drag-free, v0 $dir: found" "$lim['outcome'] == 'found'"
    check "limit, drag-free, v0 7.3 m/s $dir: height for 913.7 J" \
      "$lim['value_si']" "E/(m*g0) - v0**2/(2*g0)" 1e-9 "$we" E=913.7 m=2.385 v0=7.3
    check "limit, drag-free, v0 $dir: the energy reported at that height" \
      "$lim['energy_at_value_j']" "0.5*m*v0**2 + m*g0*$lim['value_si']" 1e-12 \
      "work-energy theorem at the reported height" m=2.385 v0=7.3
  fi
done

# An energy limit in ft lbf: 673.9 ft lbf = 913.69... J by definition.
if run limit "$tmp/free-east.yaml" --find release.height --energy-max "673.9 ft lbf" \
    --format json; then
  check "limit, drag-free: height for 673.9 ft lbf" \
    "$lim['value_si']" "E/(m*g0) - v0**2/(2*g0)" 1e-9 \
    "$we; 1 ft lbf = 0.3048 x 0.45359237 x 9.80665 J" E=673.9*FT_LBF m=2.385 v0=7.3
fi

# Gravity by latitude: 47.3 deg, strike level 431 m above sea level.
# E/m - v0^2/2 = gp H - c H^2/2 with gp = gamma(phi) - c e: the smaller root,
# written without cancellation. Its energy is integrated (gravity varies), so
# 2e-9: twice the speed's 1e-9.
drag_free "$tmp/free-lat.yaml" "{east: 7.3 m/s, north: 0 m/s, up: 0 m/s}" \
  "site: {elevation: 431 m, latitude: 47.3 deg}"
if run limit "$tmp/free-lat.yaml" --find release.height --energy-max "913.7 J" \
    --format json; then
  check "limit, drag-free at 47.3 deg and 431 m: height for 913.7 J" \
    "$lim['value_si']" "2*q/(gp + sqrt(gp*gp - 2*FREE_AIR*q))" 2e-9 \
    "work-energy theorem with WGS 84 normal gravity less the free-air gradient" \
    E=913.7 m=2.385 v0=7.3 "s2=sin(radians(47.3))**2" \
    "gamma=GAMMA_E*(1+K_WGS*s2)/sqrt(1-E2_WGS*s2)" "gp=gamma-FREE_AIR*431" "q=E/m-v0**2/2"
fi

# Thrown down at 7.3 m/s: the energy at H -> 0 is 1/2 m v0^2 = 63.55 J.
# Below that no height meets the limit; just above it, a few cm do.
if run limit "$tmp/free-down.yaml" --find release.height --energy-max "61.64 J" \
    --format json; then
  cond "limit, thrown down, 61.64 J < 1/2 m v0^2 = 63.55 J: impossible (work-energy theorem)" \
    "$lim['outcome'] == 'impossible' and 'exceeds the limit' in $lim['explanation']"
fi
if run limit "$tmp/free-down.yaml" --find release.height --energy-max "65.06 J" \
    --format json; then
  cond "limit, thrown down, 65.06 J: found" "$lim['outcome'] == 'found'"
  check "limit, thrown down, 65.06 J: a few centimetres" \
    "$lim['value_si']" "E/(m*g0) - v0**2/(2*g0)" 1e-9 "$we" E=65.06 m=2.385 v0=7.3
fi

# ---- limit: constant-air height for a speed -----------------------------------

for v in 31.6 44.9; do
  if run limit "$tmp/air.yaml" --find release.height --speed-max "$v m/s" --format json; then
    cond "limit, constant air, $v m/s: found" "$lim['outcome'] == 'found'"
    check "limit, constant air: height for $v m/s" \
      "$lim['value_si']" "$h_of_v" "1e-9*$kappa + 2e-10" \
      "constant-density closed form H(v) = -(v_t^2/2g) ln(1 - v^2/v_t^2)" $air "v=$v"
  fi
done

# An energy limit in constant air: v = sqrt(2 E / m), then H(v).
if run limit "$tmp/air.yaml" --find release.height --energy-max "913.7 J" --format json; then
  check "limit, constant air: height for 913.7 J" \
    "$lim['value_si']" "$h_of_v" "1e-9*$kappa + 2e-10" \
    "constant-density closed form H(v) with v = sqrt(2 E / m)" $air "v=sqrt(2*913.7/m)"
fi

# 47.3 m/s is above v_t = 45.79 m/s: no height reaches it.
if run limit "$tmp/air.yaml" --find release.height --speed-max "47.3 m/s" --format json; then
  cond "limit, constant air, 47.3 m/s > v_t: unlimited (v(H) < v_t, closed form)" \
    "$lim['outcome'] == 'unlimited' and 'terminal speed' in $lim['explanation']"
fi

# ---- sweep: drag-free energies, speeds and times ------------------------------

drag_free "$tmp/rest.yaml" "{east: 0 m/s, north: 0 m/s, up: 0 m/s}"
if run sweep "$tmp/rest.yaml" --vary release.height=3.7m:41.2m:6.25m --format json; then
  cond "sweep 3.7m:41.2m:6.25m has 7 rows, the last 41.2 m (FROM + i STEP not above TO)" \
    "len($rows) == 7 and abs($rows[-1]['values_si']['release.height'] - 41.2) < 1e-12"
  check "sweep, drag-free from rest: energies m g0 H" \
    "[r['impact']['energy_j'] for r in $rows]" \
    "[m*g0*(3.7 + i*6.25) for i in range(7)]" 1e-12 \
    "work-energy theorem, E = m g0 H" m=2.385
  check "sweep, drag-free from rest: speeds sqrt(2 g0 H)" \
    "[r['impact']['speed_m_s'] for r in $rows]" \
    "[sqrt(2*g0*(3.7 + i*6.25)) for i in range(7)]" 1e-12 \
    "work-energy theorem, v = sqrt(2 g0 H)"
  check "sweep, drag-free from rest: times sqrt(2 H / g0)" \
    "[r['impact']['time_s'] for r in $rows]" \
    "[sqrt(2*(3.7 + i*6.25)/g0) for i in range(7)]" 1e-10 \
    "free fall, H = g0 t^2 / 2"
fi

# In feet: each height is the value times 0.3048 m exactly.
if run sweep "$tmp/rest.yaml" --vary release.height=12.7ft:131ft:23.9ft --format json; then
  check "sweep in feet: heights are 0.3048 m per foot" \
    "[r['values_si']['release.height'] for r in $rows]" \
    "[(12.7 + i*23.9)*FT for i in range(5)]" 1e-15 "1 ft = 0.3048 m (1959 agreement)"
  check "sweep in feet, drag-free from rest: energies m g0 H" \
    "[r['impact']['energy_j'] for r in $rows]" \
    "[m*g0*(12.7 + i*23.9)*FT for i in range(5)]" 1e-12 \
    "work-energy theorem, E = m g0 H; 1 ft = 0.3048 m" m=2.385
fi

# A level throw at 7.3 m/s: E = 1/2 m v0^2 + m g0 H, drift v0 sqrt(2 H / g0).
if run sweep "$tmp/free-east.yaml" --vary release.height=3.7m:41.2m:6.25m --format json; then
  check "sweep, drag-free level throw: energies 1/2 m v0^2 + m g0 H" \
    "[r['impact']['energy_j'] for r in $rows]" \
    "[0.5*m*v0**2 + m*g0*(3.7 + i*6.25) for i in range(7)]" 1e-12 \
    "work-energy theorem" m=2.385 v0=7.3
  check "sweep, drag-free level throw: drift v0 sqrt(2 H / g0)" \
    "[r['impact']['drift_m'] for r in $rows]" \
    "[v0*sqrt(2*(3.7 + i*6.25)/g0) for i in range(7)]" 1e-10 \
    "drag-free projectile" v0=7.3
fi

# ---- sweep: constant-air speeds -------------------------------------------------

if run sweep "$tmp/air.yaml" --vary release.height=4.37m:187.3m:13.9m --format json; then
  cond "sweep 4.37m:187.3m:13.9m has 14 rows (FROM + i STEP not above TO)" "len($rows) == 14"
  check "sweep, constant air: speeds v_t sqrt(1 - exp(-2 g H / v_t^2))" \
    "[r['impact']['speed_m_s'] for r in $rows]" \
    "[vt*sqrt(1-exp(-2*g0*(4.37 + i*13.9)/vt**2)) for i in range(14)]" 1e-9 \
    "constant-density closed form v(H)" $air
  check "sweep, constant air: energies 1/2 m v(H)^2" \
    "[r['impact']['energy_j'] for r in $rows]" \
    "[0.5*m*vt**2*(1-exp(-2*g0*(4.37 + i*13.9)/vt**2)) for i in range(14)]" 2e-9 \
    "constant-density closed form v(H), E = 1/2 m v^2" $air
  check "sweep, constant air: times (v_t/g) arccosh(exp(g H / v_t^2))" \
    "[r['impact']['time_s'] for r in $rows]" \
    "[vt/g0*acosh(exp(g0*(4.37 + i*13.9)/vt**2)) for i in range(14)]" 1e-9 \
    "constant-density closed form y(t) = (v_t^2/g) ln cosh(g t/v_t)" $air
  check "sweep, constant air: terminal speed sqrt(2 m g / (rho Cd A))" \
    "[r['terminal_speed_m_s'] for r in $rows]" "[vt]*14" 1e-12 \
    "terminal speed, drag balance m g = 1/2 rho Cd A v_t^2" $air
fi

# ---- evaluate ------------------------------------------------------------------

"$py" "$tmp/checks.py" "$checks" >"$tmp/results" 2>&1
sed '/^py: /d' "$tmp/results"
counts=$(sed -n 's/^py: \([0-9]*\) \([0-9]*\)$/\1 \2/p' "$tmp/results")
if [ -z "$counts" ]; then
  bad "the checks did not run"
  counts="0 0"
fi
pass=$((pass + ${counts% *}))
fail=$((fail + ${counts#* }))
echo "cli: $pass passed, $fail failed"
[ "$fail" -eq 0 ]
