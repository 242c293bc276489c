// The live hub finds a message's sockets through the shop index (server/live/shopIndex.ts)
// instead of walking every socket and asking each for its shops. The reference is that walk
// itself, the hub's rule before the index: after any sequence of joins, shop changes and
// closes, the index must name exactly the clients whose current shops include the shop, in the
// order they started to watch it, and keep no entry for a shop nobody watches.
import { describe, expect, it } from 'vitest';

import { createShopIndex } from '@/server/live/shopIndex';

interface Client {
  name: string;
  shopIds: Set<string>;
}

/** The walk the hub did before: every open client, filtered by its own shops. */
const walk = (open: Client[], shopId: string) =>
  open.filter((c) => c.shopIds.has(shopId)).map((c) => c.name);

describe('the shop index', () => {
  it('names the clients of a shop, follows shop changes and forgets closed clients', () => {
    const index = createShopIndex<Client>();
    const a = { name: 'a', shopIds: new Set(['s1', 's2']) };
    const b = { name: 'b', shopIds: new Set(['s2']) };
    index.set(a, a.shopIds);
    index.set(b, b.shopIds);
    expect([...(index.watching('s2') ?? [])].map((c) => c.name)).toEqual(['a', 'b']);
    expect([...(index.watching('s1') ?? [])].map((c) => c.name)).toEqual(['a']);
    expect(index.watching('s3')).toBeUndefined();

    // A member removed from s1 (the hub's re-check) stops hearing it at once.
    index.set(a, new Set(['s2']));
    expect(index.watching('s1')).toBeUndefined();
    // A session ended: no shops.
    index.set(b, new Set());
    expect([...(index.watching('s2') ?? [])].map((c) => c.name)).toEqual(['a']);
    index.remove(a);
    expect(index.watching('s2')).toBeUndefined();
  });

  it('keeps its own copy of the shops it was given', () => {
    const index = createShopIndex<Client>();
    const shops = new Set(['s1']);
    const a = { name: 'a', shopIds: shops };
    index.set(a, shops);
    shops.add('s2');
    shops.delete('s1');
    // Untold changes do not half-apply; the next set() replaces them all (and removes s1).
    expect(index.watching('s2')).toBeUndefined();
    index.set(a, shops);
    expect(index.watching('s1')).toBeUndefined();
    expect([...(index.watching('s2') ?? [])].map((c) => c.name)).toEqual(['a']);
  });

  it('agrees with the walk over every client after 5,000 random joins, changes and closes', () => {
    // A fixed linear congruential generator (Numerical Recipes' constants), so a failure repeats.
    let seed = 20261203;
    const random = (n: number) => {
      seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0;
      return seed % n;
    };
    const shops = ['s0', 's1', 's2', 's3', 's4', 's5'];
    const someShops = () => new Set(shops.filter(() => random(3) === 0));
    const index = createShopIndex<Client>();
    const open: Client[] = [];
    let joined = 0;
    for (let step = 0; step < 5000; step++) {
      const op = random(3);
      if (op === 0 || open.length === 0) {
        const c = { name: `c${joined++}`, shopIds: someShops() };
        open.push(c);
        index.set(c, c.shopIds);
      } else if (op === 1) {
        const c = open[random(open.length)]!;
        c.shopIds = someShops();
        index.set(c, c.shopIds);
      } else {
        const [c] = open.splice(random(open.length), 1);
        index.remove(c!);
      }
      const shopId = shops[random(shops.length)]!;
      const indexed = [...(index.watching(shopId) ?? [])].map((c) => c.name);
      // Order within a shop: the index keeps the order clients joined that shop, the walk the
      // order they opened; the hub needs only the same clients, each once.
      expect(indexed.sort()).toEqual(walk(open, shopId).sort());
    }
    // Nothing left behind for shops nobody watches any more.
    for (const c of [...open]) index.remove(c);
    for (const shopId of shops) expect(index.watching(shopId)).toBeUndefined();
  });
});
