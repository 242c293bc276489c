/**
 * The demo scenario: an invented shop, Tamarack Street Joinery, run by invented people, with a
 * machine room, a lumber rack and a finishing room. Seeded once into an empty database; the
 * demo sensors' tokens are re-issued on every run (only hashes are stored, so the simulator
 * needs fresh plain tokens).
 */
import { eq, sql } from 'drizzle-orm';

import { defaultPaperSize } from '@/ingest/paperSize';
import type { ZonePurpose } from '@/ingest/wire';

import type { Db } from './index';
import { memberships, sensors, shops, users, zones } from './schema';
import { transaction } from './transaction';

export const DEMO_PASSWORD = 'tamarack-demo-1';
export const DEMO_SHOP = { name: 'Tamarack Street Joinery', timeZone: 'America/Chicago' };

export const DEMO_PEOPLE = [
  { email: 'ines@tamarack.example', name: 'Ines Calder', role: 'owner' },
  { email: 'theo@tamarack.example', name: 'Theo Brandt', role: 'member' },
  { email: 'rosa@tamarack.example', name: 'Rosa Lind', role: 'viewer' },
] as const;

/** Each demo sensor and the air its zone has, for the simulator. */
export const DEMO_SENSORS = [
  { name: 'Saw-top probe', zone: 'Machine room', hasProbe: true, profile: 'machine-room' },
  { name: 'Rack hygrometer', zone: 'Lumber rack', hasProbe: false, profile: 'lumber-rack' },
  { name: 'Spray-bench probe', zone: 'Finishing room', hasProbe: true, profile: 'finishing-room' },
] as const;

/** What each demo zone holds: the rack's card leads with wood EMC against its target band. */
const DEMO_ZONE_PURPOSES: Record<(typeof DEMO_SENSORS)[number]['zone'], ZonePurpose> = {
  'Machine room': 'machines',
  'Lumber rack': 'lumber',
  'Finishing room': 'finishing',
};

export interface DemoSensorToken {
  sensorId: string;
  name: string;
  zone: string;
  hasProbe: boolean;
  profile: (typeof DEMO_SENSORS)[number]['profile'];
  token: string;
}

/** Credentials are made by server/auth, so the seed never invents its own token or hash format. */
export interface SeedCredentials {
  hashPassword(password: string): Promise<string>;
  newToken(): string;
  hashToken(token: string): string;
}

export async function seedDemo(
  db: Db,
  credentials: SeedCredentials,
): Promise<{ created: boolean; shopId: string; tokens: DemoSensorToken[] }> {
  const created = await transaction(db, async (tx) => {
    const [existing] = await tx
      .select({ id: shops.id })
      .from(shops)
      .where(eq(shops.name, DEMO_SHOP.name));
    if (existing) return false;
    const passwordHash = await credentials.hashPassword(DEMO_PASSWORD);
    const [shop] = await tx
      .insert(shops)
      .values({ ...DEMO_SHOP, paperSize: defaultPaperSize(DEMO_SHOP.timeZone) })
      .returning({ id: shops.id });
    for (const person of DEMO_PEOPLE) {
      const [user] = await tx
        .insert(users)
        // Demo people are verified: the demo shows alarm e-mails reaching them.
        .values({
          email: person.email,
          name: person.name,
          passwordHash,
          emailVerifiedAt: new Date(),
        })
        .onConflictDoUpdate({
          target: users.email,
          set: {
            name: person.name,
            emailVerifiedAt: sql`coalesce(${users.emailVerifiedAt}, now())`,
          },
        })
        .returning({ id: users.id });
      await tx
        .insert(memberships)
        .values({ shopId: shop!.id, userId: user!.id, role: person.role });
    }
    const zoneIds = new Map<string, string>();
    for (const zoneName of new Set(DEMO_SENSORS.map((s) => s.zone))) {
      const [zone] = await tx
        .insert(zones)
        .values({ shopId: shop!.id, name: zoneName, purpose: DEMO_ZONE_PURPOSES[zoneName] })
        .returning({ id: zones.id });
      zoneIds.set(zoneName, zone!.id);
    }
    for (const s of DEMO_SENSORS) {
      await tx.insert(sensors).values({
        shopId: shop!.id,
        zoneId: zoneIds.get(s.zone)!,
        name: s.name,
        // A placeholder hash of a token nobody holds; replaced below.
        tokenHash: credentials.hashToken(credentials.newToken()),
      });
    }
    return true;
  });

  const [shop] = await db
    .select({ id: shops.id })
    .from(shops)
    .where(eq(shops.name, DEMO_SHOP.name));
  const rows = await db
    .select({ id: sensors.id, name: sensors.name, zone: zones.name })
    .from(sensors)
    .innerJoin(zones, eq(zones.id, sensors.zoneId))
    .where(eq(sensors.shopId, shop!.id));
  const tokens: DemoSensorToken[] = [];
  for (const row of rows) {
    const demo = DEMO_SENSORS.find((s) => s.name === row.name);
    if (!demo) continue;
    const token = credentials.newToken();
    await db
      .update(sensors)
      .set({ tokenHash: credentials.hashToken(token), revokedAt: null })
      .where(eq(sensors.id, row.id));
    tokens.push({
      sensorId: row.id,
      name: row.name,
      zone: row.zone,
      hasProbe: demo.hasProbe,
      profile: demo.profile,
      token,
    });
  }
  return { created, shopId: shop!.id, tokens };
}
