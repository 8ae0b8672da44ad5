"""Independent room-acoustics analysis with numpy/scipy only, the yardstick of the engine's speed.

It does the same kind of work as the engine, written from the standards rather than from its
code: optional deconvolution of a recorded sweep by regularised spectral division (Farina, AES
108th convention, 2000; Kirkeby & Nelson, JAES 47(7/8), 1999), the start point at 20 dB below
the peak (ISO 3382-1:2009, A.3.4), zero-phase Butterworth octave or one-third-octave bands
(IEC 61260-1:2014 exact mid-band frequencies, order 3 per pass through scipy.signal.sosfiltfilt),
a Lundeby noise floor and truncation (Lundeby et al., Acustica 81:344-355, 1995), the Schroeder
backward integral with the tail compensated, EDT/T20/T30 by least squares (ISO 3382-1:2009,
A.2.2) and C50, C80, D50 and centre time (ISO 3382-1:2009, A.2.4-A.2.6).

  /usr/bin/python3 tests/reference/pipeline.py FILE.wav [--bands octave|third] [--reference SWEEP.wav]
      whole process: prints the parameters as JSON (for the command-line comparison)
  /usr/bin/python3 tests/reference/pipeline.py --bench FILE.wav [...] [--runs N]
      in-process: CPU time of the analysis (file already read, imports done) on its first call and
      on N more, and of the lower bound (one FFT of the file plus ten zero-phase band passes); ms
"""
import json
import sys
import time

import numpy as np
from scipy import signal, stats
from scipy.io import wavfile

G = 10 ** 0.3
BANDS = {"octave": (1, range(-4, 4)), "third": (3, range(-13, 11))}


def read(path, channel=0):
    fs, data = wavfile.read(path)
    scale = {np.dtype(np.int16): 32768.0, np.dtype(np.int32): 2147483648.0}.get(data.dtype, 1.0)
    x = data.astype(np.float64) / scale
    if x.ndim > 1:
        x = x[:, channel]
    return fs, x


def band_edges(kind, fs):
    b, indices = BANDS[kind]
    out = []
    for x in indices:
        fm = 1000 * G ** (x / b)
        half = G ** (1 / (2 * b))
        out.append((fm / half, fm * half))
    return out


def deconvolve(recorded, sweep, fs):
    n = 1 << int(np.ceil(np.log2(len(recorded) + len(sweep))))
    X = np.fft.rfft(sweep, n)
    Y = np.fft.rfft(recorded, n)
    power = np.abs(X) ** 2
    eps = power.max() * 1e-6
    h = np.fft.irfft(Y * np.conj(X) / (power + eps), n)
    peak = int(np.argmax(np.abs(h[: len(recorded)])))
    return h[max(0, peak - int(0.005 * fs)) : len(recorded)]


