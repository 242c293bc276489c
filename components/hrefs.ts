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

export function alarmsHref(shopId: string): string {
  return `${shopHref(shopId)}/alarms`;
}

/** A shop's week report; with `week` (its Monday, YYYY-MM-DD) that week, else the last one. */
export function reportHref(shopId: string, week?: string): string {
  const path = `${shopHref(shopId)}/report`;
  return week ? `${path}?week=${encodeURIComponent(week)}` : path;
}

/** The pages reached from a shop's navigation. */
export type ShopSection = 'zones' | 'alarms' | 'report' | 'sensors' | 'shop' | 'profile';

export function shopSectionHref(shopId: string, section: ShopSection): string {
  switch (section) {
    case 'zones':
      return shopHref(shopId);
    case 'alarms':
      return alarmsHref(shopId);
    case 'report':
      return reportHref(shopId);
    case 'sensors':
      return `${shopHref(shopId)}/sensors`;
    case 'shop':
      return `${shopHref(shopId)}/settings`;
    case 'profile':
      return `${shopHref(shopId)}/profile`;
  }
}

export function membersHref(shopId: string): string {
  return `${shopHref(shopId)}/members`;
}

export function trialsHref(shopId: string): string {
  return `${shopHref(shopId)}/trials`;
}

export function trialHref(shopId: string, trialId: string): string {
  return `${trialsHref(shopId)}/${encodeURIComponent(trialId)}`;
}

/** A shop's care page: its surfaces, their exposure since the last coat, the coating budgets. */
export function careHref(shopId: string): string {
  return `${shopHref(shopId)}/care`;
}

export function surfaceHref(shopId: string, surfaceId: string): string {
  return `${careHref(shopId)}/${encodeURIComponent(surfaceId)}`;
}

export function sensorsHref(shopId: string): string {
  return shopSectionHref(shopId, 'sensors');
}

/** One sensor's page: what the list knows of it, and its imports of logger files. */
export function sensorHref(shopId: string, sensorId: string): string {
  return `${sensorsHref(shopId)}/${encodeURIComponent(sensorId)}`;
}
