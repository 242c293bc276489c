// Runs the demo sensors against a running server.
//   tsx scripts/simulate.ts [--url http://127.0.0.1:8080] [--interval 5] [--speed 1] [--backfill 336]
//                           [--outage 10/1]   (every 10 min, 1 min without network)
//                           [--mqtt mqtt://127.0.0.1:1883 --mqtt-sensors 1]  (the first sensors
//                           publish to that broker instead of posting over HTTP)
import fs from 'node:fs';
import { parseArgs } from 'node:util';

import { getTimezoneOffset } from 'date-fns-tz';

import { DEMO_SHOP, type DemoSensorToken } from '@/db/seed';
import { mqttSender } from '@/server/demo/mqttSender';
import { startSimulator } from '@/server/demo/simulator';

const { values } = parseArgs({
  options: {
    url: { type: 'string', default: `http://127.0.0.1:${process.env.PORT ?? 8080}` },
    interval: { type: 'string', default: '5' },
    speed: { type: 'string', default: '1' },
    // Two weeks, so the week report's default week (the last complete one) has its readings
    // whatever the weekday: about 4,000 readings per sensor, a few seconds of ingest.
    backfill: { type: 'string', default: '336' },
    tokens: { type: 'string', default: '.data/demo-sensors-dev.json' },
    // e.g. --outage 10/1: every 10 minutes the sensors lose the network for 1 minute.
    outage: { type: 'string', default: '' },
    mqtt: { type: 'string', default: '' },
    'mqtt-sensors': { type: 'string', default: '1' },
  },
});

function parseOutage(text: string) {
  const match = /^(\d+(?:\.\d+)?)\/(\d+(?:\.\d+)?)$/.exec(text);
  if (!text) return null;
  if (!match) throw new Error('--outage takes EVERY/FOR in minutes, e.g. 10/1');
  return { everyMs: Number(match[1]) * 60_000, forMs: Number(match[2]) * 60_000 };
}

const tokens = JSON.parse(fs.readFileSync(values.tokens, 'utf8')) as DemoSensorToken[];
const mqttCount = values.mqtt ? Number(values['mqtt-sensors']) : 0;
const mqttClients = tokens.slice(0, mqttCount).map((t) => mqttSender(values.mqtt!, t));
const sensors = tokens.map((t, i) => ({ ...t, sender: mqttClients[i]?.send }));
const simulator = startSimulator({
  baseUrl: values.url,
  sensors,
  intervalMs: Number(values.interval) * 1000,
  speed: Number(values.speed),
  backfillHours: Number(values.backfill),
  outage: parseOutage(values.outage),
  utcOffsetHours: getTimezoneOffset(DEMO_SHOP.timeZone, new Date()) / 3_600_000,
  log: (line) => console.log(line),
});
console.log(
  `Demo sensors posting to ${values.url} every ${values.interval} s (${sensors.length} sensors).`,
);
for (const t of tokens.slice(0, mqttCount)) {
  console.log(`Demo sensor ${t.name} publishes to ${values.mqtt} instead.`);
}

const stop = () =>
  void simulator
    .stop()
    .then(() => Promise.all(mqttClients.map((c) => c.close())))
    .then(() => process.exit(0));
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
