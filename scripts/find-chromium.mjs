// Where Chromium is: $CHROMIUM_PATH, then the usual install paths. Browser tests need it.
import fs from 'node:fs';

export const CHROMIUM_CANDIDATES = ['/usr/bin/chromium', '/usr/bin/chromium-browser', '/usr/lib/chromium/chromium', '/snap/bin/chromium', '/usr/bin/google-chrome'];

export function findChromium() {
  const fromEnv = process.env.CHROMIUM_PATH;
  if (fromEnv) return fs.existsSync(fromEnv) ? fromEnv : null;
  return CHROMIUM_CANDIDATES.find((p) => fs.existsSync(p)) ?? null;
}

export const CHROMIUM_MISSING = `Browser tests need Chromium, and none was found (looked at $CHROMIUM_PATH, then ${CHROMIUM_CANDIDATES.join(', ')}).
Install it and run the tests again. On Debian or Ubuntu: sudo apt-get install chromium
Or point CHROMIUM_PATH at a Chromium or Chrome binary.`;
