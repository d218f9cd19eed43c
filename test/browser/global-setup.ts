// Builds the production app once (the service worker exists only there) and serves it with vite's
// programmatic preview() on 127.0.0.1 for every browser test. The URL reaches tests via inject('baseUrl').
// The build is the production one plus the measurement hook (`__DG_INSTRUMENTED__`, see
// src/ui/evaluation.ts): tests read the case on screen through `window.__downgradient`.
import { build, preview, type PreviewServer } from 'vite';
import type { TestProject } from 'vitest/node';

let server: PreviewServer | undefined;

export default async function setup(project: TestProject) {
  await build({ logLevel: 'warn', define: { __DG_INSTRUMENTED__: 'true' } });
  server = await preview({ preview: { host: '127.0.0.1', port: 0, strictPort: false }, logLevel: 'warn' });
  const url = server.resolvedUrls?.local[0];
  if (!url) throw new Error('preview server did not report a URL');
  project.provide('baseUrl', url);
  return async () => {
    await server?.close();
  };
}

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
  }
}
