"""Times scikit-learn's DecisionTreeClassifier on the benchmark's tables (called by bench/engine.ts).

Reads column-major float32 matrices (one-hot encoded, as a DataFrame would hand them over) and
0/1 labels written by the benchmark, fits `repeats` times and prints JSON: the first fit's
seconds, the median seconds and the holdout ROC AUC.
"""
import json
import statistics
import sys
import time

import numpy as np
from sklearn.metrics import roc_auc_score
from sklearn.tree import DecisionTreeClassifier

spec = json.loads(sys.argv[1])
p, n_train, n_test = spec["columns"], spec["train"], spec["test"]
# stored column after column: reshape (p, n) and transpose gives a column-major (Fortran) view
X_train = np.fromfile(spec["xTrain"], dtype=np.float32).reshape(p, n_train).T
X_test = np.fromfile(spec["xTest"], dtype=np.float32).reshape(p, n_test).T
y_train = np.fromfile(spec["yTrain"], dtype=np.uint8)
y_test = np.fromfile(spec["yTest"], dtype=np.uint8)

times = []
clf = None
for _ in range(spec["repeats"]):
    clf = DecisionTreeClassifier(criterion="gini", max_depth=spec["maxDepth"], min_samples_leaf=spec["minLeaf"], random_state=0)
    start = time.perf_counter()
    clf.fit(X_train, y_train)
    times.append(time.perf_counter() - start)
auc = roc_auc_score(y_test, clf.predict_proba(X_test)[:, 1])
print(json.dumps({"first": times[0], "median": statistics.median(times), "auc": auc, "version": __import__("sklearn").__version__}))
