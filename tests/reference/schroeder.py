"""Independent T30 of one band of a WAV impulse response, with scipy only.

stdin: JSON {"path", "lowHz", "highHz", "order", "startIndex", "endIndex", "tailEnergy"}
  lowHz/highHz are the per-pass edges, filtered forward-backward with sosfiltfilt after
  prepending silence (the engine, too, takes the time before the file as silent);
  the Schroeder integral runs from startIndex to endIndex (the truncation point) plus the given
  tail energy (in squared-sample units, the same compensation as the engine);
  T30 from scipy.stats.linregress over the -5...-35 dB part of the curve.
stdout: JSON {"t30S", "r"}
"""
import json
import sys

import numpy as np
from scipy import signal, stats
from scipy.io import wavfile

request = json.load(sys.stdin)
fs, data = wavfile.read(request["path"])
if data.dtype == np.int16:
    x = data.astype(np.float64) / 32768.0
else:
    x = data.astype(np.float64)
if x.ndim > 1:
    x = x[:, 0]
PRE_SILENCE = 8192
x = np.concatenate([np.zeros(PRE_SILENCE), x])
sos = signal.butter(request["order"], [request["lowHz"], request["highHz"]], btype="band", fs=fs, output="sos")
y = signal.sosfiltfilt(sos, x)
start = PRE_SILENCE + request["startIndex"]
squared = y[start:start + request["endIndex"]] ** 2
energy = np.cumsum(squared[::-1])[::-1] + request["tailEnergy"]
level = 10 * np.log10(energy / energy[0])
first = np.argmax(level <= -5)
last = np.argmax(level <= -35)
t = np.arange(len(level)) / fs
fit = stats.linregress(t[first:last + 1], level[first:last + 1])
json.dump({"t30S": -60 / fit.slope, "r": fit.rvalue}, sys.stdout)
