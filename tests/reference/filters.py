"""Reference Butterworth band-pass designs from scipy.signal.butter, for the band-filter tests.

stdin: JSON {"designs": [{"order": N, "lowHz": f1, "highHz": f2, "sampleRate": fs}, ...]}
stdout: JSON {"sos": [[[b0, b1, b2, a0, a1, a2], ...], ...]}
"""
import json
import sys

from scipy import signal

request = json.load(sys.stdin)
result = []
for design in request["designs"]:
    sos = signal.butter(
        design["order"],
        [design["lowHz"], design["highHz"]],
        btype="band",
        fs=design["sampleRate"],
        output="sos",
    )
    result.append(sos.tolist())
json.dump({"sos": result}, sys.stdout)
