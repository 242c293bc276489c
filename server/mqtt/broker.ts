/**
 * Drybench's own MQTT broker (aedes on a plain TCP listener). Its hooks check every connection
 * and every message against the database, the same way the HTTP ingest route does:
 *
 * - A sensor connects with its sensor id as username and its token as password (resolved by
 *   server/auth/sensorTokens.ts with a 1 s cache, and dropped at once on a revocation NOTIFY),
 *   with a client id that starts with its sensor id. It may publish only to its own readings
 *   topic and subscribe only to its own acks topic.
 * - The server connects as `drybench-server` with the shared service password, in persistent
 *   sessions (clean: false), subscribes to `drybench/+/readings` and publishes to acks topics.
 *
 * Nothing acknowledged is lost: aedes answers a QoS 1 PUBLISH with PUBACK right after
 * authorizePublish, before it routes the message, so a broker that restarted between the two
 * would lose a message the sensor was told is safe. So authorizePublish itself hands the
 * readings to one of the server's connections and waits for that connection's PUBACK, which
 * the server sends only after the rows committed; then the original is let through to a topic
 * nobody can subscribe to (FORWARDED_TOPIC), and aedes sends the sensor its PUBACK. A broker
 * that dies at any moment has therefore acknowledged only stored readings; a sensor whose
 * PUBACK never came publishes again after reconnecting, and the server counts the repeat as a
 * duplicate. With no server connected, or no answer within `forwardTimeoutMs`, the sensor is
 * disconnected without a PUBACK (MQTT 3.1.1 has no negative acknowledgement) and retries.
 */
import { createHash, timingSafeEqual } from 'node:crypto';
import net from 'node:net';

import { Aedes, type AuthenticateError, type Client, type PublishPacket } from 'aedes';

import type { Db } from '@/db';
import type { NotificationListener } from '@/db/listener';
import { TOKEN_CHANNEL } from '@/db/notify';
import {
  acksTopic,
  MQTT_SERVICE_USERNAME,
  READINGS_FILTER,
  readingsTopic,
  sensorOfAcksTopic,
} from '@/ingest/mqttTopics';
import { sensorClientIdAllowed } from '@/ingest/mqttTopics';

import {
  createSensorRateLimiter,
  DEFAULT_SENSOR_RATE,
  type RateLimitOptions,
} from '../auth/sensorRateLimit';
import { createSensorTokenCache, hashToken } from '../auth/sensorTokens';
import type { Logger } from '../logger';
import { stageMs } from '../stageTrace';

/** Where a forwarded original goes after its readings were stored: no one may subscribe to it. */
const FORWARDED_TOPIC = '$drybench/forwarded';

/** MQTT 3.1.1 CONNACK return codes (aedes's AuthErrorCode, a const enum tsc cannot import). */
const IDENTIFIER_REJECTED = 2;
const SERVER_UNAVAILABLE = 3;
const BAD_USERNAME_OR_PASSWORD = 4;

export interface BrokerOptions {
  db: Db;
  /** Token revocations from every server instance; the broker drops those sensors at once. */
  listener?: NotificationListener;
  servicePassword: string;
  host: string;
  /** 0 picks a free port (tests). */
  port: number;
  logger: Logger;
  /** How long a token check is believed: revocation bites within this even without NOTIFY. */
  tokenTtlMs?: number;
  /** How long a sensor's message may wait for the server's PUBACK before the sensor is told to retry. */
  forwardTimeoutMs?: number;
  /** Messages per sensor, as the HTTP route's 429 limit. */
  sensorRate?: RateLimitOptions;
}

export interface RunningBroker {
  port: number;
  close(): Promise<void>;
}

type Identity =
  { kind: 'service' } | { kind: 'sensor'; sensorId: string; token: string; tokenHash: string };

interface Waiter {
  resolve: () => void;
  reject: (err: Error) => void;
  timer: NodeJS.Timeout;
}

function digest(text: string | Buffer): Buffer {
  return createHash('sha256').update(text).digest();
}

function authError(code: number, message: string): AuthenticateError {
  return Object.assign(new Error(message), { returnCode: code }) as AuthenticateError;
}

