/**
 * Jenks natural breaks: the optimal split of sorted 1-D values into k contiguous groups
 * with the least total within-group sum of squared deviations (Jenks 1977; the dynamic
 * programme of Wang & Song 2011, "Ckmeans.1d.dp"). Written here for the few values of a
 * team (≤ 10 outfield players), where the O(k·n²) programme with prefix sums is tiny;
 * checked against simple-statistics' ckmeans in tests/unit/geometry/lines.test.ts.
 * simple-statistics is only a devDependency; its ckmeans is about 4× faster here
 * (1.5 vs 6.4 µs per team and frame, bench/geometry.bench.ts), which does not matter at
 * two calls a frame — if it ever moves to dependencies, use it instead.
 */

/**
 * Groups of the values (each sorted ascending), k of them or fewer when there are fewer
 * distinct values. `jenksGroups([1, 2, 10, 11, 30], 3) -> [[1, 2], [10, 11], [30]]`
 */
export function jenksGroups(values: readonly number[], k: number): number[][] {
  const x = values.filter(Number.isFinite).slice().sort((a, b) => a - b);
  const n = x.length;
  if (n === 0) return [];
  const distinct = new Set(x).size;
  const K = Math.max(1, Math.min(k, distinct));
  const s1 = new Float64Array(n + 1);
  const s2 = new Float64Array(n + 1);
  for (let i = 0; i < n; i++) {
    s1[i + 1] = s1[i] + x[i];
    s2[i + 1] = s2[i] + x[i] * x[i];
  }
  // Sum of squared deviations of x[i..j] (inclusive).
  const ssd = (i: number, j: number) => {
    const m = j - i + 1;
    const s = s1[j + 1] - s1[i];
    return Math.max(0, s2[j + 1] - s2[i] - (s * s) / m);
  };
  // cost[g][j]: best cost of x[0..j] in g + 1 groups; start[g][j]: first index of the last group.
  const cost = Array.from({ length: K }, () => new Float64Array(n).fill(Infinity));
  const start = Array.from({ length: K }, () => new Int32Array(n));
  for (let j = 0; j < n; j++) cost[0][j] = ssd(0, j);
  for (let g = 1; g < K; g++) {
    for (let j = g; j < n; j++) {
      for (let i = g; i <= j; i++) {
        const c = cost[g - 1][i - 1] + ssd(i, j);
        if (c < cost[g][j]) {
          cost[g][j] = c;
          start[g][j] = i;
        }
      }
    }
  }
  const groups: number[][] = [];
  let end = n - 1;
  for (let g = K - 1; g >= 0; g--) {
    const i = g === 0 ? 0 : start[g][end];
    groups.unshift(x.slice(i, end + 1));
    end = i - 1;
  }
  return groups;
}
