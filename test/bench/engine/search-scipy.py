"""SciPy side of search.bench.ts: top-k Canberra search with cdist + argpartition.

Called by the benchmark as: python3 search-scipy.py <data.f64> <count> <width> <k> <repeats>
The file holds count rows of width float64 values (real parts, then imaginary) followed by one
query row. Prints one JSON object: median and fastest time in ms and the top-k row indices, nearest first.
"""
import json
import sys
import time

import numpy as np
import scipy
from scipy.spatial.distance import cdist

path, count, width, k, repeats = sys.argv[1], int(sys.argv[2]), int(sys.argv[3]), int(sys.argv[4]), int(sys.argv[5])
data = np.fromfile(path, dtype="<f8")
library = data[: count * width].reshape(count, width)
query = data[count * width : (count + 1) * width].reshape(1, width)


def search():
    d = cdist(query, library, metric="canberra")[0]
    top = np.argpartition(d, k)[:k]
    return top[np.lexsort((top, d[top]))], d


search()  # warm-up, as the TypeScript side gets one
times = []
for _ in range(repeats):
    t0 = time.perf_counter()
    top, d = search()
    times.append((time.perf_counter() - t0) * 1000)
print(json.dumps({
    "medianMs": float(np.median(times)),
    "fastestMs": float(np.min(times)),
    "top": top.tolist(),
    "distances": (d[top] / width).tolist(),
    "versions": f"scipy {scipy.__version__}, numpy {np.__version__}",
}))
