/** MQTT ingest: our broker (broker.ts) and the server's subscription to it (subscriber.ts). */
export { startBroker, type BrokerOptions, type RunningBroker } from './broker';
export { createMessageAnswerer, type MessageAnswerer, type MessageOutcome } from './answer';
export { defaultClientIdPrefix, redactUrl, startMqttIngest, type MqttIngest } from './subscriber';
