#!/usr/bin/env python3
"""Mutation run of the physics: each mutation flips the sign of, or drops, one physics term;
the fast test suite must then fail ("killed"). A mutation that survives is either a missing
test or an equivalent mutation (no observable effect), which must be explained beside it below.

It works on a scratch copy of the working tree (nothing in the source tree is touched): it
copies the tree, builds it once, then for each mutation applies it (the text must occur exactly
once in its file), rebuilds the test program and the command line, runs the fast suite with
--stop-on-failure, records killed / survived / stale (the text no longer exists: update the list),
and reverts.

usage: python3 tests/mutation/run_mutations.py [--scratch DIR] [--only SUBSTRING[,SUBSTRING...]] [--jobs N]
       python3 tests/mutation/run_mutations.py --in-place BUILD_DIR [--only SUBSTRING] [--jobs N]
It takes about 1.5 min a mutation on 2 cores (so about an hour for the list): not run in CI.

--in-place BUILD_DIR skips the scratch copy and its full build: the mutations are applied to the
working tree itself (the one holding this script), one at a time, and BUILD_DIR (an already built
release build of that tree, e.g. build/) is rebuilt for each. Every mutated file is restored in a
`finally` and on SIGTERM/SIGINT; while a mutation is applied its original is also kept beside it
as FILE.orig-mutation, so a run killed hard (SIGKILL) can be undone by moving that file back.
"""
import signal
import argparse
import os
import shutil
import subprocess
import sys
import time

