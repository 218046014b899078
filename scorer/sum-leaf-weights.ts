/**
 * The heads kernel over reached leaves: for each row i, z[i * lanes + h] = the sum
 * over trees t of weight[slots[i * treeCount + t] * lanes + h]. The lanes of a
 * leaf's weights are summed in registers, with one loop per lane count (2, 4, 6,
 * 8; beyond that groups of 8), so each leaf's weights are read once for all heads.
 * Trees are taken `group` at a time over all rows, so that the group's weights
 * stay in cache (a big forest's table does not); the sum runs in tree order
 * either way.
 *
 * @example
 * sumLeafWeights(slots, 100, rows, heads.leafWeight, heads.lanes, 32, z);
 */
export function sumLeafWeights(
  slots: Int32Array,
  treeCount: number,
  count: number,
  weight: Float64Array,
  lanes: number,
  group: number,
  z: Float64Array,
): void {
  if (lanes === 2) sumLanes2(slots, treeCount, count, weight, group, z);
  else if (lanes === 4) sumLanes4(slots, treeCount, count, weight, group, z);
  else if (lanes === 6) sumLanes6(slots, treeCount, count, weight, group, z);
  else sumLanes8(slots, treeCount, count, weight, lanes, group, z);
}

function sumLanes2(
  slots: Int32Array,
  treeCount: number,
  count: number,
  weight: Float64Array,
  group: number,
  z: Float64Array,
): void {
  z.fill(0, 0, count * 2);
  for (let from = 0; from < treeCount; from += group) {
    const to = Math.min(treeCount, from + group);
    for (let i = 0; i < count; i++) {
      const o = i * treeCount;
      const zo = i * 2;
      let z0 = z[zo + 0];
      let z1 = z[zo + 1];
      for (let t = o + from; t < o + to; t++) {
        const g = slots[t] * 2;
        z0 += weight[g];
        z1 += weight[g + 1];
      }
      z[zo] = z0;
      z[zo + 1] = z1;
    }
  }
}

function sumLanes4(
  slots: Int32Array,
  treeCount: number,
  count: number,
  weight: Float64Array,
  group: number,
  z: Float64Array,
): void {
  z.fill(0, 0, count * 4);
  for (let from = 0; from < treeCount; from += group) {
    const to = Math.min(treeCount, from + group);
    for (let i = 0; i < count; i++) {
      const o = i * treeCount;
      const zo = i * 4;
      let z0 = z[zo + 0];
      let z1 = z[zo + 1];
      let z2 = z[zo + 2];
      let z3 = z[zo + 3];
      for (let t = o + from; t < o + to; t++) {
        const g = slots[t] * 4;
        z0 += weight[g];
        z1 += weight[g + 1];
        z2 += weight[g + 2];
        z3 += weight[g + 3];
      }
      z[zo] = z0;
      z[zo + 1] = z1;
      z[zo + 2] = z2;
      z[zo + 3] = z3;
    }
  }
}

function sumLanes6(
  slots: Int32Array,
  treeCount: number,
  count: number,
  weight: Float64Array,
  group: number,
  z: Float64Array,
): void {
  z.fill(0, 0, count * 6);
  for (let from = 0; from < treeCount; from += group) {
    const to = Math.min(treeCount, from + group);
    for (let i = 0; i < count; i++) {
      const o = i * treeCount;
      const zo = i * 6;
      let z0 = z[zo + 0];
      let z1 = z[zo + 1];
      let z2 = z[zo + 2];
      let z3 = z[zo + 3];
      let z4 = z[zo + 4];
      let z5 = z[zo + 5];
      for (let t = o + from; t < o + to; t++) {
        const g = slots[t] * 6;
        z0 += weight[g];
        z1 += weight[g + 1];
        z2 += weight[g + 2];
        z3 += weight[g + 3];
        z4 += weight[g + 4];
        z5 += weight[g + 5];
      }
      z[zo] = z0;
      z[zo + 1] = z1;
      z[zo + 2] = z2;
      z[zo + 3] = z3;
      z[zo + 4] = z4;
      z[zo + 5] = z5;
    }
  }
}

/** Eight lanes at a time; `lanes` is a multiple of 8. */
function sumLanes8(
  slots: Int32Array,
  treeCount: number,
  count: number,
  weight: Float64Array,
  lanes: number,
  group: number,
  z: Float64Array,
): void {
  z.fill(0, 0, count * lanes);
  for (let from = 0; from < treeCount; from += group) {
    const to = Math.min(treeCount, from + group);
    for (let i = 0; i < count; i++) {
      const o = i * treeCount;
      for (let h = 0; h < lanes; h += 8) {
        const zo = i * lanes + h;
        let z0 = z[zo];
        let z1 = z[zo + 1];
        let z2 = z[zo + 2];
        let z3 = z[zo + 3];
        let z4 = z[zo + 4];
        let z5 = z[zo + 5];
        let z6 = z[zo + 6];
        let z7 = z[zo + 7];
        for (let t = o + from; t < o + to; t++) {
          const g = slots[t] * lanes + h;
          z0 += weight[g];
          z1 += weight[g + 1];
          z2 += weight[g + 2];
          z3 += weight[g + 3];
          z4 += weight[g + 4];
          z5 += weight[g + 5];
          z6 += weight[g + 6];
          z7 += weight[g + 7];
        }
        z[zo] = z0;
        z[zo + 1] = z1;
        z[zo + 2] = z2;
        z[zo + 3] = z3;
        z[zo + 4] = z4;
        z[zo + 5] = z5;
        z[zo + 6] = z6;
        z[zo + 7] = z7;
      }
    }
  }
}
