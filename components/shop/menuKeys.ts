/**
 * What a key does inside an open menu (WAI-ARIA Authoring Practices, menu button pattern):
 * Down and Up move to the next and previous item, wrapping; Home and End to the first and last;
 * Escape closes and returns focus to the button; Tab closes and lets focus move on.
 */
export type MenuKeyAction =
  { kind: 'move'; index: number } | { kind: 'close' } | { kind: 'leave' } | { kind: 'none' };

/** `focused` is the index of the item with focus, or -1 when none has it. */
export function menuKeyAction(key: string, focused: number, count: number): MenuKeyAction {
  if (count === 0) return key === 'Escape' ? { kind: 'close' } : { kind: 'none' };
  switch (key) {
    case 'ArrowDown':
      return { kind: 'move', index: (focused + 1) % count };
    case 'ArrowUp':
      return { kind: 'move', index: focused <= 0 ? count - 1 : focused - 1 };
    case 'Home':
      return { kind: 'move', index: 0 };
    case 'End':
      return { kind: 'move', index: count - 1 };
    case 'Escape':
      return { kind: 'close' };
    case 'Tab':
      return { kind: 'leave' };
    default:
      return { kind: 'none' };
  }
}
