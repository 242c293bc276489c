/**
 * Which open sockets watch which shop. Every instance hears every shop's messages (each
 * request's reading message, through its own writer or the NOTIFY of another instance), and
 * most of them are for shops with no socket here: finding a message's sockets by its shop
 * costs one look-up, where a walk over every socket costs one per socket per message (under
 * `npm run bench`'s loaded phase, 1,000 messages a second × 200 sockets, 1.3 % of the server's
 * thread in the profile, all for messages nobody here watched).
 */
export interface ShopIndex<C> {
  /** Replaces the shops `client` watches (an empty set: none). */
  set(client: C, shopIds: ReadonlySet<string>): void;
  remove(client: C): void;
  /** The clients watching `shopId`, in the order they started to; undefined when none. */
  watching(shopId: string): ReadonlySet<C> | undefined;
}

export function createShopIndex<C>(): ShopIndex<C> {
  const byShop = new Map<string, Set<C>>();
  const shopsOf = new Map<C, ReadonlySet<string>>();

  function remove(client: C) {
    for (const shopId of shopsOf.get(client) ?? []) {
      const watchers = byShop.get(shopId);
      if (!watchers) continue;
      watchers.delete(client);
      // Shops come and go with sockets: an empty entry would be kept for ever.
      if (watchers.size === 0) byShop.delete(shopId);
    }
    shopsOf.delete(client);
  }

  return {
    set(client, shopIds) {
      remove(client);
      // A copy: the caller may change its set later without telling the index.
      shopsOf.set(client, new Set(shopIds));
      for (const shopId of shopIds) {
        const watchers = byShop.get(shopId);
        if (watchers) watchers.add(client);
        else byShop.set(shopId, new Set([client]));
      }
    },
    remove,
    watching: (shopId) => byShop.get(shopId),
  };
}
