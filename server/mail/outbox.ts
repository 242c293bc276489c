/**
 * Messages the local SMTP server received, newest first, in memory. It is the development
 * and test stand-in for a mailbox: the outbox page lists it and tests read it. Capped, so a
 * demo left running for weeks does not grow without bound.
 */
export interface StoredMail {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
  /** Files that came with the message (the week report's PDF), as received. */
  attachments: StoredAttachment[];
}

export interface StoredAttachment {
  filename: string;
  contentType: string;
  content: Buffer;
}

export interface Outbox {
  add(mail: Omit<StoredMail, 'id'>): StoredMail;
  list(): StoredMail[];
  get(id: string): StoredMail | undefined;
}

const MAX_MESSAGES = 200;

export function createOutbox(): Outbox {
  const messages: StoredMail[] = [];
  let next = 1;
  return {
    add(mail) {
      const stored = { ...mail, id: String(next++) };
      messages.unshift(stored);
      messages.length = Math.min(messages.length, MAX_MESSAGES);
      return stored;
    },
    list: () => [...messages],
    get: (id) => messages.find((m) => m.id === id),
  };
}
