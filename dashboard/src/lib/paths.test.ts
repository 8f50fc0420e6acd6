import { describe, expect, it } from 'vitest';
import { paths } from './paths';

describe('paths', () => {
  it('when an id has URL-special characters, then the link encodes it', () => {
    expect(paths.site.href('a/b c')).toBe('/sites/a%2Fb%20c');
  });
});
