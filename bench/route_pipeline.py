#!/usr/bin/env python3
"""The route analysis a practitioner would script with numpy/scipy: the baseline bench_route
times against Humwise's walkdown import (bench/README.md, "Route-scale import").

Usage: route_pipeline.py WALKDOWN_FOLDER FLEET_FILE   (run single-threaded: OMP/OPENBLAS/MKL_NUM_THREADS=1)

Reads the fleet file (JSON: each motor's nameplate and bearings), manifest.csv and every WAV it
lists (scipy.io.wavfile), motor by motor: its current phases first (their supply frequency sets
the motor's running speed, hence its envelope fmax), then per vibration channel (acceleration,
g in the file):
  - velocity spectrum: Welch, Hann, ~0.25 Hz lines (the whole record when shorter than 4 s),
    50 % overlap, r.m.s. scale, integrated by dividing by j 2 pi f with a 2 Hz cut-off, up to
    min(fs / 2.56, 2 kHz)  (as core/diagnosis/VibrationAnalysis.cpp);
  - overall velocity r.m.s. 10-1000 Hz from that spectrum (Hann noise bandwidth 1.5 lines);
  - a kurtogram: Antoni's 1/3-binary band grid (levels 0, 1, 1.6, 2, ... up to
    min(8, floor(log2 N) - 7)), each band cut from the whole-record FFT (FFT masking, as
    core/dsp/Kurtogram.h does), spectral kurtosis <|z|^4>/<|z|^2>^2 - 2 of its complex envelope,
    bands at least the envelope fmax wide, starting above 2 x fmax, not more than 40 dB below
    the record's average density;
  - squared envelope of the chosen band and its spectrum (Hann, ~0.5 Hz lines, up to fmax);
  - envelope fmax per motor, as core/diagnosis/Diagnose.cpp derives it: 3.3 x the fastest of its
    bearings' BPFI + 1 and 2 BSF + FTF (multiples of the synchronous speed at the measured supply
    frequency), rounded up to 50 Hz, within 200-1000 Hz; 500 Hz without bearing data;
  - waveform statistics: r.m.s., peak, crest factor, kurtosis.
Per current phase set (I-A, I-B, I-C of one motor):
  - supply frequency from phase A (Hann FFT peak near the nominal 50 Hz, parabolic interpolation);
  - zoom spectrum of phase A: scipy.signal.zoom_fft, Blackman-Harris, the whole record, fs/N
    lines, span f +- (2 x 0.05 x f + 2 Hz);
  - wide spectrum of phase A: Welch, Hann, 0.1 Hz lines or the record length, 50 % overlap,
    up to min(fs / 2.56, 2.5 kHz);
  - least-squares fundamental phasor of every phase at f, symmetrical components and the NEMA
    unbalance of the magnitudes; harmonics of phase A (magnitudes up to the 40th, THD).

Where it does less than Humwise: no database (nothing is written: no raw-file copies, no
indicators, spectra or findings stored, no transaction), no SHA-256 of the files, no quality
checks (clipping, flat line, bias drift), no speed estimation, no diagnosis rules;
supply-frequency estimation is a plain FFT peak. Where it does more: nothing of note. (Until
2026-12-02 it used a fixed envelope fmax of 500 Hz: more kurtogram bands than Humwise cuts for
the motors whose bearings give 550-1000 Hz, fewer for the one at 400 Hz.)
The figure is therefore a lower bound on what the scripted equivalent costs.
"""

import csv
import json
import math
import os
import sys
import time

import numpy as np
import scipy.io.wavfile
import scipy.signal
import scipy.stats

G = 9.80665
MAX_SLIP = 0.05
NOMINAL_HZ = 50.0


def read_manifest(folder):
    """Rows of manifest.csv (comment lines '# key: value' skipped)."""
    with open(os.path.join(folder, "manifest.csv"), newline="") as f:
        lines = [line for line in f if not line.startswith("#")]
    return list(csv.DictReader(lines))


def bearing_factors(b):
    """FTF, BPFI, BSF in multiples of shaft speed from the geometry (core/motor/Motor.cpp)."""
    c = b["element_diameter"] / b["pitch_diameter"] * math.cos(math.radians(b.get("contact_angle_deg", 0.0)))
    n = b["rolling_elements"]
    return 0.5 * (1 - c), 0.5 * n * (1 + c), b["pitch_diameter"] / (2 * b["element_diameter"]) * (1 - c * c)


def envelope_fmax(motor, line_hz):
    """The motor's envelope fmax (core/diagnosis/Diagnose.cpp, envelopeFmaxFor)."""
    shaft_hz = line_hz / (motor["nameplate"]["poles"] / 2)
    fastest = 0.0
    for end in ("de", "nde"):
        b = motor.get("bearings", {}).get(end)
        if b and "rolling_elements" in b:
            ftf, bpfi, bsf = bearing_factors(b)
        elif b:
            ftf, bpfi, bsf = b["ftf"], b["bpfi"], b["bsf"]
        else:
            continue
        fastest = max(fastest, bpfi + 1.0, 2 * bsf + ftf)
    if fastest == 0:
        return 500.0
    return min(1000.0, max(200.0, math.ceil(3.3 * fastest * shaft_hz / 50.0) * 50.0))


