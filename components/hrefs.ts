/** Paths of the app's pages, built in one place so routes and links agree. */
export function shopHref(shopId: string): string {
  return `/shops/${encodeURIComponent(shopId)}`;
}

export function zoneHref(shopId: string, zoneId: string): string {
  return `${shopHref(shopId)}/zones/${encodeURIComponent(zoneId)}`;
}

/** Where a signed-in person lands: their first shop, or the front door when they have none. */
export function homeHrefFor(shops: { id: string }[]): string {
  const first = shops[0];
  return first ? shopHref(first.id) : '/';
}
