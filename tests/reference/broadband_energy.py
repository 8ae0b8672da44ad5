"""Independent broadband C50, C80 and INR of a WAV impulse response, with scipy only.

stdin: JSON {"path", "lowHz", "highHz", "order"}
  lowHz/highHz: per-pass edges of the band-pass over the span of the analysis bands, applied
  forward-backward (sosfiltfilt) after prepending silence, as the engine does.
  Start point: the first sample within 20 dB of the squared maximum (ISO 3382-1:2009, A.3.4).
  Noise: mean square of the last 10 % of the record. Late decay: a least-squares line
  (scipy.stats.linregress) through 10 ms block levels from 25 dB to 10 dB above the noise; its
  crossing with the noise is the truncation point t_c (the idea of Lundeby et al., Acustica 81,
  1995, in one pass instead of their iteration). Beyond t_c the decay goes on as the line's
  exponential, of energy N/k.
  INR = 10 lg(E(0) / E(t_c)) (Huszty & Sakamoto, Acoust. Sci. & Tech. 33(2):117, 2012);
  C50, C80 from ISO 3382-1:2009 Annex A with the same truncation and tail.
stdout: JSON {"inrDb", "c50Db", "c80Db", "noiseDbRePeak", "crosspointS"}
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
elif data.dtype == np.int32:
    x = data.astype(np.float64) / 2147483648.0
else:
    x = data.astype(np.float64)
if x.ndim > 1:
    x = x[:, 0]
PRE_SILENCE = 16384
sos = signal.butter(request["order"], [request["lowHz"], request["highHz"]], btype="band", fs=fs, output="sos")
y = signal.sosfiltfilt(sos, np.concatenate([np.zeros(PRE_SILENCE), x]))
raw_start = int(np.argmax(x ** 2 >= np.max(x ** 2) / 100.0))
p = y ** 2
# Energy from the filter's pre-ringing before the start point counts as early energy.
pre = p[:PRE_SILENCE + raw_start].sum()
p = p[PRE_SILENCE + raw_start:]

noise = p[int(0.9 * len(p)):].mean()
noise_db = 10 * np.log10(noise)
block = int(round(0.01 * fs))
count = len(p) // block
levels = 10 * np.log10(p[:count * block].reshape(count, block).mean(axis=1))
times = (np.arange(count) + 0.5) * block / fs
peak_block = int(np.argmax(levels))
first = peak_block + int(np.argmax(levels[peak_block:] <= noise_db + 25))
last = first + int(np.argmax(levels[first:] <= noise_db + 10))
fit = stats.linregress(times[first:last], levels[first:last])
crosspoint_s = (noise_db - fit.intercept) / fit.slope
k = -fit.slope * np.log(10) / 10
end = min(len(p), int(round(crosspoint_s * fs)))
tail = noise * fs / k
total = pre + p[:end].sum() + tail


def early(seconds):
    return pre + p[:int(round(seconds * fs))].sum()


json.dump(
    {
        "inrDb": 10 * np.log10(total / tail),
        "c50Db": 10 * np.log10(early(0.05) / (total - early(0.05))),
        "c80Db": 10 * np.log10(early(0.08) / (total - early(0.08))),
        "noiseDbRePeak": noise_db - 10 * np.log10(np.max(p)),
        "crosspointS": crosspoint_s,
    },
    sys.stdout,
)
