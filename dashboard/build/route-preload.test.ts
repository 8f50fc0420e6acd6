// @vitest-environment node
import { describe, expect, it } from 'vitest';
import { chunkClosure, preloadScript, routePatternSource } from './route-preload';

describe('routePatternSource', () => {
  it('when a pattern has a parameter, then it matches exactly one segment there', () => {
    const re = new RegExp(routePatternSource('/traces/:traceId'));
    expect(re.test('/traces/abc-123')).toBe(true);
    expect(re.test('/traces/abc-123/')).toBe(true);
    expect(re.test('/traces')).toBe(false);
    expect(re.test('/traces/abc/events')).toBe(false);
    expect(re.test('/x/traces/abc')).toBe(false);
  });

  it('when a segment holds regular-expression characters, then they match literally', () => {
    const re = new RegExp(routePatternSource('/a.b/:id'));
    expect(re.test('/a.b/1')).toBe(true);
    expect(re.test('/axb/1')).toBe(false);
  });
});

describe('chunkClosure', () => {
  it('when chunks import each other, then every file is listed once, the page first', () => {
    const chunks = new Map([
      ['page.js', { imports: ['charts.js', 'shared.js'] }],
      ['charts.js', { imports: ['shared.js', 'entry.js'] }],
      ['shared.js', { imports: ['entry.js'] }],
      ['entry.js', { imports: ['page.js'] }],
    ]);
    expect(chunkClosure(chunks, 'page.js')).toEqual(['page.js', 'charts.js', 'shared.js', 'entry.js']);
  });
});

describe('preloadScript', () => {
  it('when the address matches a route, then that route\'s files get modulepreload links, and only those', () => {
    const added: { rel: string; href: string; crossOrigin: string | null }[] = [];
    const document = {
      createElement: () => ({ rel: '', href: '', crossOrigin: null as string | null }),
      head: { appendChild: (l: (typeof added)[number]) => added.push(l) },
    };
    const script = preloadScript([
      { source: routePatternSource('/traces/:traceId'), files: ['/assets/trace.js', '/assets/charts.js'] },
      { source: routePatternSource('/circuits/:circuitId'), files: ['/assets/circuit.js'] },
    ]);
    new Function('location', 'document', script)({ pathname: '/traces/t1' }, document);
    expect(added).toEqual([
      { rel: 'modulepreload', href: '/assets/trace.js', crossOrigin: '' },
      { rel: 'modulepreload', href: '/assets/charts.js', crossOrigin: '' },
    ]);
    added.length = 0;
    new Function('location', 'document', script)({ pathname: '/sign-in' }, document);
    expect(added).toEqual([]);
  });
});
