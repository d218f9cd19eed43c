/** The app version, fixed at build from package.json (vite.config.ts `define`). */
declare const __APP_VERSION__: string | undefined;
export const APP_VERSION: string = typeof __APP_VERSION__ !== 'undefined' ? __APP_VERSION__ : 'development';