# (file, text, replacement, what it breaks[, "equivalent"]). Keep each text unique in its file. A
# mutation marked "equivalent" has no observable effect (the reason is in the comment above it):
# it is run and reported, but does not count against the kill rate.
MUTATIONS = [
    # hinge-moment terms (model/dynamics.cpp, Ch = Ch0 + Ch_alpha alpha_t + Ch_delta delta + Ch_tab tab + rate term)
    ("model/dynamics.cpp", "e.Ch = el.ch0 +", "e.Ch = -el.ch0 +", "sign of Ch0"),
    ("model/dynamics.cpp", "el.ch_alpha * e.alpha_t", "-el.ch_alpha * e.alpha_t", "sign of Ch_alpha"),
    ("model/dynamics.cpp", "el.ch_delta * de +", "-el.ch_delta * de +", "sign of Ch_delta"),
    ("model/dynamics.cpp", "el.ch_tab * e.tab +", "0.0 * e.tab +", "Ch_tab dropped"),
    ("model/dynamics.cpp", "el.ch_rate * ded * el.chord", "-el.ch_rate * ded * el.chord", "sign of the hinge damping"),
    # tail lift
    ("model/dynamics.cpp", "ap.tail.tau_elevator * de", "-ap.tail.tau_elevator * de", "sign of elevator effectiveness"),
    ("model/dynamics.cpp", "ap.tail.tau_tab * e.tab", "-ap.tail.tau_tab * e.tab", "sign of tab effectiveness"),
    ("model/dynamics.cpp", "e.qbar_t = ap.tail.eta * 0.5", "e.qbar_t = 0.5", "tail dynamic-pressure ratio dropped"),
    ("model/dynamics.hpp", "return t.eps0 + t.deps_dalpha * alpha;", "return t.eps0 - t.deps_dalpha * alpha;", "sign of the downwash gradient"),
    ("model/dynamics.cpp", "e.eps = nlag == 0 ? eps_target :", "e.eps = nlag >= 0 ? eps_target :", "downwash lag dropped"),
    ("model/dynamics.cpp", "return V2{u + q * r.z - gx, w - q * r.x - gz};", "return V2{u + q * r.z - gx, w + q * r.x - gz};", "sign of the pitch-rate term at the surfaces (tail q l_t / V)"),
    # gusts at wing and tail
    ("model/dynamics.cpp", "const V2 vT = local_air(rT, e.gust_tail);", "const V2 vT = local_air(rW, e.gust_tail);", "tail samples the gust at the wing (no delay)"),
    ("model/dynamics.cpp", "const double gz = gs.u * sth + (-gs.w) * cth;", "const double gz = gs.u * sth + (gs.w) * cth;", "sign of the vertical gust"),
    ("model/dynamics.cpp", "const double gx = gs.u * cth - (-gs.w) * sth;", "const double gx = -gs.u * cth - (-gs.w) * sth;", "sign of the horizontal gust"),
    # wing-body
    ("model/dynamics.cpp", "ap.wing.cm_q * q * c", "-ap.wing.cm_q * q * c", "sign of wing-body pitch damping"),
    ("model/dynamics.cpp", "ap.wing.cm_alpha_fus * e.alpha", "-ap.wing.cm_alpha_fus * e.alpha", "sign of the fuselage moment slope"),
    ("model/dynamics.cpp", "ap.wing.k_induced * e.CL_wb * e.CL_wb", "0.0 * e.CL_wb", "induced drag dropped"),
    # thrust
    ("model/dynamics.cpp", "e.M += cross(V2{0.0, pr.z_thrust}, Ft);", "e.M -= cross(V2{0.0, pr.z_thrust}, Ft);", "sign of the thrust-line moment"),
    # circuit
    ("model/dynamics.cpp", "Hc -= ci.damping * ded", "Hc += ci.damping * ded", "sign of circuit damping"),
    ("model/dynamics.cpp", "return -(ci.friction / G) * std::tanh", "return (ci.friction / G) * std::tanh", "sign of smoothed friction"),
    ("model/dynamics.cpp", "case FrictionState::slip_up: return -sliding_force", "case FrictionState::slip_up: return sliding_force", "sign of sliding friction"),
    ("run/run.cpp", "if (std::abs(e.H_friction) <= Hb) ctl_.friction = FrictionState::stuck;", "if (false) ctl_.friction = FrictionState::stuck;", "stiction never sticks"),
    ("model/dynamics.cpp", "return -(ci.friction / G) * std::tanh", "return -ci.friction * std::tanh", "friction breakout taken at the hinge, not the stick"),
    ("model/dynamics.cpp", "Hc -= ci.centering * (de", "Hc += ci.centering * (de", "sign of the centering spring"),
    ("model/dynamics.cpp", "Hc += ci.downspring / G;", "Hc -= ci.downspring / G;", "sign of the downspring"),
    ("model/circuit.hpp", "  if (x > hi) {", "  if (false) {", "upper stop (and play end) dropped"),
    ("model/circuit.hpp", "  if (x < lo) {", "  if (false) {", "lower stop (and play end) dropped"),
    ("model/dynamics.hpp", "return tab_setting + c.geared_tab_ratio * de;", "return tab_setting - c.geared_tab_ratio * de;", "sign of the geared tab"),
    # inertial coupling, bobweight, pilot
    ("model/dynamics.cpp", "L.h += p.m_e * cross(rho, ae);", "L.h -= p.m_e * cross(rho, ae);", "sign of the mass-balance coupling"),
    ("model/dynamics.cpp", "const double Hext = e.H_aero + Hc + H_pilot + cross(Srho, gvec);", "const double Hext = e.H_aero + Hc + H_pilot;", "elevator weight about the hinge dropped"),
    ("model/dynamics.cpp", "L.h -= bob_per_n * n;", "L.h += bob_per_n * n;", "sign of the bobweight"),
    ("model/dynamics.cpp", "e.stick_force = -G * H_pilot;", "e.stick_force = G * H_pilot;", "sign of the stick force"),
    ("model/dynamics.cpp", "H_pilot = -ctl.pilot_force / G;", "H_pilot = ctl.pilot_force / G;", "sign of the pilot's force"),
    ("model/dynamics.cpp", "H_pilot = -ci.held_stiffness * (de - ctl.hold_de)", "H_pilot = ci.held_stiffness * (de - ctl.hold_de)", "sign of cable stretch"),
    # gust shape, turbulence filters, ISA
    ("model/gust.cpp", "return 0.5 * g.amplitude * (1.0 - std::cos(std::numbers::pi * s / g.length));", "return 0.5 * g.amplitude * (1.0 - std::cos(2.0 * std::numbers::pi * s / g.length));", "1-cosine gust: H taken as the whole length"),
    ("model/turbulence.cpp", "f.num = {1.0, std::sqrt(3.0)};", "f.num = {1.0, 1.0};", "Dryden w filter numerator"),
    ("model/turbulence.cpp", "f.gain = sigma * std::sqrt(L / pi);", "f.gain = sigma * std::sqrt(L);", "Dryden/von Karman w gain without 1/pi"),
    ("model/turbulence.cpp", "f.den = {1.0, 1.357, 0.1987};", "f.den = {1.0, 1.357, 0.0};", "von Karman u filter denominator"),
    ("model/atmosphere.cpp", "const double L = -0.0065;", "const double L = -0.0060;", "ISA lapse rate"),
    # downwash lag (tests/reference/downwash_lag.py: each law against the reference's roots)
    ("model/dynamics.cpp", "const double tau = p.l_wt / (Vsafe * nlag);", "const double tau = p.l_wt / Vsafe;", "downwash-lag stages each l_wt/V (chain N times too slow)"),
    ("model/dynamics.cpp", "dxdt[k] = (in - x[k]) / tau;", "dxdt[k] = (x[k] - in) / tau;", "sign of the downwash-lag stage"),
    # turbulence filters, von Karman w and Dryden u (the MIL-F-8785C forms)
    ("model/turbulence.cpp", "f.num = {1.0, 2.7478, 0.3398};", "f.num = {1.0, 2.7478, 0.0};", "von Karman w filter numerator"),
    ("model/turbulence.cpp", "f.den = {1.0, 2.9958, 1.9754, 0.1539};", "f.den = {1.0, 2.9958, 1.9754, 0.0};", "von Karman w filter denominator"),
    ("model/turbulence.cpp", "f.gain = sigma * std::sqrt(2.0 * L / pi);", "f.gain = sigma * std::sqrt(L / pi);", "Dryden/von Karman u gain without the 2"),
    ("model/turbulence.cpp", "{8.6, 9.6, 10.6, 10.1, 8.0, 6.6, 5.0, 4.2},", "{8.6, 9.6, 10.6, 10.1, 8.0, 6.6, 5.0, 4.2 * 0.0},", "turbulence intensity table, moderate, 45000 ft"),
    ("model/turbulence.cpp", "{6.6, 6.9, 7.4, 6.7, 4.6, 2.7, 0.4, 0.0},", "{6.6, 6.9, 7.4 * 1.1, 6.7, 4.6, 2.7, 0.4, 0.0},", "turbulence intensity table, light, 3750 ft"),
    # ISA: geopotential altitude
    ("model/atmosphere.cpp", "return isa::earth_radius * z / (isa::earth_radius + z);", "return z;", "geometric altitude used as geopotential"),
    # closed forms (model/static.cpp)
    ("model/static.cpp", "(at / r.lift_slope) * (1.0 - de_da) - w.cm_alpha_fus", "(at / r.lift_slope) * (1.0 + de_da) - w.cm_alpha_fus", "sign of the downwash in the stick-fixed neutral point"),
    ("model/static.cpp", "return 1.0 - tau * ap.elevator.ch_alpha / chd;", "return 1.0 + tau * ap.elevator.ch_alpha / chd;", "sign in the free-elevator factor"),
    ("model/static.cpp", "r.mp_fixed = r.np_fixed - r.cm_q / (2.0 * r.mu);", "r.mp_fixed = r.np_fixed + r.cm_q / (2.0 * r.mu);", "sign of the maneuver-point shift (fixed)"),
    ("model/static.cpp", "r.mp_free = r.np_free - r.cm_q_free / (2.0 * r.mu);", "r.mp_free = r.np_free + r.cm_q_free / (2.0 * r.mu);", "sign of the maneuver-point shift (free)"),
    ("model/static.cpp", "r.np_apparent = r.np_free + r.hinge_constant / K;", "r.np_apparent = r.np_free - r.hinge_constant / K;", "sign of the apparent neutral-point shift"),
    # trim equations
    ("model/trim.cpp", "t.theta = alpha + gamma;", "t.theta = alpha - gamma;", "trim: pitch attitude from the flight path"),
    # EQUIVALENT: steady_hinge_moment is used only to float the elevator in model_neutral_points,
    # whose free point is a slope dCm/dCL between two floated states 0.5 deg of alpha apart. The
    # weight's hinge moment (and the bobweight's at 1 g) does not depend on alpha; its only slope
    # is -S_e g sin(delta) in delta, about 3e-4 of the aerodynamic q S_e c_e Ch_delta on the test
    # airplanes, so dropping it offsets both floated angles alike and moves the free point by
    # ~1e-5 MAC: below any tolerance a closed-form comparison can have. Kept as a record.
    ("model/dynamics.cpp", "return H_aero + circuit_hinge_moment(p.ap, de, 0.0) + weight_hinge_moment(p.ap, de, n);", "return H_aero + circuit_hinge_moment(p.ap, de, 0.0);", "floated elevator of the model's free neutral point without the elevator's weight", "equivalent"),
]

