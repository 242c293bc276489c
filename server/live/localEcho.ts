/**
 * This instance's own reading messages reach its sockets as soon as their rows commit, instead
 * of after the round trip through PostgreSQL's NOTIFY: there the committing backend signals the
 * listening one, which then writes to our LISTEN connection — two more processes to wake, which
 * on a busy machine cost tens of milliseconds at the p99 (STAGE_TRACE's notify.lag). The NOTIFY
 * still goes out, for the other instances; here it is recognised by its payload and dropped,
 * whichever of the two arrives first. A payload is unique: a reading message names sensor and
 * instant of rows stored once, and their values.
 *
 * The writer says which payloads a statement may notify (`expect`), then that they committed
 * (`committed`, delivered here unless the NOTIFY came first) or that no NOTIFY will come
 * (`forget`). The hub asks `heard` of every notification.
 */
type State = 'expected' | 'delivered' | 'heard';

export interface LiveEcho {
  /** The hub's delivery to its sockets; until bound, committed messages wait for the NOTIFY. */
  bind(deliver: (payload: string) => void): void;
  expect(payloads: readonly string[]): void;
  committed(payloads: readonly string[]): void;
  forget(payloads: readonly string[]): void;
  /** A notification arrived: true when the hub should deliver it (not one it already did). */
  heard(payload: string): boolean;
  /** The LISTEN connection was lost: NOTIFYs of the delivered ones will never come. */
  reset(): void;
}

/**
 * Entries wait for a NOTIFY that normally follows within milliseconds; the bound only matters
 * when notifications are lost (the LISTEN connection down), and reset() clears them then.
 */
const MAX_ENTRIES = 10_000;

export function createLiveEcho(maxEntries = MAX_ENTRIES): LiveEcho {
  const states = new Map<string, State>();
  let deliver: ((payload: string) => void) | null = null;
  const put = (payload: string, state: State) => {
    states.delete(payload);
    // A Map iterates in insertion order: the first key is the oldest.
    if (states.size >= maxEntries) states.delete(states.keys().next().value!);
    states.set(payload, state);
  };
  return {
    bind(d) {
      deliver = d;
    },
    expect(payloads) {
      if (!deliver) return;
      for (const p of payloads) put(p, 'expected');
    },
    committed(payloads) {
      if (!deliver) return;
      for (const p of payloads) {
        const state = states.get(p);
        if (state === 'heard') {
          states.delete(p);
          continue;
        }
        // Expected, or dropped by reset(): deliver now (a rare repeat beats a lost message).
        put(p, 'delivered');
        deliver(p);
      }
    },
    forget(payloads) {
      for (const p of payloads) if (states.get(p) === 'expected') states.delete(p);
    },
    heard(payload) {
      const state = states.get(payload);
      if (state === 'delivered') {
        states.delete(payload);
        return false;
      }
      if (state === 'expected') put(payload, 'heard');
      return true;
    },
    reset() {
      states.clear();
    },
  };
}
