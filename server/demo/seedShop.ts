/**
 * The whole demo seed: the shop, its people and sensors (db/seed.ts), its surfaces, care log and
 * finished trial (db/seedCare.ts), then photos drawn for the trial's tests and a few
 * inspections, stored through the same pipeline as an upload. Every part adds only what is
 * missing, so a rerun adds nothing. Without photo storage, or with it out of reach, the photos
 * are skipped with a log line and the next run adds them.
 */
import { formatInTimeZone } from 'date-fns-tz';

import type { Db } from '@/db';
import { DEMO_SHOP, seedDemo, type SeedCredentials } from '@/db/seed';
import { demoPhotoSubjects, seedDemoCare, type DemoCareCounts } from '@/db/seedCare';
import { RUSTING_STANDARD } from '@/ingest/words/care';
import { TRIAL_KIND_WORDS } from '@/ingest/words/trials';

import { preparePhoto, storePhoto } from '../photos';
import { StorageUnavailableError, type Storage } from '../storage';
import { drawInspection, drawTrialPanel } from './demoPhotos';

type Subject = Awaited<ReturnType<typeof demoPhotoSubjects>>[number];

const shortDate = (at: Date) => formatInTimeZone(at, DEMO_SHOP.timeZone, 'd MMM');

function drawSubject(subject: Subject): Promise<Buffer> {
  if (subject.kind === 'trial_test') {
    return drawTrialPanel({
      title: subject.testName,
      caption: `${TRIAL_KIND_WORDS[subject.testKind]} · coupons photographed ${shortDate(subject.at)}`,
      coupons: subject.treatments.map((label, i) => ({
        label,
        rustedPct: subject.rustedPct[i] ?? 0,
      })),
    });
  }
  return drawInspection({
    surfaceName: subject.surfaceName,
    caption: `Ri ${subject.rusting} (${RUSTING_STANDARD}) · ${shortDate(subject.at)}`,
    rusting: subject.rusting,
    shape: subject.shape,
  });
}

export interface DemoSeedOptions {
  /** Absent: no photo storage configured. */
  storage?: Storage;
  nowMs: number;
  log: (line: string) => void;
}

export async function seedDemoShop(db: Db, credentials: SeedCredentials, options: DemoSeedOptions) {
  const demo = await seedDemo(db, credentials);
  const care: DemoCareCounts = await seedDemoCare(db, demo.shopId, options.nowMs);
  let photos = 0;
  const subjects = await demoPhotoSubjects(db, demo.shopId);
  if (subjects.length > 0 && !options.storage) {
    options.log('No photo storage configured (S3_BUCKET unset): the demo photos are skipped.');
  } else if (options.storage) {
    for (const subject of subjects) {
      try {
        const photo = await preparePhoto(await drawSubject(subject));
        await storePhoto(db, options.storage, {
          shopId: demo.shopId,
          userId: subject.byUserId,
          subject: { kind: subject.kind, id: subject.id },
          photo,
        });
        photos += 1;
      } catch (err) {
        if (!(err instanceof StorageUnavailableError)) throw err;
        const left = subjects.length - photos;
        options.log(
          `Photo storage is out of reach: ${left} demo ${left === 1 ? 'photo' : 'photos'} skipped; the next seed adds them.`,
        );
        break;
      }
    }
  }
  return { ...demo, care, photos };
}

/**
 * Waits until the store answers (a get of a key nobody writes: null means it is up), for a
 * fake started beside the seed. False when it never did within `timeoutMs`.
 */
export async function waitForStorage(storage: Storage, timeoutMs: number): Promise<boolean> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    try {
      await storage.get('shops/readiness-check');
      return true;
    } catch (err) {
      if (!(err instanceof StorageUnavailableError) || Date.now() > until) return false;
      await new Promise((resolve) => setTimeout(resolve, 250));
    }
  }
}
