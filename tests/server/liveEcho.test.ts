// This instance's reading messages reach its sockets once each, at commit, whichever comes
// first of the commit and its own NOTIFY (server/live/localEcho.ts). The cases are the orders
// PostgreSQL allows: the listening backend may write the notification before or after the
// committing one answers the statement, or not at all while the LISTEN connection is down.
import { describe, expect, it } from 'vitest';

import { createLiveEcho } from '@/server/live/localEcho';

/** An echo bound to a hub double; `hear` is the hub's handling of one notification. */
function world(maxEntries?: number) {
  const echo = createLiveEcho(maxEntries);
  const sent: string[] = [];
  echo.bind((p) => sent.push(p));
  const hear = (p: string) => void (echo.heard(p) && sent.push(p));
  return { echo, sent, hear };
}

describe('the live echo', () => {
  it('delivers at commit and drops the NOTIFY that follows', () => {
    const { echo, sent, hear } = world();
    echo.expect(['a', 'b']);
    expect(sent).toEqual([]);
    echo.committed(['a', 'b']);
    expect(sent).toEqual(['a', 'b']);
    hear('a');
    hear('b');
    expect(sent).toEqual(['a', 'b']);
    // Gone from the table: the same text from elsewhere later is delivered.
    hear('a');
    expect(sent).toEqual(['a', 'b', 'a']);
  });

  it('delivers a NOTIFY that beats the commit and not again at commit', () => {
    const { echo, sent, hear } = world();
    echo.expect(['a']);
    hear('a');
    expect(sent).toEqual(['a']);
    echo.committed(['a']);
    expect(sent).toEqual(['a']);
  });

  it("delivers other instances' messages as they come", () => {
    const { sent, hear } = world();
    hear('x');
    hear('y');
    expect(sent).toEqual(['x', 'y']);
  });

  it('forgets a statement that sent nothing (some rows were duplicates), so nothing is held', () => {
    const { echo, sent, hear } = world();
    echo.expect(['a']);
    echo.forget(['a']);
    echo.committed([]);
    hear('a');
    expect(sent).toEqual(['a']);
  });

  it('after a lost LISTEN connection, delivers at commit rather than wait for a NOTIFY that never comes', () => {
    const { echo, sent, hear } = world();
    echo.expect(['a']);
    echo.reset();
    echo.committed(['a']);
    expect(sent).toEqual(['a']);
    hear('a');
    expect(sent).toEqual(['a']);
  });

  it('holds at most maxEntries unanswered messages (oldest out)', () => {
    const { echo, sent, hear } = world(2);
    echo.expect(['a', 'b', 'c']);
    echo.committed(['a', 'b', 'c']);
    expect(sent).toEqual(['a', 'b', 'c']);
    hear('a'); // fell out of the table: delivered again (a rare repeat, never a loss)
    hear('b');
    hear('c');
    expect(sent).toEqual(['a', 'b', 'c', 'a']);
  });

  it('unbound (no hub in this process), leaves every message to the NOTIFY', () => {
    const echo = createLiveEcho();
    echo.expect(['a']);
    echo.committed(['a']);
    expect(echo.heard('a')).toBe(true);
  });
});
