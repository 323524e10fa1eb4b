#!/usr/bin/python3
"""Cross-check of floatpitch's turbulence field with a general-purpose library (SciPy).

floatpitch flies the test airplane through an hour of Dryden turbulence; the gust it met at the
wing (held.csv, gust_w_wing and gust_u_wing) is a record of the field along the path. Its power
spectral density, estimated by scipy.signal.welch and turned from time to spatial frequency
(Omega = 2 pi f / V, Phi(Omega) = S(f) V / (2 pi)), must match the published Dryden spectra of
MIL-F-8785C section 3.7 with the intensities and scale lengths floatpitch reports in summary.json,
and its variance must match sigma^2 (the check that catches a shaping filter fed with noise of
the wrong intensity, the "1/pi" trap). Tolerances are statistical: 4 standard deviations of the
estimate for the record's length in scale lengths (Welch: Bendat and Piersol, Random Data,
sec. 8.5: relative standard error 1/sqrt(n_d) for n_d averages), plus 5 % for the airplane's
ground-speed changes and the spline between the record's samples.
Exit 77 (CTest: skipped) when SciPy is not installed.
Usage: turbulence_welch.py FLOATPITCH_BINARY SCENARIO WORKDIR
"""
import csv, json, math, os, subprocess, sys

try:
    import numpy as np
    from scipy import signal
except ImportError:
    print("SKIPPED: python3-scipy is not installed (apt-get install python3-scipy)")
    sys.exit(77)

exe, scenario, work = sys.argv[1], sys.argv[2], sys.argv[3]
os.makedirs(work, exist_ok=True)
subprocess.check_call([exe, "run", scenario, "--out", work, "--quiet"])
summary = json.load(open(work + "/summary.json"))
turb = summary["turbulence"]
V = summary["trim"]["airspeed_mps"]
with open(work + "/held.csv") as f:
    rd = csv.reader(f)
    head = next(rd)
    data = np.array([[float(x) for x in r] for r in rd])
col = {h.split(" [")[0]: i for i, h in enumerate(head)}
t = data[:, col["time"]]
dt = t[1] - t[0]
failures = checks = 0


def dryden(comp, sigma, L, Om):
    x = L * Om
    if comp == "u":
        return sigma**2 * (2 * L / math.pi) / (1 + x**2)
    return sigma**2 * (L / math.pi) * (1 + 3 * x**2) / (1 + x**2) ** 2


for comp, channel in (("w", "gust_w_wing"), ("u", "gust_u_wing")):
    sigma, L = turb["sigma_%s_mps" % comp], turb["scale_%s_m" % comp]
    y = data[:, col[channel]]
    n_scales = V * (t[-1] - t[0]) / L
    # variance: relative standard error about sqrt(2 L / X) for an exponentially correlated process
    checks += 1
    var = np.var(y)
    tol = 4 * math.sqrt(2.0 / n_scales) + 0.05
    ok = abs(var / sigma**2 - 1) < tol
    failures += not ok
    print(f"{comp}: variance {var:.4f} m2/s2 against sigma^2 {sigma**2:.4f} ({var / sigma**2:.3f}, allowed +-{tol:.3f})"
          f" over {n_scales:.0f} scale lengths: {'ok' if ok else 'FAILED'}")
    # spectrum: segments of about 40 scale lengths; the first three bins are left out (the Hann
    # window's main lobe reaches the removed mean there)
    nseg = int(2 ** round(math.log2(40 * L / (V * dt))))
    f, S = signal.welch(y, fs=1.0 / dt, window="hann", nperseg=nseg, noverlap=nseg // 2, detrend="constant")
    Om = 2 * math.pi * f / V
    Phi = S * V / (2 * math.pi)
    n_avg = (len(y) - nseg) // (nseg // 2) + 1
    # the check can tell a scale length 30 % off (the example of an error to catch): the
    # same bands against the published spectrum with L x 1.3 and L / 1.3 must each miss in at
    # least one band (at high Omega L the Dryden spectra go as 1/L: a 30 % miss)
    for wrong in (1.3, 1 / 1.3):
        missed = False
        for lo, hi in ((0.5, 1.0), (1.0, 2.0), (2.0, 4.0), (4.0, 10.0)):
            sel = (Om * L >= lo) & (Om * L < hi) & (np.arange(len(Om)) >= 3)
            nb = int(sel.sum())
            if nb == 0:
                continue
            r = Phi[sel].sum() / sum(dryden(comp, sigma, L * wrong, o) for o in Om[sel])
            missed |= abs(r - 1) >= 4 / math.sqrt(0.9 * n_avg * nb) + 0.05
        checks += 1
        failures += not missed
        print(f"{comp}: with the scale length x {wrong:.3f} the bands {'miss: the check can tell' if missed else 'STILL PASS: the check cannot tell'}")
    for lo, hi in ((0.5, 1.0), (1.0, 2.0), (2.0, 4.0), (4.0, 10.0)):
        sel = (Om * L >= lo) & (Om * L < hi) & (np.arange(len(Om)) >= 3)
        nb = int(sel.sum())
        if nb == 0:
            continue
        checks += 1
        ratio = Phi[sel].sum() / sum(dryden(comp, sigma, L, o) for o in Om[sel])
        tol = 4 / math.sqrt(0.9 * n_avg * nb) + 0.05
        ok = abs(ratio - 1) < tol
        failures += not ok
        print(f"{comp}: Welch PSD / published Dryden over Omega L {lo}-{hi} ({nb} bins, {n_avg} segments): "
              f"{ratio:.3f} (allowed +-{tol:.3f}): {'ok' if ok else 'FAILED'}")
print(f"{checks - failures} passed, {failures} failed")
sys.exit(1 if failures else 0)
