// react-dom ships no types and @types/react-dom is not a dependency; the components tests use
// only this one function of it, to render a component to HTML as the web bundle would.
declare module 'react-dom/server' {
  import type { ReactNode } from 'react';

  export function renderToStaticMarkup(element: ReactNode): string;
}
