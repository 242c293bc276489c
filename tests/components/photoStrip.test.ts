// PhotoStrip rendered to HTML by react-dom/server through react-native-web, as the web bundle
// renders it: each thumbnail carries the caller's text alternative (WCAG 2.2 SC 1.1.1,
// non-text content), each opener is a button named after its photo, and a delete button appears
// only on the photos the caller says may be deleted, named with its object so a screen-reader
// user knows which photo goes (SC 2.5.3 keeps the visible "Delete" first in the name).
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';

import { PhotoStrip } from '@/components/photos/PhotoStrip';
import type { Photo } from '@/components/queries';

const shopId = '4a8f7c2e-1d3b-4e5f-9a6b-7c8d9e0f1a2b';
const photo = (id: string, addedById: string | null): Photo => ({
  id,
  url: `/api/v1/shops/${shopId}/photos/${id}`,
  thumbUrl: `/api/v1/shops/${shopId}/photos/${id}/thumb`,
  widthPx: 1200,
  heightPx: 900,
  addedById,
});
const first = photo('0b0c0d0e-0000-4000-8000-000000000001', 'someone-else');
const second = photo('0b0c0d0e-0000-4000-8000-000000000002', 'me');

function render(photos: Photo[]) {
  return renderToStaticMarkup(
    createElement(
      QueryClientProvider,
      { client: new QueryClient() },
      createElement(PhotoStrip, {
        shopId,
        photos,
        altOf: (_p: Photo, i: number) => `Photo ${i + 1} of Wet rag night`,
        canDelete: (p: Photo) => p.addedById === 'me',
        refresh: ['trials'],
      }),
    ),
  );
}

describe('PhotoStrip', () => {
  it('names each thumbnail and its opener with the caller’s text alternative, in order', () => {
    const html = render([first, second]);
    // The image's own name, and the opener's name starting with it.
    expect(html.match(/aria-label="Photo \d of Wet rag night[^"]*"/g)).toEqual([
      'aria-label="Photo 1 of Wet rag night: open full size"',
      'aria-label="Photo 1 of Wet rag night"',
      'aria-label="Photo 2 of Wet rag night: open full size"',
      'aria-label="Photo 2 of Wet rag night"',
    ]);
    // Drawn 72 px high in the photo's own proportions: 72 × 1200 / 900 = 96 px wide. (The
    // image source is set once mounted, so the proxy URL is checked in tests/e2e/trialPhotos.)
    expect(html.match(/style="width:(\d+)px"/g)).toEqual([
      'style="width:96px"',
      'style="width:96px"',
    ]);
  });

  it('offers delete only on the photos the caller allows', () => {
    const html = render([first, second]);
    expect(html.match(/aria-label="Delete [^"]*"/g)).toEqual([
      'aria-label="Delete Photo 2 of Wet rag night"',
    ]);
  });

  it('renders nothing without photos', () => {
    expect(render([])).toBe('');
  });
});
