#!/usr/bin/env python3
"""fall.py - the fall of a profile's payloads through libplumb, from Python.

Only the standard library is used: ctypes loads libplumb.so and calls its
public C API, as any other language could. The profile is loaded with
plumb_profile_load(), its air is built with plumb_atmosphere_alloc(), and
each payload falls with plumb_trajectory_run(); the impact speed and
energy are printed, full precision, one line per payload.

    python3 examples/fall.py [--lib PATH/libplumb.so] [PROFILE]

PROFILE defaults to profiles/demo/hand-tool.yaml. The library is --lib, else
$PLUMB_LIB, else build/libplumb.so of this source tree, else the installed
libplumb.so. An error is printed as plumb prints it (file:line:col: key:
message) and exits 2 for bad input, 3 for a failed computation.
"""
import ctypes
import os
import sys

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(HERE)
MAX_DESCENT = 2  # PLUMB_MAX_DESCENT, plumb/trajectory.h


class Diag(ctypes.Structure):
    """struct plumb_diag (plumb/error.h): caller storage for an error."""
    _fields_ = [("status", ctypes.c_int),
                ("file", ctypes.c_char * 256),
                ("line", ctypes.c_int),
                ("col", ctypes.c_int),
                ("key", ctypes.c_char * 128),
                ("message", ctypes.c_char * 512)]


class SolverStats(ctypes.Structure):
    """struct plumb_solver_stats (plumb/trajectory.h)."""
    _fields_ = [("method", ctypes.c_char_p),
                ("steps", ctypes.c_size_t),
                ("rhs_evaluations", ctypes.c_size_t)]


class FallResult(ctypes.Structure):
    """struct plumb_fall_result (plumb/trajectory.h), field for field, SI units."""
    _fields_ = [("time_s", ctypes.c_double),
                ("point_m", ctypes.c_double * 2),
                ("velocity_m_s", ctypes.c_double * 3),
                ("speed_m_s", ctypes.c_double),
                ("energy_j", ctypes.c_double),
                ("momentum_kg_m_s", ctypes.c_double),
                ("angle_deg", ctypes.c_double),
                ("drift_m", ctypes.c_double),
                ("bearing_deg", ctypes.c_double),
                ("apex_m", ctypes.c_double),
                ("terminal_speed_m_s", ctypes.c_double),
                ("drag_free_speed_m_s", ctypes.c_double),
                ("drag_free_energy_j", ctypes.c_double),
                ("drag_work_j", ctypes.c_double),
                ("max_mach", ctypes.c_double),
                ("min_re", ctypes.c_double),
                ("max_re", ctypes.c_double),
                ("n_deployed", ctypes.c_size_t),
                ("deployed", ctypes.c_int * MAX_DESCENT),
                ("deploy_time_s", ctypes.c_double * MAX_DESCENT),
                ("deploy_height_m", ctypes.c_double * MAX_DESCENT),
                ("deploy_speed_m_s", ctypes.c_double * MAX_DESCENT),
                ("fill_time_s", ctypes.c_double * MAX_DESCENT),
                ("pflanz_a", ctypes.c_double * MAX_DESCENT),
                ("pflanz_x1", ctypes.c_double * MAX_DESCENT),
                ("pflanz_q1s_n", ctypes.c_double * MAX_DESCENT),
                ("pflanz_force_n", ctypes.c_double * MAX_DESCENT),
                ("peak_force_n", ctypes.c_double),
                ("peak_load_g", ctypes.c_double),
                ("steady_speed_m_s", ctypes.c_double),
                ("steady_opened_m_s", ctypes.c_double),
                ("solver", SolverStats)]