export async function startBroker(options: BrokerOptions): Promise<RunningBroker> {
  const log = options.logger.child({ component: 'mqtt' });
  const tokens = createSensorTokenCache(options.db, {
    listener: options.listener,
    ttlMs: options.tokenTtlMs ?? 1000,
  });
  const limiter = createSensorRateLimiter({ ...DEFAULT_SENSOR_RATE, ...options.sensorRate });
  const forwardTimeoutMs = options.forwardTimeoutMs ?? 10_000;
  const serviceDigest = digest(options.servicePassword);
  const identities = new WeakMap<Client, Identity>();
  /** Connected sensors, for closing a revoked token's connections. */
  const sensors = new Map<Client, Extract<Identity, { kind: 'sensor' }>>();
  /** The server's connections that subscribed to every readings topic, with their open forwards. */
  const services = new Map<Client, number>();
  const waiters = new Map<number, Waiter>();
  // brokerId + brokerCounter name a queued packet in aedes's persistence and come back with its
  // PUBACK ('ack' event): our own id keeps our counter apart from aedes's.
  const forwardBrokerId = `drybench-forward-${process.pid}-${Date.now()}`;
  let forwardCounter = 0;

  const broker = await Aedes.createBroker({
    authenticate(client, username, password, done) {
      if (!password || password.length === 0) {
        return done(authError(BAD_USERNAME_OR_PASSWORD, 'no password'), false);
      }
      if (username === MQTT_SERVICE_USERNAME) {
        const ok = timingSafeEqual(digest(password), serviceDigest);
        if (!ok) return done(authError(BAD_USERNAME_OR_PASSWORD, 'bad service password'), false);
        // Persistent sessions only: the PUBACK that releases a sensor's message is matched to
        // the message through the session's queue (see forward).
        if (!client.id.startsWith(MQTT_SERVICE_USERNAME) || client.clean) {
          return done(authError(IDENTIFIER_REJECTED, 'service needs its own persistent id'), false);
        }
        identities.set(client, { kind: 'service' });
        return done(null, true);
      }
      const token = password.toString('utf8');
      tokens.resolve(token).then(
        (sensor) => {
          if (!sensor || username !== sensor.sensorId) {
            return done(authError(BAD_USERNAME_OR_PASSWORD, 'unknown sensor or token'), false);
          }
          if (!sensorClientIdAllowed(sensor.sensorId, client.id)) {
            return done(
              authError(IDENTIFIER_REJECTED, 'client id must start with the sensor id'),
              false,
            );
          }
          const who = {
            kind: 'sensor' as const,
            sensorId: sensor.sensorId,
            token,
            tokenHash: hashToken(token),
          };
          identities.set(client, who);
          sensors.set(client, who);
          done(null, true);
        },
        (err: unknown) => {
          log.warn({ err }, 'token check failed; sensor told to come back');
          done(authError(SERVER_UNAVAILABLE, 'storage unavailable'), false);
        },
      );
    },

    authorizeSubscribe(client, subscription, done) {
      const who = identities.get(client);
      const allowed =
        who?.kind === 'service'
          ? subscription.topic === READINGS_FILTER
          : who?.kind === 'sensor' && subscription.topic === acksTopic(who.sensorId);
      // A refused filter is answered in SUBACK (0x80) rather than by hanging up.
      if (!allowed) return done(null, null);
      done(null, who?.kind === 'service' ? { ...subscription, qos: 1 } : subscription);
    },

    authorizePublish(client, packet, done) {
      const who = client ? identities.get(client) : undefined;
      if (!client || !who) return done(new Error('not signed in'));
      if (who.kind === 'service') {
        return done(
          sensorOfAcksTopic(packet.topic) ? null : new Error('service publishes acks only'),
        );
      }
      if (packet.topic !== readingsTopic(who.sensorId)) {
        log.warn({ sensorId: who.sensorId, topic: packet.topic }, 'sensor refused: not its topic');
        return done(new Error('a sensor publishes to its own readings topic only'));
      }
      if (!limiter.take(who.sensorId).ok) {
        return done(new Error('posting faster than its limit'));
      }
      const t0 = performance.now();
      let t1 = t0;
      tokens
        .resolve(who.token)
        .then((sensor) => {
          t1 = performance.now();
          stageMs('broker.token', t1 - t0);
          if (!sensor || sensor.sensorId !== who.sensorId) {
            log.info({ sensorId: who.sensorId }, 'sensor refused: token revoked');
            client.close();
            throw new Error('token revoked');
          }
          return forward(packet);
        })
        .then(
          () => {
            stageMs('broker.forward', performance.now() - t1);
            packet.topic = FORWARDED_TOPIC;
            packet.retain = false;
            done(null);
          },
          (err: Error) => done(err),
        );
    },
  });

  function forward(packet: PublishPacket): Promise<void> {
    let chosen: Client | undefined;
    let fewest = Infinity;
    for (const [service, open] of services) {
      if (service.connected && !service.closed && open < fewest) [chosen, fewest] = [service, open];
    }
    if (!chosen) return Promise.reject(new Error('the server is not connected'));
    const service = chosen;
    // How many forwards the least busy connection already had open: 0 unless every one is busy.
    stageMs('broker.chosenOpen', fewest);
    const counter = ++forwardCounter;
    services.set(service, fewest + 1);
    return new Promise<void>((resolve, reject) => {
      const settle = () => {
        waiters.delete(counter);
        const open = services.get(service);
        if (open !== undefined) services.set(service, Math.max(0, open - 1));
      };
      waiters.set(counter, {
        resolve: () => (settle(), resolve()),
        reject: (err) => (settle(), reject(err)),
        timer: setTimeout(
          () => waiters.get(counter)?.reject(new Error('not stored in time')),
          forwardTimeoutMs,
        ),
      });
      const copy = {
        cmd: 'publish',
        topic: packet.topic,
        payload: packet.payload,
        qos: 1,
        retain: false,
        dup: false,
        brokerId: forwardBrokerId,
        brokerCounter: counter,
      } as unknown as PublishPacket;
      service.publish(copy, (err?: Error) => {
        if (err) waiters.get(counter)?.reject(err);
      });
    });
  }

  broker.on('ack', (packet, client) => {
    const p = packet as { brokerId?: string; brokerCounter?: number } | undefined;
    if (!p || p.brokerId !== forwardBrokerId || !services.has(client)) return;
    const waiter = waiters.get(p.brokerCounter ?? -1);
    if (waiter) {
      clearTimeout(waiter.timer);
      waiter.resolve();
    }
  });
  broker.on('subscribe', (subscriptions, client) => {
    const who = identities.get(client);
    if (who?.kind === 'service' && subscriptions.some((s) => s.topic === READINGS_FILTER)) {
      services.set(client, services.get(client) ?? 0);
      log.info({ clientId: client.id }, 'server connection subscribed to readings');
    }
  });
  broker.on('unsubscribe', (topics, client) => {
    if (topics.includes(READINGS_FILTER)) services.delete(client);
  });
  broker.on('clientDisconnect', (client) => {
    services.delete(client);
    sensors.delete(client);
  });
  broker.on('clientError', (client, err) => {
    log.debug({ clientId: client.id, err: err.message }, 'client dropped');
  });

  // A revoked token's open connections close at once, on every broker that hears of it. The
  // routes announce a token on creation, rename and zone move too (so no cache keeps an old
  // answer), so the token is checked again first: closing on every notice dropped a sensor
  // that had just connected with its new token, or was renamed, mid-session. The cache forgot
  // the hash on this same notice (its listener was added first), so the check reads the row.
  options.listener?.on(TOKEN_CHANNEL, (tokenHash) => {
    for (const [client, who] of sensors) {
      if (who.tokenHash !== tokenHash) continue;
      tokens.resolve(who.token).then(
        (sensor) => {
          if (sensor?.sensorId !== who.sensorId) client.close();
        },
        // Storage away: its next message's token check decides.
        (err: unknown) => log.warn({ err }, 'token re-check failed; the next message decides'),
      );
    }
  });

  // Without noDelay a small packet written while the previous one is still unacknowledged waits
  // for the peer's delayed ACK (Nagle's algorithm; Linux delays an ACK up to 40 ms): a forward
  // to an idle server connection took p50 48 ms against the server's 10 ms store.
  const server = net.createServer({ noDelay: true }, broker.handle);
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port, options.host, () => resolve());
  });
  const port = (server.address() as net.AddressInfo).port;
  log.info(
    { host: options.host, port },
    `Drybench MQTT broker listening on ${options.host}:${port}`,
  );

  return {
    port,
    async close() {
      for (const waiter of waiters.values()) {
        clearTimeout(waiter.timer);
        waiter.reject(new Error('broker closing'));
      }
      await new Promise<void>((resolve) => broker.close(() => resolve()));
      await new Promise<void>((resolve) => server.close(() => resolve()));
    },
  };
}
