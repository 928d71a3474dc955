#!/usr/bin/python3
"""Reference values from scipy.signal / scipy.stats for tests/core/dsp/ScipyCrossCheckTest.cpp.

Run with Debian's /usr/bin/python3 (python3-numpy 1.24.2, python3-scipy 1.10.1 on bookworm),
not the image's pyenv python3, which has no numpy:

    /usr/bin/python3 tests/reference/scipy_reference.py OUTPUT.txt

Deterministic: numpy's Generator is seeded, and every input signal is written to the output
too, so the C++ side analyses exactly the samples scipy analysed (%.17g round-trips a double).

Output format, one record per line, parseable without a JSON library:

    NAME COUNT V1 V2 ... VCOUNT

NAME has no blanks; its fields are separated by '/'. Lines starting with '#' are comments.
Records:
    meta/versions             3 numpy, scipy version as numbers (major minor patch of scipy)
    signal/ID                 N samples (ID = mixN, amN, stat-..., ...)
    fs/ID                     1 sample rate of signal ID in Hz
    window/NAME/N             N samples of get_window(NAME, N, fftbins=True) (not normalised)
                              NAME = boxcar|hann|hamming|blackmanharris|kaiser:BETA|hft95
    windowsym/NAME/N          the same with fftbins=False (symmetric)
    welch/ID/WIN/NPERSEG/NOVERLAP/SCALING      one-sided welch result (all lines 0..NPERSEG//2)
    welchinfo/ID/WIN/NPERSEG/NOVERLAP          3: line spacing f[1]-f[0], segments averaged, lines
    periodogram/ID/WIN/SCALING[/nodetrend]     one-sided periodogram result
    stats/ID                  6: kurtosis(fisher=False), skew, mean, std (ddof 0), max|x-mean|, ptp
    hilbert/ID/BAND/M         M values of |analytic signal|, see make_hilbert()
    ref15/...                 REFERENCE.md section 1.5 check values recomputed with scipy
"""

import sys

import numpy as np
import scipy
import scipy.signal as sig
import scipy.stats as stats
from scipy.signal import windows

# Heinzel, Ruediger & Schilling 2002, Table 2 (HFT95); our flat-top (core/dsp/Window.h).
HFT95 = [1.0, 1.9383379, 1.3045202, 0.4028270, 0.0350665]
KAISER_BETAS = [0.0, 2 * np.pi, 2.5 * np.pi, 3 * np.pi, 3.5 * np.pi, 8.6, 14.0, 30.0]
WINDOW_LENGTHS = [1, 2, 3, 7, 8, 1000, 1024, 4093, 4096, 4097, 8191, 20000]
SYMMETRIC_LENGTHS = [3, 4, 8, 1000, 1001, 4093]  # N = 2 symmetric hann etc. is all zeros
SIGNAL_LENGTHS = [1000, 1024, 4093, 4097, 8191, 20000]
FS = 2560.0

out = []


def put(name, values):
    values = np.ravel(np.asarray(values, dtype=float))
    assert " " not in name
    out.append(name + " " + str(values.size) + "".join(" %.17g" % v for v in values))


def window(name, n):
    """Periodic ('DFT-even') window, as scipy builds it for spectral analysis."""
    if name == "hft95":
        return windows.general_cosine(n, HFT95, sym=False)
    if name.startswith("kaiser:"):
        return sig.get_window(("kaiser", float(name[7:])), n, fftbins=True)
    return sig.get_window(name, n, fftbins=True)


def symmetric_window(name, n):
    """Symmetric window (denominator N - 1, for filter design): get_window(..., fftbins=False)."""
    if name == "hft95":
        return windows.general_cosine(n, HFT95, sym=True)
    if name.startswith("kaiser:"):
        return sig.get_window(("kaiser", float(name[7:])), n, fftbins=False)
    return sig.get_window(name, n, fftbins=False)


def kaiser_name(beta):
    return "kaiser:%.17g" % beta


rng = np.random.default_rng(20240611)

put("meta/versions", [float(v) for v in scipy.__version__.split(".")[:3]])

