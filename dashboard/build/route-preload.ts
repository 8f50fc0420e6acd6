/**
 * Route preloading for the first load of a page. The entry script is large and every page's code is a
 * lazy chunk the router asks for only once the entry has run; for the heavy pages (the ones that draw
 * charts) that is a second round of downloads after the first. This build step writes a tiny script,
 * loaded by index.html next to the entry, that matches the address against those pages' paths and adds
 * `<link rel="modulepreload">` for the page's chunks, so they download in parallel with the entry.
 * Other pages fetch nothing extra.
 */
import { createHash } from 'node:crypto';
import path from 'node:path';
import type { OutputBundle, OutputChunk } from 'rolldown';
import type { Plugin } from 'vite';

export interface PreloadedRoute {
  /** A router path: `/traces/:traceId`. */
  pattern: string;
  /** The page's module, relative to the project root: `src/app/routes/trace.tsx`. */
  module: string;
}

/** The regular expression (source) of the paths a router pattern matches: `:name` is one segment. */
export function routePatternSource(pattern: string): string {
  const segments = pattern
    .split('/')
    .filter(Boolean)
    .map((s) => (s.startsWith(':') ? '[^/]+' : s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')));
  return `^/${segments.join('/')}/?$`;
}

/** A chunk's file and those of its static imports, transitively, in load order. */
export function chunkClosure(chunks: ReadonlyMap<string, Pick<OutputChunk, 'imports'>>, fileName: string): string[] {
  const seen = new Set<string>();
  const visit = (file: string) => {
    if (seen.has(file)) return;
    seen.add(file);
    for (const dep of chunks.get(file)?.imports ?? []) visit(dep);
  };
  visit(fileName);
  return [...seen];
}

/** The preload script: plain ES5, no dependencies, runs once while the page's HTML is parsed. */
export function preloadScript(routes: { source: string; files: string[] }[]): string {
  return `(function(){var r=${JSON.stringify(routes)},p=location.pathname;for(var i=0;i<r.length;i++){if(new RegExp(r[i].source).test(p)){r[i].files.forEach(function(f){var l=document.createElement('link');l.rel='modulepreload';l.crossOrigin='';l.href=f;document.head.appendChild(l)});return}}})();\n`;
}

export function routePreload(routes: PreloadedRoute[], root: string): Plugin {
  return {
    name: 'headroom-route-preload',
    apply: 'build',
    enforce: 'post',
    generateBundle(_options, bundle: OutputBundle) {
      const chunks = new Map<string, OutputChunk>();
      for (const item of Object.values(bundle)) if (item.type === 'chunk') chunks.set(item.fileName, item);
      // The entry and its static imports are loaded by index.html already.
      const loaded = new Set<string>();
      for (const chunk of chunks.values()) if (chunk.isEntry) for (const f of chunkClosure(chunks, chunk.fileName)) loaded.add(f);
      const table = routes.map((route) => {
        const id = path.resolve(root, route.module);
        const chunk = [...chunks.values()].find((c) => c.facadeModuleId === id);
        if (!chunk) this.error(`route preload: no chunk for ${route.module}`);
        const files = chunkClosure(chunks, chunk.fileName).filter((f) => !loaded.has(f));
        return { source: routePatternSource(route.pattern), files: files.map((f) => `/${f}`) };
      });
      const source = preloadScript(table);
      const fileName = `assets/route-preload-${createHash('sha256').update(source).digest('hex').slice(0, 8)}.js`;
      this.emitFile({ type: 'asset', fileName, source });
      const html = bundle['index.html'];
      if (!html || html.type !== 'asset') this.error('route preload: index.html is not in the bundle');
      const withScript = String(html.source).replace(
        '<script type="module"',
        `<script async src="/${fileName}"></script>\n    <script type="module"`,
      );
      if (withScript === html.source) this.error('route preload: no module script in index.html');
      html.source = withScript;
    },
  };
}
