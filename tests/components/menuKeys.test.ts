// The keys of an open menu, as the WAI-ARIA Authoring Practices' menu button pattern describes
// them: Down/Up move and wrap, Home/End jump, Escape closes (focus back on the button), Tab leaves.
import { describe, expect, it } from 'vitest';

import { menuKeyAction } from '@/components/shop/menuKeys';

describe('menuKeyAction in a menu of 3 items', () => {
  it.each([
    ['ArrowDown', 0, { kind: 'move', index: 1 }],
    ['ArrowDown', 2, { kind: 'move', index: 0 }], // wraps to the first
    ['ArrowDown', -1, { kind: 'move', index: 0 }], // nothing focused yet: the first
    ['ArrowUp', 1, { kind: 'move', index: 0 }],
    ['ArrowUp', 0, { kind: 'move', index: 2 }], // wraps to the last
    ['ArrowUp', -1, { kind: 'move', index: 2 }],
    ['Home', 2, { kind: 'move', index: 0 }],
    ['End', 0, { kind: 'move', index: 2 }],
    ['Escape', 1, { kind: 'close' }],
    ['Tab', 1, { kind: 'leave' }],
    ['a', 1, { kind: 'none' }],
  ] as const)('%s from item %i', (key, focused, expected) => {
    expect(menuKeyAction(key, focused, 3)).toEqual(expected);
  });

  it('an empty menu only closes', () => {
    expect(menuKeyAction('ArrowDown', -1, 0)).toEqual({ kind: 'none' });
    expect(menuKeyAction('Escape', -1, 0)).toEqual({ kind: 'close' });
  });
});
