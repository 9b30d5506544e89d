/**
 * Builds the booklets of a rotated form: a linked (anchored) booklet design in which the item pool is
 * cut into blocks and booklet k holds block k followed by block k + 1 (cyclically). Every block
 * therefore appears in exactly two booklets, once in the first half and once in the second (which
 * balances position effects), and neighbouring booklets share a whole block of linking items. The
 * booklets form a ring, so the item–booklet design is connected and a Rasch calibration puts every
 * item on one scale even though no respondent sees them all.
 *
 * @see Frey, Hartig and Rupp (2009), "An NCME instructional module on booklet designs in large-scale
 *   assessments of student achievement", Educational Measurement: Issues and Practice 28(3), 39–53
 *   (block-based booklet designs and their linking; from memory).
 * @see Kolen and Brennan (2014), Test Equating, Scaling, and Linking, 3rd ed., ch. 1: the common-item
 *   (anchor) design (from memory).
 *
 * A common block (`common`, e.g. items a fairness check must compare across groups) opens every
 * booklet; the rest of the pool rotates as above in the remaining itemsPerBooklet − common places.
 *
 * @param itemIds - the pool, in the order blocks are cut from it
 * @param itemsPerBooklet - the study's maxItems; a booklet holds 2 · ⌊itemsPerBooklet / 2⌋ items
 *   (fewer when the last block is short)
 * @param common - pool items every booklet holds first (default none)
 * @returns the booklets, each an ordered list of item ids; one booklet with the whole pool when it fits
 * @throws when itemsPerBooklet < 1 or an id repeats, or a common item is not in the pool or leaves
 *   fewer than 2 places to rotate
 * @example
 * buildBooklets(['a', 'b', 'c', 'd', 'e', 'f'], 4)
 * // [['a','b','c','d'], ['c','d','e','f'], ['e','f','a','b']]
 * buildBooklets(['a', 'b', 'c', 'd', 'e', 'f'], 3, ['a'])
 * // [['a','b','c'], ['a','c','d'], ['a','d','e'], ['a','e','f'], ['a','f','b']]
 */
export function buildBooklets(
  itemIds: readonly string[],
  itemsPerBooklet: number,
  common: readonly string[] = [],
): string[][] {
  if (!Number.isInteger(itemsPerBooklet) || itemsPerBooklet < 1) {
    throw new Error('buildBooklets requires itemsPerBooklet to be a whole number of at least 1');
  }
  if (new Set(itemIds).size !== itemIds.length) throw new Error('buildBooklets requires unique item ids');
  if (common.length > 0) {
    const shared = new Set(common);
    if (shared.size !== common.length || common.some((id) => !itemIds.includes(id)))
      throw new Error('buildBooklets requires common items to be distinct items of the pool');
    const rest = itemIds.filter((id) => !shared.has(id));
    if (rest.length === 0) return [[...common]];
    if (itemsPerBooklet - common.length < 2 && rest.length > itemsPerBooklet - common.length)
      throw new Error(
        'buildBooklets requires at least 2 places left for rotated items beside the common ones',
      );
    return buildBooklets(rest, itemsPerBooklet - common.length).map((booklet) => [...common, ...booklet]);
  }
  if (itemIds.length <= itemsPerBooklet) return [[...itemIds]];
  const blockSize = Math.floor(itemsPerBooklet / 2);
  if (blockSize === 0)
    throw new Error('buildBooklets requires at least 2 items per booklet to link booklets');
  const blocks: string[][] = [];
  for (let start = 0; start < itemIds.length; start += blockSize) {
    blocks.push(itemIds.slice(start, start + blockSize));
  }
  // itemIds.length > 2 · blockSize, so there are at least 3 blocks and booklets are distinct.
  return blocks.map((block, k) => [...block, ...blocks[(k + 1) % blocks.length]!]);
}

/**
 * Which booklet the n-th attempt of a study takes: booklets in turn (n mod count), so booklet use
 * stays balanced within one booklet.
 * @example bookletForAttempt(7, 3) // 1
 */
export function bookletForAttempt(attemptNumber: number, bookletCount: number): number {
  if (bookletCount < 1) throw new Error('bookletForAttempt requires at least one booklet');
  return ((attemptNumber % bookletCount) + bookletCount) % bookletCount;
}