# ---- windows -------------------------------------------------------------------------------
window_names = ["boxcar", "hann", "hamming", "blackmanharris", "hft95"] + [kaiser_name(b) for b in KAISER_BETAS]
for n in WINDOW_LENGTHS:
    for name in window_names:
        put("window/%s/%d" % (name, n), window(name, n))
for n in SYMMETRIC_LENGTHS:
    for name in window_names:
        put("windowsym/%s/%d" % (name, n), symmetric_window(name, n))

# ---- input signals ---------------------------------------------------------------------------
# mixN: DC offset + two tones (one bin-centred for nothing in particular, one off-bin) + Gaussian
# noise, so that every spectral line is well above rounding noise and detrending matters.
signals = {}
for n in SIGNAL_LENGTHS:
    t = np.arange(n) / FS
    x = (0.37 + 1.5 * np.sin(2 * np.pi * 100.0 * t + 0.3) + 0.4 * np.sin(2 * np.pi * 433.3 * t + 1.1)
         + 0.2 * rng.standard_normal(n))
    signals["mix%d" % n] = (x, FS)


def am_signal(n, fs):
    """Amplitude-modulated carrier plus a little noise (so the Nyquist line is not empty)."""
    t = np.arange(n) / fs
    x = 0.25 + (1.0 + 0.5 * np.cos(2 * np.pi * 0.031 * fs * t + 0.2)) * np.cos(2 * np.pi * 0.173 * fs * t + 0.7)
    return x + 0.05 * rng.standard_normal(n)


# Lengths for the Hilbert envelope. 1125 = 3^2 5^3, 2401 = 7^4, 3375 = 3^3 5^3 are odd (no Nyquist
# line) and FFTW-fast, so extractBand keeps the record length; 1000, 1024, 20000 are even and
# fast; 4093 (prime) and 4097 (17 x 241) are odd and not fast, so extractBand pads to
# nextFastFftSize (4096 and 4116) - i.e. it returns the analytic signal resampled.
# fs = 10 N Hz keeps the line spacing (10 Hz) and fs/2 / spacing exact in binary.
AM_LENGTHS = [1125, 2401, 3375, 1000, 1024, 20000, 4093, 4097]
for n in AM_LENGTHS:
    fs = 10.0 * n
    signals["am%d" % n] = (am_signal(n, fs), fs)

# statistics: Gaussian, pure sine (kurtosis 1.5, skew 0), impulsive, skewed.
n = 20000
signals["stat-gauss"] = (1.5 * rng.standard_normal(n) + 0.2, FS)
signals["stat-sine"] = (np.sin(2 * np.pi * 50.0 * np.arange(n) / 10000.0), 10000.0)
imp = 0.1 * rng.standard_normal(n)
imp[::997] += 3.0  # a shock every 997 samples
signals["stat-impulsive"] = (imp, FS)
signals["stat-exponential"] = (rng.exponential(2.0, 8191), FS)

for name, (x, fs) in signals.items():
    put("signal/" + name, x)
    put("fs/" + name, [fs])

