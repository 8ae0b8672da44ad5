"""Reference Student-t quantiles for tests/unit/results/spread.test.ts.

stdin: JSON {"queries": [{"p": 0.975, "df": 5}, ...]}
stdout: JSON {"t": [scipy.stats.t.ppf(p, df), ...]}
"""
import json
import sys

from scipy import stats

request = json.load(sys.stdin)
json.dump({"t": [float(stats.t.ppf(q["p"], q["df"])) for q in request["queries"]]}, sys.stdout)
