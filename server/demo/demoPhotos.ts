/**
 * Photos for the demo shop, drawn here rather than taken: an SVG rendered to JPEG by sharp.
 * A trial test shows the four coupons side by side with rust speckles covering the share of
 * each face the scenario gives; an inspection shows the surface with the rusted share of its
 * ISO 4628-3 grade. A seeded generator makes the same picture from the same inputs every run.
 */
import { loadPhotoCodec } from '../photos';

export const DEMO_PHOTO_WIDTH_PX = 1200;
export const DEMO_PHOTO_HEIGHT_PX = 900;
const W = DEMO_PHOTO_WIDTH_PX;
const H = DEMO_PHOTO_HEIGHT_PX;
// A font every Linux machine with fontconfig has, then whatever sans-serif it has.
const FONT = 'DejaVu Sans, Liberation Sans, sans-serif';

/**
 * The rusted share of the area per degree of rusting, % (ISO 4628-3's grades, quoted from memory
 * as in ingest/words/care.ts; Ri 5 takes the middle of its 40–50 %).
 */
export const RUSTED_PCT_BY_GRADE = [0, 0.05, 0.5, 1, 8, 45] as const;

/** mulberry32: a small, well-mixed 32-bit generator, enough for drawing. */
export function seededRandom(seedText: string): () => number {
  // FNV-1a of the text as the seed.
  let seed = 0x811c9dc5;
  for (let i = 0; i < seedText.length; i += 1) {
    seed ^= seedText.charCodeAt(i);
    seed = Math.imul(seed, 0x01000193) >>> 0;
  }
  return () => {
    seed = (seed + 0x6d2b79f5) >>> 0;
    let t = seed;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function escapeXml(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

const f1 = (v: number) => v.toFixed(1);

interface Box {
  x: number;
  y: number;
  w: number;
  h: number;
}

/** Fine grinding marks across a ground iron face: thin lines a shade lighter or darker. */
function grindMarks(box: Box, random: () => number, count: number): string {
  let out = '';
  for (let i = 0; i < count; i += 1) {
    const y = box.y + random() * box.h;
    const tilt = (random() - 0.5) * 6;
    const shade = random() < 0.5 ? '#8a939a' : '#4f565c';
    out += `<line x1="${box.x}" y1="${f1(y)}" x2="${box.x + box.w}" y2="${f1(y + tilt)}" stroke="${shade}" stroke-width="${f1(0.6 + random())}" stroke-opacity="${f1(0.25 + random() * 0.3)}"/>`;
  }
  return out;
}

const RUST_COLOURS = ['#8a3b17', '#a4501f', '#6e2c10', '#b8652a', '#7c3414'];

/**
 * Rust specks in clusters until their summed area reaches `pct` % of the box (overlaps make the
 * visible share a little less: close enough for a picture). Specks grow with the share, so
 * heavy rust reads as patches rather than dust.
 */
function rustSpecks(box: Box, pct: number, random: () => number): string {
  const target = (box.w * box.h * pct) / 100;
  if (target <= 0) return '';
  const clusters = Array.from({ length: 2 + Math.ceil(Math.sqrt(pct) * 2) }, () => ({
    x: box.x + random() * box.w,
    y: box.y + random() * box.h,
    spread: 20 + random() * 60 + pct * 3,
  }));
  const maxR = 2.5 + Math.min(pct, 40) * 0.35;
  let area = 0;
  let out = '';
  for (let n = 0; area < target && n < 6000; n += 1) {
    const c = clusters[Math.floor(random() * clusters.length)]!;
    // Sum of two uniforms: specks gather towards the cluster's middle.
    const x = c.x + (random() + random() - 1) * c.spread;
    const y = c.y + (random() + random() - 1) * c.spread;
    const r = 1 + random() * random() * maxR;
    if (x - r < box.x || x + r > box.x + box.w || y - r < box.y || y + r > box.y + box.h) continue;
    const colour = RUST_COLOURS[Math.floor(random() * RUST_COLOURS.length)]!;
    const rx = r * (0.7 + random() * 0.6);
    out += `<ellipse cx="${f1(x)}" cy="${f1(y)}" rx="${f1(rx)}" ry="${f1(r)}" fill="${colour}" fill-opacity="${f1(0.7 + random() * 0.3)}"/>`;
    area += Math.PI * rx * r;
  }
  return out;
}

async function toJpeg(svg: string): Promise<Buffer> {
  // The photo pipeline's sharp, loaded on first use like it (not at start).
  const { sharp } = await loadPhotoCodec();
  return sharp(Buffer.from(svg)).jpeg({ quality: 88 }).toBuffer();
}

export interface TrialPanelPicture {
  title: string;
  caption: string;
  coupons: readonly { label: string; rustedPct: number }[];
}

/** The trial's coupons after one test, on a bench, each with its treatment's label below. */
export function drawTrialPanel(picture: TrialPanelPicture): Promise<Buffer> {
  const random = seededRandom(`panel:${picture.title}`);
  const n = picture.coupons.length;
  const gap = 36;
  const couponW = (W - 2 * 60 - (n - 1) * gap) / n;
  const couponH = 600;
  const top = 150;
  let body = '';
  picture.coupons.forEach((coupon, i) => {
    const box = { x: 60 + i * (couponW + gap), y: top, w: couponW, h: couponH };
    body += `<rect x="${f1(box.x + 6)}" y="${box.y + 8}" width="${f1(box.w)}" height="${box.h}" rx="6" fill="#1c1712" fill-opacity="0.55"/>`;
    body += `<rect x="${f1(box.x)}" y="${box.y}" width="${f1(box.w)}" height="${box.h}" rx="6" fill="url(#iron)"/>`;
    body += grindMarks(box, random, 90);
    body += rustSpecks(box, coupon.rustedPct, random);
    // A strip of masking tape with the treatment written on it.
    const tapeY = top + couponH + 28;
    body += `<rect x="${f1(box.x + 8)}" y="${tapeY}" width="${f1(box.w - 16)}" height="84" fill="#e8dcbc" transform="rotate(${f1((random() - 0.5) * 3)} ${f1(box.x + box.w / 2)} ${tapeY + 42})"/>`;
    const words = coupon.label.split(' ');
    const lines =
      coupon.label.length > 14 && words.length > 1
        ? [words.slice(0, Math.ceil(words.length / 2)), words.slice(Math.ceil(words.length / 2))]
        : [words];
    lines.forEach((line, j) => {
      const y = tapeY + (lines.length === 1 ? 52 : 36 + j * 32);
      body += `<text x="${f1(box.x + box.w / 2)}" y="${y}" font-family="${FONT}" font-size="28" fill="#2a2622" text-anchor="middle">${escapeXml(line.join(' '))}</text>`;
    });
  });
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}">
<defs><linearGradient id="iron" x1="0" y1="0" x2="1" y2="1"><stop offset="0" stop-color="#7b848b"/><stop offset="0.5" stop-color="#69727a"/><stop offset="1" stop-color="#5b636a"/></linearGradient></defs>
<rect width="${W}" height="${H}" fill="#6b5138"/>
${grainLines(random)}
<text x="60" y="78" font-family="${FONT}" font-size="38" font-weight="bold" fill="#f5f2ea">${escapeXml(picture.title)}</text>
<text x="60" y="118" font-family="${FONT}" font-size="24" fill="#e2dccf">${escapeXml(picture.caption)}</text>
${body}
</svg>`;
  return toJpeg(svg);
}

/** Wood grain of the bench top behind the coupons. */
function grainLines(random: () => number): string {
  let out = '';
  for (let i = 0; i < 40; i += 1) {
    const y = random() * H;
    const bend = (random() - 0.5) * 40;
    out += `<path d="M0 ${f1(y)} Q ${W / 2} ${f1(y + bend)} ${W} ${f1(y + (random() - 0.5) * 20)}" stroke="#5a4430" stroke-width="${f1(1 + random() * 3)}" fill="none" stroke-opacity="0.6"/>`;
  }
  return out;
}

export interface InspectionPicture {
  surfaceName: string;
  caption: string;
  rusting: number;
  /** Bars (clamps on a rack) rather than one ground top. */
  shape: 'top' | 'bars';
}

/** A surface at an inspection: a ground top with a mitre slot, or a row of clamp bars. */
export function drawInspection(picture: InspectionPicture): Promise<Buffer> {
  const random = seededRandom(`inspection:${picture.surfaceName}:${picture.rusting}`);
  const pct = RUSTED_PCT_BY_GRADE[picture.rusting] ?? 0;
  let body = '';
  if (picture.shape === 'top') {
    const top = { x: 0, y: 0, w: W, h: H };
    body += `<rect width="${W}" height="${H}" fill="url(#iron)"/>`;
    body += grindMarks(top, random, 260);
    // Rust gathers at the slot's edges, where water and dust sit.
    const slot = { x: 0, y: 380, w: W, h: 60 };
    body += rustSpecks({ x: 0, y: slot.y - 90, w: W, h: 90 }, pct * 1.6, random);
    body += rustSpecks({ x: 0, y: slot.y + slot.h, w: W, h: 90 }, pct * 1.6, random);
    body += rustSpecks({ x: 0, y: 0, w: W, h: slot.y - 90 }, pct * 0.5, random);
    body += `<rect x="0" y="${slot.y}" width="${W}" height="${slot.h}" fill="#2b3035"/>`;
    body += `<rect x="0" y="${slot.y}" width="${W}" height="6" fill="#1b1f22"/>`;
  } else {
    body += `<rect width="${W}" height="${H}" fill="#d9d2c2"/>`;
    for (let i = 0; i < 6; i += 1) {
      const bar = { x: 40, y: 60 + i * 112, w: W - 80, h: 56 };
      body += `<rect x="${bar.x}" y="${bar.y + 6}" width="${bar.w}" height="${bar.h}" fill="#8f8878" fill-opacity="0.5"/>`;
      body += `<rect x="${bar.x}" y="${bar.y}" width="${bar.w}" height="${bar.h}" fill="url(#iron)"/>`;
      body += grindMarks(bar, random, 20);
      // The bars nearest the spray bench (the lower ones) took the most.
      body += rustSpecks(bar, pct * (0.4 + i * 0.35), random);
    }
  }
  const tag = { x: W - 560, y: H - 150 };
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}">
<defs><linearGradient id="iron" x1="0" y1="0" x2="1" y2="1"><stop offset="0" stop-color="#828b92"/><stop offset="0.6" stop-color="#6c757c"/><stop offset="1" stop-color="#5d656c"/></linearGradient></defs>
${body}
<rect x="${tag.x}" y="${tag.y}" width="530" height="122" rx="4" fill="#fffdf8" fill-opacity="0.92"/>
<text x="${tag.x + 18}" y="${tag.y + 50}" font-family="${FONT}" font-size="36" font-weight="bold" fill="#1f2427">${escapeXml(picture.surfaceName)}</text>
<text x="${tag.x + 18}" y="${tag.y + 96}" font-family="${FONT}" font-size="28" fill="#1f2427">${escapeXml(picture.caption)}</text>
</svg>`;
  return toJpeg(svg);
}