# ---- welch -----------------------------------------------------------------------------------
WELCH_CASES = [  # signal, window, nperseg, noverlap
    ("mix20000", "hann", 1024, 512),
    ("mix20000", "hann", 1000, 250),
    ("mix20000", "hamming", 1001, 500),
    ("mix20000", "blackmanharris", 4093, 3070),
    ("mix20000", "boxcar", 2048, 0),
    ("mix20000", kaiser_name(3 * np.pi), 2500, 1250),
    ("mix20000", "hft95", 4096, 3072),
    ("mix8191", "hann", 8191, 0),
    ("mix8191", "hamming", 999, 333),
    ("mix4097", "hann", 1024, 512),
    ("mix4093", "blackmanharris", 512, 384),
    ("mix1000", "hann", 256, 128),
    ("mix1024", kaiser_name(14.0), 257, 0),
]
for sid, wname, nperseg, noverlap in WELCH_CASES:
    x, fs = signals[sid]
    w = window(wname, nperseg)
    key = "%s/%s/%d/%d" % (sid, wname, nperseg, noverlap)
    for scaling in ("density", "spectrum"):
        f, p = sig.welch(x, fs=fs, window=w, nperseg=nperseg, noverlap=noverlap, detrend="constant",
                         return_onesided=True, scaling=scaling, average="mean")
        put("welch/%s/%s" % (key, scaling), p)
    step = nperseg - noverlap
    put("welchinfo/" + key, [f[1] - f[0], (x.size - noverlap) // step, f.size])

# ---- periodogram -----------------------------------------------------------------------------
for n in SIGNAL_LENGTHS:
    sid = "mix%d" % n
    x, fs = signals[sid]
    for wname in ("boxcar", "hann"):
        for scaling in ("density", "spectrum"):
            f, p = sig.periodogram(x, fs=fs, window=wname, detrend="constant", return_onesided=True,
                                   scaling=scaling)
            put("periodogram/%s/%s/%s" % (sid, wname, scaling), p)
    f, p = sig.periodogram(x, fs=fs, window="boxcar", detrend=False, scaling="density")
    put("periodogram/%s/boxcar/density/nodetrend" % sid, p)

# ---- statistics ------------------------------------------------------------------------------
for name, (x, fs) in signals.items():
    if name.startswith("stat-") or name in ("mix20000", "mix4093"):
        put("stats/" + name, [stats.kurtosis(x, fisher=False), stats.skew(x), np.mean(x), np.std(x),
                              np.max(np.abs(x - np.mean(x))), np.ptp(x)])

# ---- Hilbert envelope ------------------------------------------------------------------------
# BAND = full: |hilbert(x - mean)|, the whole one-sided spectrum including the Nyquist line with
#              scipy's weight h[N/2] = 1 (Marple 1999).
# BAND = belownyq (even N only): the same for the record with its Nyquist line removed,
#              |hilbert(irfft(rfft(x - mean) with X[N/2] = 0))|.
# M != N: the analytic signal resampled to M points (scipy.signal.resample of the complex
#         analytic signal = zero-padding its spectrum), times M/N is applied by resample itself.
for n in AM_LENGTHS:
    sid = "am%d" % n
    x, fs = signals[sid]
    xc = x - np.mean(x)
    m = n
    while True:  # nextFastFftSize
        r = m
        for p in (2, 3, 5, 7):
            while r % p == 0:
                r //= p
        if r == 1:
            break
        m += 1
    z = sig.hilbert(xc)
    if m != n:
        z = sig.resample(z, m)
    put("hilbert/%s/full/%d" % (sid, m), np.abs(z))
    if n % 2 == 0:
        X = np.fft.rfft(xc)
        X[-1] = 0.0
        put("hilbert/%s/belownyq/%d" % (sid, m), np.abs(sig.hilbert(np.fft.irfft(X, n))))

# ---- REFERENCE.md 1.5 check values -----------------------------------------------------------
# fs = N = 1024, x = 2 sin(2 pi f t) for f = 100 (bin-centred) and 100.5 Hz.
fs, n = 1024.0, 1024
t = np.arange(n) / fs
for label, f0 in (("bin", 100.0), ("offbin", 100.5)):
    x = 2.0 * np.sin(2 * np.pi * f0 * t)
    for wname in ("boxcar", "hann", "hft95"):
        w = window(wname, n)
        _, ps = sig.periodogram(x, fs=fs, window=w, scaling="spectrum")
        _, pd = sig.periodogram(x, fs=fs, window=w, scaling="density")
        # value at 100 Hz (PS, PSD), peak-line amplitude sqrt(2 max PS), sum of PSD * df over lines 95..105
        put("ref15/%s/%s" % (label, wname), [ps[100], pd[100], np.sqrt(2 * ps.max()), pd[95:106].sum() * (fs / n)])

sys.stdout.flush()
with open(sys.argv[1], "w") as fh:
    fh.write("# scipy %s, numpy %s: tests/reference/scipy_reference.py\n" % (scipy.__version__, np.__version__))
    fh.write("\n".join(out))
    fh.write("\n")
