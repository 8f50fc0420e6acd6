import { describe, expect, it } from 'vitest';
import { formatBytes, formatDuration, formatValue } from './format';

describe('formatDuration', () => {
  it('when a duration rounds up to a whole minute or hour, then it carries over', () => {
    expect(formatDuration(239.95)).toBe('4 min 00 s');
    expect(formatDuration(3599.8)).toBe('1 h 00 min');
    expect(formatDuration(7170)).toBe('2 h 00 min');
  });

  it('when short, then milliseconds or seconds with decimals', () => {
    expect(formatDuration(0.853)).toBe('853 ms');
    expect(formatDuration(1.5886)).toBe('1.59 s');
    expect(formatDuration(null)).toBe('–');
  });
});

describe('formatValue and formatBytes', () => {
  it('when a value is missing or not finite, then an en dash shows instead of NaN', () => {
    expect(formatValue(null, 'A')).toBe('–');
    expect(formatValue(Number.NaN, 'A')).toBe('–');
  });

  it('when bytes grow, then the unit steps by 1024', () => {
    expect(formatBytes(512)).toBe('512 B');
    expect(formatBytes(1536)).toMatch(/^1[.,]5 KB$/);
  });
});