def load_library(path=None):
    """Opens libplumb and declares the functions used here."""
    candidates = [path, os.environ.get("PLUMB_LIB"),
                  os.path.join(ROOT, "build", "libplumb.so"), "libplumb.so"]
    last = None
    for c in candidates:
        if not c or (os.sep in c and not os.path.exists(c)):
            continue
        try:
            lib = ctypes.CDLL(c)
            break
        except OSError as e:
            last = e
    else:
        sys.exit(f"fall.py: cannot load libplumb ({last or 'not found'}); build it with make")
    p, ptr, diag = ctypes.c_void_p, ctypes.POINTER(ctypes.c_void_p), ctypes.POINTER(Diag)
    sig = {  # name: (return type, argument types), as in include/plumb/*.h
        "plumb_version": (ctypes.c_char_p, []),
        "plumb_status_is_input_error": (ctypes.c_int, [ctypes.c_int]),
        "plumb_diag_format": (ctypes.c_int, [diag, ctypes.c_char_p, ctypes.c_size_t]),
        "plumb_units_alloc": (ctypes.c_int, [ptr, diag]),
        "plumb_units_free": (None, [p]),
        "plumb_profile_load": (ctypes.c_int, [ctypes.c_char_p, p, ctypes.POINTER(ctypes.c_char_p),
                                              ctypes.c_size_t, ptr, diag]),
        "plumb_profile_free": (None, [p]),
        "plumb_profile_name": (ctypes.c_char_p, [p]),
        "plumb_profile_item_count": (ctypes.c_size_t, [p]),
        "plumb_profile_item": (p, [p, ctypes.c_size_t]),
        "plumb_profile_atmosphere": (p, [p]),
        "plumb_atmosphere_alloc": (ctypes.c_int, [p, ptr, diag]),
        "plumb_atmosphere_free": (None, [p]),
        "plumb_trajectory_alloc": (ctypes.c_int, [p, ptr]),
        "plumb_trajectory_free": (None, [p]),
        "plumb_trajectory_run": (ctypes.c_int, [p, p, p, ctypes.POINTER(FallResult), diag]),
    }
    for name, (res, args) in sig.items():
        f = getattr(lib, name)
        f.restype, f.argtypes = res, args
    return lib


def fail(lib, status, diag):
    """Prints the diagnostic as the plumb command does and exits 2 or 3."""
    diag.status = status
    buf = ctypes.create_string_buffer(1024)
    lib.plumb_diag_format(ctypes.byref(diag), buf, len(buf))
    print(f"fall.py: {buf.value.decode()}", file=sys.stderr)
    sys.exit(2 if lib.plumb_status_is_input_error(status) else 3)


def main(argv):
    lib_path = None
    if len(argv) >= 2 and argv[0] == "--lib":
        lib_path, argv = argv[1], argv[2:]
    profile = argv[0] if argv else os.path.join(ROOT, "profiles", "demo", "hand-tool.yaml")
    lib = load_library(lib_path)

    diag = Diag()
    units, prof, atm, traj = ctypes.c_void_p(), ctypes.c_void_p(), ctypes.c_void_p(), ctypes.c_void_p()
    try:
        st = lib.plumb_units_alloc(ctypes.byref(units), ctypes.byref(diag))
        if st == 0:
            st = lib.plumb_profile_load(profile.encode(), units, None, 0, ctypes.byref(prof),
                                        ctypes.byref(diag))
        if st == 0:
            st = lib.plumb_atmosphere_alloc(lib.plumb_profile_atmosphere(prof), ctypes.byref(atm),
                                            ctypes.byref(diag))
        if st == 0:
            st = lib.plumb_trajectory_alloc(None, ctypes.byref(traj))
        if st != 0:
            fail(lib, st, diag)

        print(f"libplumb {lib.plumb_version().decode()}: {lib.plumb_profile_name(prof).decode()}")
        for i in range(lib.plumb_profile_item_count(prof)):
            spec = lib.plumb_profile_item(prof, i)
            res = FallResult()
            st = lib.plumb_trajectory_run(traj, spec, atm, ctypes.byref(res), ctypes.byref(diag))
            if st != 0:
                fail(lib, st, diag)
            name = ctypes.string_at(spec).decode()  # the spec's first field, char name[]
            print(f"{name}: impact speed {res.speed_m_s!r} m/s, energy {res.energy_j!r} J")
    finally:
        lib.plumb_trajectory_free(traj)
        lib.plumb_atmosphere_free(atm)
        lib.plumb_profile_free(prof)
        lib.plumb_units_free(units)


if __name__ == "__main__":
    main(sys.argv[1:])
