// Debian's Chromium and its flags, for the browser tests and the bench's web phase: never a
// downloaded browser (SETUP-NOTES.md), no network of its own, no GPU on a headless machine.
export const CHROMIUM_PATH = '/usr/bin/chromium';

export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];