def read_channel(folder, row):
    fs, data = scipy.io.wavfile.read(os.path.join(folder, row["file"]))
    x = np.asarray(data, dtype=np.float64)
    if x.ndim > 1:
        x = x[:, int(row["channel"]) - 1]
    return float(fs), x / float(row.get("sensitivity") or 1.0)


# ---- vibration -------------------------------------------------------------------------

def velocity_spectrum(acc, fs):
    """Welch r.m.s. spectrum of acceleration, integrated to velocity (m/s r.m.s. per line)."""
    nperseg = min(len(acc), int(round(fs / 0.25)))
    f, p = scipy.signal.welch(acc, fs, window="hann", nperseg=nperseg, noverlap=nperseg // 2,
                              scaling="spectrum", detrend="constant")
    keep = f <= min(fs / 2.56, 2000.0)
    f, amp = f[keep], np.sqrt(p[keep])
    vel = np.zeros_like(amp)
    above = f >= 2.0
    vel[above] = amp[above] / (2 * np.pi * f[above])
    return f, vel


def band_rms(f, spectrum_rms, lo, hi, enbw_lines=1.5):
    band = (f >= lo) & (f <= hi)
    return math.sqrt(np.sum(spectrum_rms[band] ** 2) / enbw_lines)


def kurtogram_levels(n):
    """(level, band count): level k has 2^k bands, level k + log2(3) has 3 x 2^k (Antoni 2007)."""
    max_level = max(1, min(8, int(math.floor(math.log2(n))) - 7))
    levels = [(float(k), 2 ** k) for k in range(max_level + 1)]
    levels += [(k + math.log2(3), 3 * 2 ** k) for k in range(max_level) if k + math.log2(3) <= max_level]
    return sorted(levels)


def kurtogram_bands(fs, n, fmax):
    """(level, lo, hi) of every allowed band of the 1/3-binary grid."""
    bands = []
    for level, count in kurtogram_levels(n):
        width = fs / 2 / count
        for i in range(count):
            lo, hi = i * width, (i + 1) * width
            if width >= fmax and lo >= 2 * fmax and hi <= fs / 2:
                bands.append((level, lo, hi))
    return bands


def band_envelope(spectrum, fs, lo, hi, min_rate):
    """Complex envelope of [lo, hi) from the whole-record FFT, at a rate of at least min_rate."""
    n = 2 * (len(spectrum) - 1)
    i0, i1 = int(round(lo * n / fs)), int(round(hi * n / fs))
    width = i1 - i0
    m = max(width, int(math.ceil(min_rate * n / fs)))
    z = np.zeros(m, dtype=complex)
    z[:width] = spectrum[i0:i1]
    return np.fft.ifft(z) * (m / n), fs * m / n


def choose_band(acc, fs, fmax):
    spectrum = np.fft.rfft(acc - acc.mean())
    density = np.abs(spectrum) ** 2
    mean_density = density.mean()
    best = None
    n = len(acc)
    for level, lo, hi in kurtogram_bands(fs, n, fmax):
        i0, i1 = int(round(lo * n / fs)), int(round(hi * n / fs))
        if 10 * math.log10(density[i0:i1].mean() / mean_density + 1e-300) < -40:
            continue
        z, _ = band_envelope(spectrum, fs, lo, hi, 0)
        e2 = np.abs(z) ** 2
        sk = np.mean(e2 ** 2) / np.mean(e2) ** 2 - 2
        if best is None or sk > best[0]:
            best = (sk, lo, hi)
    return spectrum, best


