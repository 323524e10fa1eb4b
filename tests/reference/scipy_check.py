#!/usr/bin/python3
"""Cross-check of floatpitch's linear model with a general-purpose library (SciPy).

1. The eigenvalues of the state-space matrices written by `floatpitch modes --matrices`,
   computed by scipy.linalg.eigvals, match the roots floatpitch reports (relative 1e-6).
2. The response of that linear model to a small held-elevator pulse, computed by
   scipy.signal.lsim, matches floatpitch's nonlinear time response of the same pulse
   (angle of attack and pitch rate within 3 % of their peak deviation).
Exit 77 (CTest: skipped) when SciPy is not installed.
Usage: scipy_check.py FLOATPITCH_BINARY SCENARIO WORKDIR
"""
import csv, json, os, subprocess, sys

try:
    import numpy as np
    from scipy import linalg, signal
except ImportError:
    print("SKIPPED: python3-scipy is not installed (apt-get install python3-scipy)")
    sys.exit(77)

exe, scenario, work = sys.argv[1], sys.argv[2], sys.argv[3]
os.makedirs(work, exist_ok=True)


def read_matrix(path):
    with open(path) as f:
        rows = list(csv.reader(f))
    cols = rows[0][1:]
    M = np.array([[float(x) for x in r[1:]] for r in rows[1:]])
    return cols, [r[0] for r in rows[1:]], M


modes = json.loads(subprocess.check_output([exe, "modes", scenario, "--json", "--matrices", work + "/mats"]))
failures = 0
checks = 0
for case in ("held", "free"):
    if modes[case] is None:
        continue
    _, _, A = read_matrix(f"{work}/mats/A_{case}.csv")
    ev = linalg.eigvals(A)
    ours = []
    for m in modes[case]:
        ours.append(complex(m["real"], m["imag"]))
        if m["imag"] != 0:
            ours.append(complex(m["real"], -m["imag"]))
    for r in ours:
        checks += 1
        d = min(abs(ev - r))
        if d > 1e-6 * max(1.0, abs(r)):
            print(f"{case}: root {r} not among scipy's eigenvalues (closest {d:.3g} away)")
            failures += 1
    print(f"{case}: {len(ours)} roots match scipy.linalg.eigvals ({len(ev)} eigenvalues)")

# pulse response: held elevator -0.5 deg from t = 1 s to 1.5 s
subprocess.check_call([exe, "run", scenario, "--controls", "held", "--out", work + "/run", "--quiet"])
with open(work + "/run/held.csv") as f:
    rd = csv.reader(f)
    head = next(rd)
    data = np.array([[float(x) for x in r] for r in rd])
col = {h.split(" [")[0]: i for i, h in enumerate(head)}
t = data[:, col["time"]]
cols, rows, A = read_matrix(f"{work}/mats/A_held.csv")
_, _, B = read_matrix(f"{work}/mats/B_held.csv")
names = [c.split(" [")[0] for c in cols]
u = np.where((t >= 1.0) & (t < 1.5), np.radians(-0.5), 0.0)
sysl = signal.StateSpace(A, B[:, 1:2], np.eye(A.shape[0]), np.zeros((A.shape[0], 1)))
_, y, _ = signal.lsim(sysl, u, t, interp=False)  # zero-order hold: the pulse starts exactly at 1 s
V0 = data[0, col["airspeed"]]
# alpha from the linear states: atan2(w, u) about the trim, to first order
iu, iw, iq = names.index("u"), names.index("w"), names.index("q")
u0 = V0 * np.cos(np.radians(data[0, col["alpha"]]))
w0 = V0 * np.sin(np.radians(data[0, col["alpha"]]))
dalpha_lin = np.degrees((u0 * y[:, iw] - w0 * y[:, iu]) / V0**2)
dq_lin = np.degrees(y[:, iq])
dalpha = data[:, col["alpha"]] - data[0, col["alpha"]]
dq = data[:, col["q"]] - data[0, col["q"]]
for name, lin, non in (("alpha", dalpha_lin, dalpha), ("q", dq_lin, dq)):
    checks += 1
    peak = max(abs(non))
    err = max(abs(lin - non))
    print(f"pulse response {name}: peak deviation {peak:.4f} deg, max |linear - nonlinear| {err:.5f} ({100*err/peak:.2f} %)")
    if err > 0.03 * peak:
        failures += 1
print(f"{checks - failures} passed, {failures} failed")
sys.exit(1 if failures else 0)
