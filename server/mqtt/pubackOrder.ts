/**
 * One connection's PUBACKs while several of its messages are being stored at once. Messages
 * settle in any order (two group statements may commit out of turn), but MQTT 3.1.1 section 4.6
 * says a receiver sends PUBACKs in the order the PUBLISH packets arrived; so a settled message's
 * PUBACK waits for every earlier one to settle. A message that may not be acknowledged (its
 * store failed for now) is passed over, never acknowledged: the broker's own timeout sends the
 * sensor back to retry it, and does not hold up the messages behind it.
 */
export interface PubackOrder {
  /** A message arrived; call the returned function once it is stored (true) or refused (false). */
  arrived(messageId: number): (ack: boolean) => void;
  /** Messages arrived and not yet settled. */
  readonly open: number;
}

interface Entry {
  messageId: number;
  /** null while its store runs. */
  ack: boolean | null;
}

export function createPubackOrder(send: (messageId: number) => void): PubackOrder {
  const entries: Entry[] = [];
  let open = 0;

  function release() {
    while (entries.length > 0 && entries[0]!.ack !== null) {
      const head = entries.shift()!;
      if (head.ack) send(head.messageId);
    }
  }

  return {
    arrived(messageId) {
      const entry: Entry = { messageId, ack: null };
      entries.push(entry);
      open++;
      let settled = false;
      return (ack) => {
        if (settled) return;
        settled = true;
        open--;
        entry.ack = ack;
        release();
      };
    },
    get open() {
      return open;
    },
  };
}