FAST_EXCLUDE = "report_render|readme_commands|window|welch|scipy_crosscheck"


def run(cmd, cwd, log=None, timeout=None):
    r = subprocess.run(cmd, shell=True, cwd=cwd, capture_output=True, text=True, timeout=timeout)
    if log is not None:
        log.write(f"$ {cmd}\n{r.stdout[-4000:]}{r.stderr[-4000:]}\n")
    return r.returncode


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--scratch", default="/tmp/floatpitch-mutation")
    ap.add_argument("--only", default="")
    ap.add_argument("--jobs", type=int, default=2)
    ap.add_argument("--in-place", default="", metavar="BUILD_DIR")
    a = ap.parse_args()
    src = os.path.abspath(os.path.join(os.path.dirname(__file__), "..", ".."))
    if a.in_place:
        root = src
        b = os.path.abspath(a.in_place)
        build_arg = b
        log = open(os.path.join(b, "mutation.log"), "w")
        if run(f"cmake --build {b} -j{a.jobs} --target floatpitch_tests floatpitch", root, log):
            print("the unmutated tree does not build: see", log.name)
            return 2
    else:
        root = a.scratch
        shutil.rmtree(a.scratch, ignore_errors=True)
        shutil.copytree(src, a.scratch, ignore=shutil.ignore_patterns(".git", "build*", "out"))
        log = open(os.path.join(a.scratch, "mutation.log"), "w")
        b = os.path.join(a.scratch, "build")
        build_arg = "build"
        if run(f"cmake -S . -B build -DCMAKE_BUILD_TYPE=Release -DFLOATPITCH_WINDOW=OFF -DFLOATPITCH_BENCH=OFF", a.scratch, log) or \
           run(f"cmake --build build -j{a.jobs}", a.scratch, log):
            print("the unmutated tree does not build: see", log.name)
            return 2

    def stop(signum, frame):
        raise KeyboardInterrupt(f"signal {signum}")
    signal.signal(signal.SIGTERM, stop)
    base = run(f"ctest -j{a.jobs} -E '{FAST_EXCLUDE}'", b, log)
    if base != 0:
        print("the unmutated tree fails the fast suite: fix that first (see", log.name + ")")
        return 2
    results = []
    for f, old, new, what, *flag in MUTATIONS:
        equivalent = bool(flag) and flag[0] == "equivalent"
        if a.only and not any(o and (o in what or o in f) for o in a.only.split(",")):
            continue
        path = os.path.join(root, f)
        text = open(path).read()
        n = text.count(old)
        if n != 1:
            results.append(("stale", f, what))
            print(f"stale     {f}: {what} (text found {n} times)")
            continue
        shutil.copy2(path, path + ".orig-mutation")
        t0 = time.time()
        try:
            open(path, "w").write(text.replace(old, new))
            if run(f"cmake --build {build_arg} -j{a.jobs} --target floatpitch_tests floatpitch", root, log) != 0:
                status = "killed"  # does not compile: counts as caught, but say so
                what_out = what + " (build failed)"
            else:
                rc = run(f"ctest -j{a.jobs} -E '{FAST_EXCLUDE}' --stop-on-failure --timeout 300", b, log, timeout=3600)
                status = "killed" if rc != 0 else ("equivalent" if equivalent else "SURVIVED")
                what_out = what
        finally:
            open(path, "w").write(text)
            os.remove(path + ".orig-mutation")
        results.append((status, f, what_out))
        print(f"{status:9s} {f}: {what_out}  ({time.time() - t0:.0f} s)", flush=True)
    run(f"cmake --build {build_arg} -j{a.jobs} --target floatpitch_tests floatpitch", root, log)
    killed = sum(1 for r in results if r[0] == "killed")
    equiv = sum(1 for r in results if r[0] == "equivalent")
    live = [r for r in results if r[0] not in ("stale", "equivalent")]
    print(f"\nkilled {killed} of {len(live)} non-equivalent mutations ({100.0 * killed / max(1, len(live)):.0f} %); "
          f"equivalent (survived, explained in the list) {equiv}; stale {len(results) - len(live) - equiv}")
    for r in results:
        if r[0] == "SURVIVED":
            print("  survived:", r[1], r[2])
    return 0 if killed == len(live) else 1


if __name__ == "__main__":
    sys.exit(main())
