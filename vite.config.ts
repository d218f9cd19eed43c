import { defineConfig, type Plugin } from 'vite';
import preact from '@preact/preset-vite';
import { VitePWA } from 'vite-plugin-pwa';
import { readFileSync } from 'node:fs';
import { gzipSync } from 'node:zlib';

const pkg = JSON.parse(readFileSync(new URL('./package.json', import.meta.url), 'utf8')) as { version: string };

/**
 * Tile servers the app may contact (besides its own origin). Set DG_TILE_ORIGINS at build time,
 * comma-separated origins (scheme://host[:port]); the default is OpenStreetMap's standard tile
 * server. The list goes into the Content Security Policy (img-src, connect-src), the service
 * worker's runtime tile cache, and the app (src/app/tilePolicy.ts), so a tile URL entered in
 * Settings from any other host is refused with a message instead of silently failing.
 */
const TILE_ORIGINS = (process.env.DG_TILE_ORIGINS ?? 'https://tile.openstreetmap.org')
  .split(',')
  .map((s) => s.trim())
  .filter(Boolean)
  .map((s) => {
    const u = new URL(s);
    if (u.protocol !== 'https:' && u.protocol !== 'http:') throw new Error(`DG_TILE_ORIGINS: ${s} is not an http(s) origin`);
    return u.origin;
  });

const escapeRe = (s: string) => s.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&');
const TILE_URL_PATTERN = new RegExp(`^(?:${TILE_ORIGINS.map(escapeRe).join('|')})/`);

/**
 * Content Security Policy, as a <meta http-equiv> tag injected into the built index.html (the dev
 * server needs inline scripts for hot reload, so it runs without). No inline script or style
 * elements; requests only to the app's own origin and the tile servers above. frame-ancestors
 * cannot be set from a meta tag: set it as a response header where the app is hosted.
 */
export const CONTENT_SECURITY_POLICY = [
  "default-src 'self'",
  "script-src 'self'", // no eval, no WebAssembly
  "style-src 'self'",
  `img-src 'self' data: blob: ${TILE_ORIGINS.join(' ')}`,
  `connect-src 'self' ${TILE_ORIGINS.join(' ')}`,
  "worker-src 'self'",
  "manifest-src 'self'",
  "font-src 'self'",
  "object-src 'none'",
  "base-uri 'self'",
  "form-action 'none'",
].join('; ');

function contentSecurityPolicy(): Plugin {
  return {
    name: 'downgradient-csp-and-manifest',
    apply: 'build',
    transformIndexHtml: {
      order: 'post',
      handler: () => [
        { tag: 'meta', attrs: { 'http-equiv': 'Content-Security-Policy', content: CONTENT_SECURITY_POLICY }, injectTo: 'head-prepend' },
        { tag: 'link', attrs: { rel: 'manifest', href: './manifest.webmanifest' }, injectTo: 'head' },
        { tag: 'link', attrs: { rel: 'icon', type: 'image/png', sizes: '192x192', href: './icons/icon-192.png' }, injectTo: 'head' },
        { tag: 'link', attrs: { rel: 'apple-touch-icon', href: './icons/apple-touch-icon-180.png' }, injectTo: 'head' },
      ],
    },
  };
}

/** Budget for the JavaScript the first screen loads (gzip), in KB of 1000 bytes. */
export const INITIAL_JS_BUDGET_KB = 120;

/**
 * Prints, after a build, the JavaScript the first screen loads: the entry chunk and its static
 * imports (what index.html loads and preloads), gzip-compressed (level 9), beside the budget; then
 * the chunks loaded on demand and the screening worker (started at once, off the main thread). Over
 * budget prints a warning and leaves the build standing. Everything listed is also precached.
 */
