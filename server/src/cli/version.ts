/** The version of the command line, set by the build (scripts/build.mjs defines TESSERA_VERSION). */
declare const TESSERA_VERSION: string | undefined;

export const VERSION = typeof TESSERA_VERSION === 'string' ? TESSERA_VERSION : '0.0.0-dev';