def envelope_spectrum(acc, fs, fmax):
    spectrum, best = choose_band(acc, fs, fmax)
    if best is None:
        return None
    _, lo, hi = best
    # Sampled at >= 2 x the band width and >= 2.56 fmax, as core/dsp/Envelope.cpp.
    z, rate = band_envelope(spectrum, fs, lo, hi, max(2 * (hi - lo), 2.56 * fmax))
    env = np.abs(z) ** 2
    nperseg = min(len(env), int(round(rate / 0.5)))
    f, p = scipy.signal.welch(env, rate, window="hann", nperseg=nperseg, noverlap=nperseg // 2, scaling="spectrum")
    keep = f <= fmax
    return lo, hi, f[keep], np.sqrt(p[keep])


def waveform_statistics(x):
    rms = math.sqrt(np.mean(x ** 2))
    peak = float(np.max(np.abs(x)))
    return rms, peak, peak / rms if rms > 0 else 0.0, float(scipy.stats.kurtosis(x, fisher=False))


def analyse_vibration(acc_g, fs, envelope_fmax_hz):
    acc = acc_g * G
    f, vel = velocity_spectrum(acc, fs)
    overall = band_rms(f, vel, 10.0, min(1000.0, f[-1]))
    env = envelope_spectrum(acc, fs, envelope_fmax_hz) if fs / 2 > 2 * envelope_fmax_hz else None
    return overall, env, waveform_statistics(acc)


# ---- currents --------------------------------------------------------------------------

def supply_frequency(a, fs):
    w = scipy.signal.get_window("hann", len(a))
    mag = np.abs(np.fft.rfft((a - a.mean()) * w))
    df = fs / len(a)
    lo, hi = int(0.5 * NOMINAL_HZ / df), int(1.5 * NOMINAL_HZ / df)
    k = lo + int(np.argmax(mag[lo:hi]))
    y0, y1, y2 = np.log(mag[k - 1:k + 2])
    return (k + 0.5 * (y0 - y2) / (y0 - 2 * y1 + y2)) * df


def zoom_spectrum(a, fs, f):
    half = 2 * MAX_SLIP * f + 2.0
    df = fs / len(a)
    m = int(round(2 * half / df)) + 1
    w = scipy.signal.get_window("blackmanharris", len(a))
    z = scipy.signal.zoom_fft(a * w, [f - half, f + half], m=m, fs=fs, endpoint=True)
    return np.abs(z) * math.sqrt(2) / np.sum(w)


def wide_spectrum(a, fs):
    nperseg = min(len(a), int(round(fs / 0.1)))
    fr, p = scipy.signal.welch(a, fs, window="hann", nperseg=nperseg, noverlap=nperseg // 2, scaling="spectrum")
    keep = fr <= min(fs / 2.56, 2500.0)
    return fr[keep], np.sqrt(p[keep])


def phasor(x, fs, f):
    """Least-squares fundamental phasor (r.m.s. magnitude, phase) of x at f, with an offset."""
    t = np.arange(len(x)) / fs
    basis = np.column_stack([np.cos(2 * np.pi * f * t), np.sin(2 * np.pi * f * t), np.ones_like(t)])
    (c, s, _), *_ = np.linalg.lstsq(basis, x, rcond=None)
    return complex(c, -s) / math.sqrt(2)


def sequence_components(pa, pb, pc):
    a = np.exp(2j * np.pi / 3)
    zero = (pa + pb + pc) / 3
    positive = (pa + a * pb + a * a * pc) / 3
    negative = (pa + a * a * pb + a * pc) / 3
    return zero, positive, negative


def harmonics(a, fs, f, count=40):
    mag = np.abs(np.fft.rfft(a * scipy.signal.get_window("hann", len(a))))
    df = fs / len(a)
    h = [mag[int(round(k * f / df))] for k in range(1, count + 1) if k * f < fs / 2]
    return math.sqrt(sum(v * v for v in h[1:])) / h[0]


def analyse_currents(phases, fs):
    a = phases[0]
    f = supply_frequency(a, fs)
    zoom = zoom_spectrum(a, fs, f)
    wide = wide_spectrum(a, fs)
    ph = [phasor(x, fs, f) for x in phases]
    mags = [abs(p) for p in ph]
    unbalance = 100 * max(abs(m - np.mean(mags)) for m in mags) / np.mean(mags)
    seq = sequence_components(*ph)
    return f, zoom, wide, unbalance, abs(seq[2]) / abs(seq[1]), harmonics(a, fs, f)


# ---- route -----------------------------------------------------------------------------

def main(folder, fleet_file):
    t0 = time.perf_counter()
    with open(fleet_file) as f:
        fleet = {m["tag"]: m for m in json.load(f)["motors"]}
    rows = read_manifest(folder)
    motors = {}
    for row in rows:
        motors.setdefault(row["motor"], []).append(row)
    overall, supply = [], []
    for tag, points in motors.items():
        motor = fleet[tag]
        if "poles" not in motor["nameplate"]:
            sys.exit(f"route_pipeline: motor {tag}: the fleet file gives no poles (the benchmark's fleet always does)")
        line_hz = float(motor["nameplate"]["supply_hz"])
        currents, current_fs = [], None
        for row in points:
            if row["quantity"] == "current":
                current_fs, x = read_channel(folder, row)
                currents.append(x)
        if currents:
            line_hz = analyse_currents(currents, current_fs)[0]
            supply.append(line_hz)
        fmax = envelope_fmax(motor, line_hz)
        for row in points:
            if row["quantity"] == "acceleration":
                fs, x = read_channel(folder, row)
                overall.append(analyse_vibration(x, fs, fmax)[0])
    elapsed = time.perf_counter() - t0
    print(f"route_pipeline: {len(motors)} motors, {len(overall)} vibration channels, {len(supply)} phase sets "
          f"in {elapsed:.2f} s (numpy {np.__version__}, scipy {scipy.__version__}); "
          f"velocity r.m.s. 10-1000 Hz mean {1e3 * np.mean(overall):.3f} mm/s, supply median {np.median(supply):.3f} Hz")


if __name__ == "__main__":
    if len(sys.argv) != 3:
        sys.exit(__doc__)
    main(sys.argv[1], sys.argv[2])
