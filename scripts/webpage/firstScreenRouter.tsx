/**
 * What the first screen's components take from expo-router, for the server's render
 * (firstScreenEntry.tsx): a Link becomes a plain link to its address, which is what expo-router
 * renders on the web too. Nothing here navigates; the app does once it has started.
 */
import { cloneElement, type ReactElement, type ReactNode } from 'react';
import { Text } from 'react-native';

interface LinkProps {
  href: string;
  asChild?: boolean;
  style?: object;
  children: ReactNode;
}

export function Link({ href, asChild, style, children }: LinkProps) {
  if (asChild) return cloneElement(children as ReactElement<{ href: string }>, { href });
  return (
    // react-native-web renders a Text with an href as a link; React Native's types lack it.
    <Text {...({ href } as object)} role="link" style={style}>
      {children}
    </Text>
  );
}

/** Hooks the rendered components call; their answers are never used in a server render. */
export function useRouter(): Record<string, never> {
  return {};
}

export function usePathname(): string {
  return '';
}

/** The shop frame's redirect of the signed-out: never rendered, the server renders members only. */
export function Redirect(): null {
  return null;
}
