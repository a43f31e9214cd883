"""Student-t quantiles for the band rule's check (tests/bands.rs): scipy.stats.t.ppf at the
levels the bands use and at whole and fractional degrees of freedom.

Run: python3 scripts/t_quantile_reference.py > tests/fixtures/refs/t_quantiles.json
"""
import json

import numpy
import scipy
from scipy.stats import t

levels = [0.75, 0.9, 0.95, 0.975, 0.995, 0.9995]
dfs = [1, 1.5, 2, 2.5, 3, 5, 7.2, 10, 30, 100, 1000]
print(json.dumps({
    "generated_by": "scripts/t_quantile_reference.py",
    "versions": {"scipy": scipy.__version__, "numpy": numpy.__version__},
    "t_ppf": [{"p": p, "df": df, "q": float(t.ppf(p, df))} for p in levels for df in dfs],
}, indent=1))
