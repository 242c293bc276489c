import { backoffDelayMs } from './backoff';

export type LiveStatus = 'off' | 'connecting' | 'open' | 'waiting';

export interface LiveSocketOptions {
  url: string;
  onMessage: (data: unknown) => void;
  onStatus: (status: LiveStatus) => void;
  /** Called when the socket opens again after a drop: anything sent meanwhile was missed. */
  onReconnect: () => void;
  /** Called when an attempt fails before opening (e.g. the session has ended). */
  onFailedAttempt: () => void;
}

/** Keeps one WebSocket open, reconnecting with backoff. Returns a function that stops it. */
export function openLiveSocket(options: LiveSocketOptions): () => void {
  let socket: WebSocket | null = null;
  let timer: ReturnType<typeof setTimeout> | null = null;
  let attempt = 0;
  let everOpened = false;
  let stopped = false;
  // The server replays what arrived after `since`; a minute of slack covers clock skew.
  let lastMessageAtMs: number | null = null;
  const REPLAY_SLACK_MS = 60_000;

  const connect = () => {
    if (stopped) return;
    options.onStatus('connecting');
    let opened = false;
    const since =
      lastMessageAtMs === null ? '' : new Date(lastMessageAtMs - REPLAY_SLACK_MS).toISOString();
    const current = new WebSocket(since ? `${options.url}?since=${since}` : options.url);
    socket = current;
    current.onopen = () => {
      opened = true;
      attempt = 0;
      options.onStatus('open');
      if (everOpened) options.onReconnect();
      everOpened = true;
    };
    current.onmessage = (event) => {
      lastMessageAtMs = Date.now();
      options.onMessage(event.data);
    };
    current.onclose = () => {
      if (socket !== current) return;
      socket = null;
      if (stopped) return;
      if (!opened) options.onFailedAttempt();
      options.onStatus('waiting');
      timer = setTimeout(connect, backoffDelayMs(attempt));
      attempt += 1;
    };
    // An error is always followed by close; reconnecting happens there.
    current.onerror = () => undefined;
  };

  connect();

  return () => {
    stopped = true;
    if (timer) clearTimeout(timer);
    const current = socket;
    socket = null;
    current?.close();
    options.onStatus('off');
  };
}