def lundeby(squared, fs):
    n = len(squared)
    noise = max(squared[int(0.9 * n) :].mean(), squared.max() * 1e-30)
    length = max(1, min(int(0.02 * fs), n // 4))
    count = n // length
    levels = 10 * np.log10(np.maximum(squared[: count * length].reshape(count, length).mean(axis=1), 1e-300))
    times = (np.arange(count) * length + length / 2) / fs
    peak = int(np.argmax(levels))
    below = np.nonzero(levels[peak + 1 :] <= 10 * np.log10(noise) + 10)[0]
    end = peak + 1 + (below[0] if len(below) else count - peak - 1)
    end = max(end, min(peak + 2, count))
    if end - peak < 2:
        return n, None, noise
    fit = stats.linregress(times[peak:end], levels[peak:end])
    if not fit.slope < 0:
        return n, None, noise
    slope, intercept = fit.slope, fit.intercept
    cross = min(n / fs, max(0.0, (10 * np.log10(noise) - intercept) / slope))
    length = max(1, min(int(round(10 / -slope / 5 * fs)), n // 8))
    count = n // length
    levels = 10 * np.log10(np.maximum(squared[: count * length].reshape(count, length).mean(axis=1), 1e-300))
    times = (np.arange(count) * length + length / 2) / fs
    peak = int(np.argmax(levels))
    for _ in range(5):
        start = min(int(0.9 * n), int(round((cross + 10 / -slope) * fs)))
        noise = max(squared[start:].mean(), squared.max() * 1e-30)
        noise_db = 10 * np.log10(noise)
        top = min(noise_db + 25, levels[peak])
        first = peak + int(np.argmax(levels[peak:] <= top)) if np.any(levels[peak:] <= top) else count
        rest = np.nonzero(levels[first + 1 :] <= noise_db + 10)[0]
        last = first + 1 + (rest[0] if len(rest) else count - first - 1)
        if last - first < 2:
            break
        fit = stats.linregress(times[first:last], levels[first:last])
        if not fit.slope < 0:
            break
        slope, intercept = fit.slope, fit.intercept
        new = min(n / fs, max(0.0, (noise_db - intercept) / slope))
        settled = abs(new - cross) < length / fs
        cross = new
        if settled:
            break
    index = max(1, min(n, int(round(cross * fs))))
    at_cross = 10 ** ((intercept + slope * index / fs) / 10)
    return index, slope, at_cross


def decay_parameters(squared, fs):
    cross, slope, at_cross = lundeby(squared, fs)
    tail = 0.0
    if slope is not None:
        rate = -slope * np.log(10) / 10
        tail = at_cross / (1 - np.exp(-rate / fs))
    energy = np.cumsum(squared[:cross][::-1])[::-1] + tail
    level = 10 * np.log10(energy / energy[0])
    t = np.arange(len(level)) / fs
    result = {}
    for name, top, bottom in (("edtS", 0, -10), ("t20S", -5, -25), ("t30S", -5, -35)):
        first = int(np.argmax(level <= top))
        reached = level <= bottom
        if not reached.any():
            result[name] = None
            continue
        last = int(np.argmax(reached))
        fit = stats.linregress(t[first : last + 1], level[first : last + 1])
        result[name] = -60 / fit.slope
    total = squared[:cross].sum() + tail
    e50, e80 = squared[: int(0.05 * fs)].sum(), squared[: int(0.08 * fs)].sum()
    result["c50Db"] = 10 * np.log10(e50 / (total - e50))
    result["c80Db"] = 10 * np.log10(e80 / (total - e80))
    result["d50"] = e50 / total
    result["tsMs"] = 1000 * (t[:cross] * squared[:cross]).sum() / total
    return result


def analyse(x, fs, kind, sweep=None):
    if sweep is not None:
        x = deconvolve(x, sweep, fs)
    squared = x**2
    start = int(np.argmax(squared >= squared.max() * 10 ** -2))
    edges = band_edges(kind, fs)
    pad = 8192
    padded = np.concatenate([np.zeros(pad), x[start:]])
    out = {"bands": []}
    span = signal.butter(3, [edges[0][0], edges[-1][1]], btype="band", fs=fs, output="sos")
    out["broadband"] = decay_parameters(signal.sosfiltfilt(span, padded)[pad:] ** 2, fs)
    for low, high in edges:
        sos = signal.butter(3, [low, high], btype="band", fs=fs, output="sos")
        y = signal.sosfiltfilt(sos, padded)[pad:]
        out["bands"].append({"centerHz": round(np.sqrt(low * high), 1), **decay_parameters(y**2, fs)})
    return out


def lower_bound(x, fs):
    """One FFT of the file and ten zero-phase octave-band passes: work no analysis can skip."""
    np.fft.rfft(x)
    for low, high in band_edges("octave", fs)[:8] + band_edges("octave", fs)[:2]:
        signal.sosfiltfilt(signal.butter(3, [low, high], btype="band", fs=fs, output="sos"), x)


def main(argv):
    bench = "--bench" in argv
    args = [a for a in argv if a != "--bench"]
    kind, sweep_path, runs, path = "octave", None, 5, None
    i = 0
    while i < len(args):
        if args[i] == "--bands":
            kind = args[i + 1]
            i += 2
        elif args[i] == "--reference":
            sweep_path = args[i + 1]
            i += 2
        elif args[i] == "--runs":
            runs = int(args[i + 1])
            i += 2
        else:
            path = args[i]
            i += 1
    fs, x = read(path)
    sweep = read(sweep_path)[1] if sweep_path else None
    if not bench:
        json.dump(analyse(x, fs, kind, sweep), sys.stdout, default=float)
        return
    times = []
    for _ in range(runs + 1):
        started = time.process_time()
        analyse(x, fs, kind, sweep)
        times.append(1000 * (time.process_time() - started))
    bounds = []
    for _ in range(3):
        started = time.process_time()
        lower_bound(x, fs)
        bounds.append(1000 * (time.process_time() - started))
    json.dump({"coldMs": times[0], "warmMs": float(np.median(times[1:])), "lowerBoundMs": float(np.median(bounds))}, sys.stdout)


main(sys.argv[1:])
