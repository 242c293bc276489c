import { focusRingCss } from './focusRingCss';

/**
 * Puts the focus-ring rule in the page once. React 19 hoists a `<style>` with `href` and
 * `precedence` into the head and keeps one copy however many screens render it.
 */
export function FocusRingStyle() {
  return (
    <style href="drybench-focus-ring" precedence="default">
      {focusRingCss()}
    </style>
  );
}
