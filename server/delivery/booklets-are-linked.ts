/**
 * Whether a set of booklets links every item to every other through shared items: the bipartite
 * graph of items and booklets (an edge when a booklet holds an item) is connected. Only then can
 * one Rasch calibration place all items on one scale (common practice, no source).
 *
 * @param booklets - each booklet's item ids
 * @returns true when all items and booklets form one connected component
 * @example bookletsAreLinked([['a', 'b'], ['b', 'c']]) // true
 * @example bookletsAreLinked([['a', 'b'], ['c', 'd']]) // false
 */
export function bookletsAreLinked(booklets: readonly (readonly string[])[]): boolean {
  const parent = new Map<string, string>();
  const find = (x: string): string => {
    let root = x;
    while (parent.get(root) !== root) root = parent.get(root)!;
    let node = x;
    while (node !== root) {
      const next = parent.get(node)!;
      parent.set(node, root);
      node = next;
    }
    return root;
  };
  const union = (a: string, b: string) => parent.set(find(a), find(b));
  booklets.forEach((booklet, index) => {
    const node = `booklet:${index}`;
    parent.set(node, node);
    for (const id of booklet) {
      const item = `item:${id}`;
      if (!parent.has(item)) parent.set(item, item);
      union(item, node);
    }
  });
  const roots = new Set([...parent.keys()].map(find));
  return roots.size <= 1;
}
