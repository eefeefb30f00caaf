/** Seeded, stratified assignment of rows to folds and to a holdout. */

/** mulberry32: a small seeded generator, uniform on [0, 1) (common practice). */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function shuffle(values: number[], random: () => number): number[] {
  for (let i = values.length - 1; i > 0; i--) {
    const j = Math.floor(random() * (i + 1));
    [values[i], values[j]] = [values[j], values[i]];
  }
  return values;
}

/**
 * Fold number (0..folds-1) for each entry of `rows`: each class is shuffled and dealt round the
 * folds, so every fold has nearly the same share of leavers.
 */
export function stratifiedFolds(
  label: ArrayLike<number>,
  rows: ArrayLike<number>,
  folds: number,
  random: () => number,
): Int32Array {
  const assignment = new Int32Array(rows.length);
  let next = 0;
  for (const cls of [1, 0]) {
    const members: number[] = [];
    for (let i = 0; i < rows.length; i++) if ((label[rows[i]] ? 1 : 0) === cls) members.push(i);
    for (const i of shuffle(members, random)) assignment[i] = next++ % folds;
  }
  return assignment;
}

/** Rows split into training and holdout parts with the holdout's share taken from each class. */
export function stratifiedHoldout(
  label: ArrayLike<number>,
  share: number,
  random: () => number,
): { train: Int32Array; test: Int32Array } {
  const train: number[] = [];
  const test: number[] = [];
  for (const cls of [1, 0]) {
    const members: number[] = [];
    for (let i = 0; i < label.length; i++) if ((label[i] ? 1 : 0) === cls) members.push(i);
    shuffle(members, random);
    const cut = Math.round(members.length * share);
    for (let i = 0; i < members.length; i++) (i < cut ? test : train).push(members[i]);
  }
  return {
    train: Int32Array.from(train).sort(),
    test: Int32Array.from(test).sort(),
  };
}
