/**
 * Drybench's MQTT broker as its own process (npm start runs it beside the server): sensors
 * connect with their token, the server with MQTT_PASSWORD. See server/mqtt/broker.ts.
 *   DATABASE_URL=… MQTT_PASSWORD=… MQTT_PORT=1883 node --import tsx scripts/broker.ts
 */
import { createDatabase } from '@/db';
import { startNotificationListener } from '@/db/listener';
import { createLogger } from '@/server/logger';
import { startBroker } from '@/server/mqtt';
import { readBrokerConfig } from '@/server/mqtt/brokerConfig';

async function main() {
  const config = readBrokerConfig();
  const logger = createLogger({ level: config.logLevel, pretty: process.stdout.isTTY === true });
  const { pool, db } = createDatabase(config.databaseUrl);
  const listener = startNotificationListener(config.databaseUrl, logger);
  await listener.ready;
  const broker = await startBroker({
    db,
    listener,
    servicePassword: config.servicePassword,
    host: config.host,
    port: config.port,
    logger,
  });
  const stop = async () => {
    await broker.close();
    await listener.close();
    await pool.end();
    process.exit(0);
  };
  process.on('SIGINT', () => void stop());
  process.on('SIGTERM', () => void stop());
}

main().catch((err: unknown) => {
  console.error(
    `Drybench MQTT broker could not start: ${err instanceof Error ? err.message : err}`,
  );
  process.exit(1);
});
