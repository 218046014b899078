/** pairHash values lie in [0, PAIR_HASH_RANGE). */
export const PAIR_HASH_RANGE = 2 ** 30;

/**
 * A uniform whole number in [0, 2^30) fixed by a pair of ids and a salt (a
 * murmur3-style finalizer over the mixed words). The generator uses it for
 * facts about a viewer and an author that must agree on every row of that
 * pair: whether they are plot neighbours, whether the viewer follows the
 * author. 30 bits keep the result a small integer in V8, never a boxed double.
 *
 * @example
 * pairHash(12, 345, 7) < 0.22 * PAIR_HASH_RANGE; // true for about 22 % of pairs
 */
export function pairHash(a: number, b: number, salt: number): number {
  let h = Math.imul(a ^ 0x27d4eb2d, 0x9e3779b1) ^ Math.imul(b + 0x165667b1, 0x85ebca77) ^ salt;
  h = Math.imul(h ^ (h >>> 16), 0x85ebca6b);
  h = Math.imul(h ^ (h >>> 13), 0xc2b2ae35);
  h ^= h >>> 16;
  return h >>> 2;
}
