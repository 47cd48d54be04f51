import { readFileSync } from 'node:fs';

/** The app's version, read from package.json once. */
export const APP_VERSION: string = JSON.parse(readFileSync(new URL('../package.json', import.meta.url), 'utf8')).version;
