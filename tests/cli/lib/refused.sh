# Sourced by the CLI test scripts that check refusals (bad_inputs.sh,
# input_errors.sh), after lib/setup.sh and once they have set $tmp (an
# empty directory of their own), pass, fail and bad():
#   . "$(dirname "$0")/lib/refused.sh"
#
# refused NAME WANT... -- ARGS...: runs plumb ARGS with -o into an empty
# directory, standard input from $stdin (/dev/null when unset or empty);
# passes when the status is 2 (README.md "Exit status"), stderr holds
# exactly one error line (`plumb: ...`, or `plumb CMD: ...` for a usage
# error) and it, or a line after it (a usage error's "Try 'plumb CMD
# --help'."), holds every WANT (fixed strings; a WANT starting with ! must
# be absent), stdout is empty and the directory is still empty.
#
# Shell built-ins only apart from plumb itself: the scripts call it some
# 400 times, and a grep, ls, mkdir or rm for each check cost more than
# the checks' own plumb under the plain build.

# Its own variables start with _r_; like the copies it replaces, it sets
# name, out, rc, why, i, w and n_wants, and leaves plumb's output in
# $tmp/stdout and $tmp/stderr for a check after it.

# empty DIR: 0 when DIR holds no file, not even a dot file.
empty() {
  for _r_f in "$1"/* "$1"/.[!.]* "$1"/..?*; do
    [ -e "$_r_f" ] || [ -L "$_r_f" ] && return 1
  done
  return 0
}

# listed DIR: up to three of the names in DIR, for a message.
listed() {
  _r_k=0
  for _r_f in "$1"/* "$1"/.[!.]* "$1"/..?*; do
    if [ -e "$_r_f" ] || [ -L "$_r_f" ]; then
      printf '%s ' "${_r_f##*/}"
      _r_k=$((_r_k + 1))
      [ $_r_k -ge 3 ] && break
    fi
  done
}

refused() {
  name=$1
  shift
  n_wants=0
  while [ $# -gt 0 ] && [ "$1" != "--" ]; do
    n_wants=$((n_wants + 1))
    eval "want_$n_wants=\$1"
    shift
  done
  shift
  out=$tmp/out.$$
  [ -d "$out" ] || mkdir "$out" || exit 2
  "$bin" "$@" -o "$out/result" >"$tmp/stdout" 2>"$tmp/stderr" <"${stdin:-/dev/null}"
  rc=$?
  # stderr read once: the whole text, and its count of error lines
  _r_err="" _r_n=0
  while IFS= read -r _r_line || [ -n "$_r_line" ]; do
    _r_err="$_r_err$_r_line
"
    case $_r_line in
      "plumb: "* | plumb\ [a-z]*:\ *) _r_n=$((_r_n + 1)) ;;
    esac
  done <"$tmp/stderr"
  why=""
  [ $rc -eq 2 ] || why="exit status $rc, expected 2"
  [ -z "$why" ] && [ $_r_n -ne 1 ] && why="$_r_n error lines, expected 1"
  i=1
  while [ $i -le $n_wants ]; do
    eval "w=\$want_$i"
    if [ -z "$why" ]; then
      case $w in
        !*) case $_r_err in *"${w#!}"*) why="stderr holds '${w#!}'" ;; esac ;;
        *) case $_r_err in *"$w"*) ;; *) why="stderr lacks '$w'" ;; esac ;;
      esac
    fi
    i=$((i + 1))
  done
  if [ -z "$why" ] && ! empty "$out"; then
    why="wrote $(listed "$out")"
  fi
  if [ -z "$why" ] && [ -s "$tmp/stdout" ]; then
    why="printed to stdout"
  fi
  if [ -n "$why" ]; then
    bad "$name: $why"
    sed -n '1,3s/^/  stderr: /p' "$tmp/stderr"
    rm -rf "$out"
  else
    pass=$((pass + 1))
  fi
}