function initialSizeReport(): Plugin {
  return {
    name: 'downgradient-initial-size',
    apply: 'build',
    writeBundle(_options, bundle) {
      const chunks = Object.values(bundle).filter((c) => c.type === 'chunk');
      const entry = chunks.find((c) => c.isEntry);
      if (!entry) return;
      const kb = (code: string) => gzipSync(code, { level: 9 }).length / 1000;
      const initial = new Set<string>();
      const visit = (name: string) => {
        if (initial.has(name)) return;
        initial.add(name);
        const c = bundle[name];
        if (c?.type === 'chunk') c.imports.forEach(visit);
      };
      visit(entry.fileName);
      const total = [...initial].reduce((sum, f) => sum + kb((bundle[f] as { code: string }).code), 0);
      const list = (cs: { name?: string; fileName: string; code?: string; source?: string | Uint8Array }[]) =>
        cs.map((c) => `${c.name ?? c.fileName} ${kb(c.code ?? String(c.source)).toFixed(1)}`).join(', ');
      const verdict = total <= INITIAL_JS_BUDGET_KB ? 'within budget' : 'OVER BUDGET: load more of it on demand (DEVELOPERS.md, "First load")';
      console.log(`\ninitial JavaScript (entry + static imports, gzip): ${total.toFixed(1)} KB of a ${INITIAL_JS_BUDGET_KB} KB budget: ${verdict}`);
      console.log(`  first load, KB gzip: ${list(chunks.filter((c) => initial.has(c.fileName)))}`);
      console.log(`  on demand, KB gzip: ${list(chunks.filter((c) => !initial.has(c.fileName)))}`);
      const workers = Object.values(bundle).filter((a) => a.type === 'asset' && a.fileName.endsWith('.js'));
      if (workers.length) console.log(`  workers (started with the screen, off the main thread), KB gzip: ${list(workers)}`);
    },
  };
}

// Everything shipped is precached for offline use (see DEVELOPERS.md, "Offline").
export default defineConfig(({ command }) => ({
  base: './',
  define: {
    __DG_TILE_ORIGINS__: JSON.stringify(TILE_ORIGINS),
    __APP_VERSION__: JSON.stringify(pkg.version),
    // the service worker exists only in a build; keyed on the command, not on NODE_ENV (a build
    // run from the test runner has NODE_ENV=test, so import.meta.env.PROD is false there)
    __DG_SERVICE_WORKER__: JSON.stringify(command === 'build'),
    // the latency samples and the `__downgradient` hook (src/ui/evaluation.ts): only in builds made
    // for measurement, which pass `define: { __DG_INSTRUMENTED__: 'true' }` inline
    // (bench/ui-latency.mjs, test/browser/global-setup.ts); never in `npm run build` / `npm start`
    __DG_INSTRUMENTED__: 'false',
  },
  plugins: [
    preact(),
    contentSecurityPolicy(),
    initialSizeReport(),
    VitePWA({
      registerType: 'prompt',
      injectRegister: false,
      // the manifest is the static public/manifest.webmanifest, linked by the plugin above
      manifest: false,
      // icons and the manifest are precached through globPatterns (listing them again duplicates entries)
      workbox: {
        globPatterns: ['**/*.{js,css,html,svg,png,webmanifest,json}'],
        navigateFallback: 'index.html',
        cleanupOutdatedCaches: true,
        // a new version waits until the user accepts the update prompt (unsaved work is saved first)
        skipWaiting: false,
        clientsClaim: false,
        runtimeCaching: [
          {
            // Map tiles the user has viewed. Network first: online, each request goes through the
            // browser's HTTP cache, so the tile server's caching headers are honoured and no extra
            // load is made; offline (or on a link slower than 4 s) the last copy is shown. Nothing
            // is prefetched or downloaded in bulk (OSM tile usage policy). Bounded in count and age.
            urlPattern: TILE_URL_PATTERN,
            handler: 'NetworkFirst',
            options: {
              cacheName: 'downgradient-tiles',
              networkTimeoutSeconds: 4,
              expiration: { maxEntries: 2000, maxAgeSeconds: 30 * 24 * 3600, purgeOnQuotaError: true },
              // CORS responses only (the tile layer requests with crossOrigin): opaque responses
              // would count several MB each against the storage quota
              cacheableResponse: { statuses: [200] },
            },
          },
        ],
      },
    }),
  ],
  // Leaflet's ES module build (its package "main" is the UMD file), so the parts of Leaflet the map
  // does not use are left out of the first load
  resolve: { alias: [{ find: /^leaflet$/, replacement: 'leaflet/dist/leaflet-src.esm.js' }] },
  worker: { format: 'es' },
  build: { target: 'es2022', sourcemap: false, chunkSizeWarningLimit: 800 },
  server: { host: '127.0.0.1' },
  preview: { host: '127.0.0.1' },
}));
