// The access primitives rendered to HTML by react-dom/server through react-native-web, as the
// web bundle renders them: a field's error is tied to it (aria-invalid, aria-describedby naming
// the message's id), a screen title and a panel title are real h1 and h2 elements, and a button
// named with its object keeps its visible label at the start of its name (WCAG 2.2 SC 2.5.3).
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';

import { Button, Choice, TextField } from '@/components/forms';
import { ScreenTitle } from '@/components/layout/ScreenTitle';
import { Notice, Panel } from '@/components/ui';

const attr = (html: string, tag: string, name: string): string | null => {
  const element = new RegExp(`<${tag}\\b[^>]*>`).exec(html)?.[0] ?? '';
  return new RegExp(`\\b${name}="([^"]*)"`).exec(element)?.[1] ?? null;
};

describe('TextField', () => {
  it('ties its error to the input', () => {
    const html = renderToStaticMarkup(
      createElement(TextField, { label: 'Email', error: 'Enter your e-mail address' }),
    );
    expect(attr(html, 'input', 'aria-invalid')).toBe('true');
    const describedBy = attr(html, 'input', 'aria-describedby');
    expect(describedBy).toBeTruthy();
    expect(html).toMatch(new RegExp(`id="${describedBy}"[^>]*>Enter your e-mail address<`));
  });

  it('says nothing of an error when there is none', () => {
    const html = renderToStaticMarkup(createElement(TextField, { label: 'Email' }));
    expect(attr(html, 'input', 'aria-invalid')).toBeNull();
    expect(attr(html, 'input', 'aria-describedby')).toBeNull();
  });
});

describe('Choice', () => {
  it('ties its error to the radio group', () => {
    const html = renderToStaticMarkup(
      createElement(Choice, {
        label: 'Role',
        options: [{ value: 'member', label: 'Member' }],
        value: null,
        onChange: () => undefined,
        error: 'Pick a role',
      }),
    );
    const group = /<div[^>]*role="radiogroup"[^>]*>/.exec(html)?.[0] ?? '';
    const describedBy = /aria-describedby="([^"]*)"/.exec(group)?.[1];
    expect(describedBy).toBeTruthy();
    expect(html).toMatch(new RegExp(`id="${describedBy}"[^>]*>Pick a role<`));
  });
});

describe('headings', () => {
  it('renders a screen title as the h1', () => {
    expect(renderToStaticMarkup(createElement(ScreenTitle, null, 'Alarms'))).toMatch(
      /^<h1\b[^>]*>Alarms<\/h1>$/,
    );
  });

  it('renders a panel title as an h2', () => {
    expect(renderToStaticMarkup(createElement(Panel, { title: 'Units' }))).toMatch(
      /<h2\b[^>]*>Units<\/h2>/,
    );
  });

  it('makes a notice title a heading only when asked', () => {
    expect(renderToStaticMarkup(createElement(Notice, { title: 'Nothing here' }))).not.toMatch(
      /<h\d/,
    );
    expect(
      renderToStaticMarkup(createElement(Notice, { title: 'Nothing here', level: 1 })),
    ).toMatch(/<h1\b[^>]*>Nothing here<\/h1>/);
  });
});

describe('Button', () => {
  it('takes a name that says what it acts on, starting with its visible label', () => {
    const html = renderToStaticMarkup(
      createElement(Button, {
        label: 'Withdraw',
        accessibilityLabel: 'Withdraw the invitation to ana@example.com',
        onPress: () => undefined,
      }),
    );
    expect(html).toContain('aria-label="Withdraw the invitation to ana@example.com"');
    expect(html).toContain('>Withdraw<');
  });
});
