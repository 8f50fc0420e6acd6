import { describe, expect, it } from 'vitest';
import { paths, safeNextPath } from './paths';

describe('paths', () => {
  it('when an id has URL-special characters, then the link encodes it', () => {
    expect(paths.site.href('a/b c')).toBe('/sites/a%2Fb%20c');
    expect(paths.trace.href('x?y')).toBe('/traces/x%3Fy');
  });

  it('when the sign-in link carries a return path, then it is encoded in `next`', () => {
    expect(paths.signIn.href('/traces/abc?zoom=1')).toBe('/sign-in?next=%2Ftraces%2Fabc%3Fzoom%3D1');
    expect(paths.signIn.href('/')).toBe('/sign-in');
  });
});

describe('safeNextPath', () => {
  it('when next is a dashboard path, then it is kept', () => {
    expect(safeNextPath('/traces/abc?from=1')).toBe('/traces/abc?from=1');
  });

  it('when next points at another origin or back to sign-in, then it falls back to the start', () => {
    for (const bad of [
      'https://evil.test/',
      '//evil.test',
      '/\\evil.test',
      'traces',
      '/sign-in?next=/x',
      null,
      undefined,
      '',
    ]) {
      expect(safeNextPath(bad)).toBe('/');
    }
  });
});
