/**
 * The heads kernel over reached leaves: for each row i, z[i * lanes + h] = the sum
 * over trees t of weight[slots[i * treeCount + t] * lanes + h]. The lanes of a
 * leaf's weights are summed in registers, with one loop per lane count (2, 4, 6,
 * 8; beyond that groups of 8), so each leaf's weights are read once for all heads.
 *
 * @example
 * sumLeafWeights(slots, 100, rows, heads.leafWeight, heads.lanes, z);
 */
export function sumLeafWeights(
  slots: Int32Array,
  treeCount: number,
  count: number,
  weight: Float64Array,
  lanes: number,
  z: Float64Array,
): void {
  if (lanes === 2) sumLanes2(slots, treeCount, count, weight, z);
  else if (lanes === 4) sumLanes4(slots, treeCount, count, weight, z);
  else if (lanes === 6) sumLanes6(slots, treeCount, count, weight, z);
  else sumLanes8(slots, treeCount, count, weight, lanes, z);
}

function sumLanes2(
  slots: Int32Array,
  treeCount: number,
  count: number,
  weight: Float64Array,
  z: Float64Array,
): void {
  for (let i = 0; i < count; i++) {
    const o = i * treeCount;
    let z0 = 0;
    let z1 = 0;
    for (let t = 0; t < treeCount; t++) {
      const g = slots[o + t] * 2;
      z0 += weight[g];
      z1 += weight[g + 1];
    }
    z[i * 2] = z0;
    z[i * 2 + 1] = z1;
  }
}

function sumLanes4(
  slots: Int32Array,
  treeCount: number,
  count: number,
  weight: Float64Array,
  z: Float64Array,
): void {
  for (let i = 0; i < count; i++) {
    const o = i * treeCount;
    let z0 = 0;
    let z1 = 0;
    let z2 = 0;
    let z3 = 0;
    for (let t = 0; t < treeCount; t++) {
      const g = slots[o + t] * 4;
      z0 += weight[g];
      z1 += weight[g + 1];
      z2 += weight[g + 2];
      z3 += weight[g + 3];
    }
    const zo = i * 4;
    z[zo] = z0;
    z[zo + 1] = z1;
    z[zo + 2] = z2;
    z[zo + 3] = z3;
  }
}

function sumLanes6(
  slots: Int32Array,
  treeCount: number,
  count: number,
  weight: Float64Array,
  z: Float64Array,
): void {
  for (let i = 0; i < count; i++) {
    const o = i * treeCount;
    let z0 = 0;
    let z1 = 0;
    let z2 = 0;
    let z3 = 0;
    let z4 = 0;
    let z5 = 0;
    for (let t = 0; t < treeCount; t++) {
      const g = slots[o + t] * 6;
      z0 += weight[g];
      z1 += weight[g + 1];
      z2 += weight[g + 2];
      z3 += weight[g + 3];
      z4 += weight[g + 4];
      z5 += weight[g + 5];
    }
    const zo = i * 6;
    z[zo] = z0;
    z[zo + 1] = z1;
    z[zo + 2] = z2;
    z[zo + 3] = z3;
    z[zo + 4] = z4;
    z[zo + 5] = z5;
  }
}

/** Eight lanes at a time; `lanes` is a multiple of 8. */
function sumLanes8(
  slots: Int32Array,
  treeCount: number,
  count: number,
  weight: Float64Array,
  lanes: number,
  z: Float64Array,
): void {
  for (let i = 0; i < count; i++) {
    const o = i * treeCount;
    for (let h = 0; h < lanes; h += 8) {
      let z0 = 0;
      let z1 = 0;
      let z2 = 0;
      let z3 = 0;
      let z4 = 0;
      let z5 = 0;
      let z6 = 0;
      let z7 = 0;
      for (let t = 0; t < treeCount; t++) {
        const g = slots[o + t] * lanes + h;
        z0 += weight[g];
        z1 += weight[g + 1];
        z2 += weight[g + 2];
        z3 += weight[g + 3];
        z4 += weight[g + 4];
        z5 += weight[g + 5];
        z6 += weight[g + 6];
        z7 += weight[g + 7];
      }
      const zo = i * lanes + h;
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
