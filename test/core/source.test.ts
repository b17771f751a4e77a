/** The output content hash that tells whether a source output changed. */
import { describe, expect, it } from 'vitest';
import { hashBundle } from '../../src/core/source';

describe('hashBundle', () => {
  it('should not depend on key order', () => {
    expect(hashBundle({ 'text/plain': 'a', 'text/html': '<b>' })).toBe(hashBundle({ 'text/html': '<b>', 'text/plain': 'a' }));
  });
  it('should change when any payload changes', () => {
    const base = hashBundle({ 'text/plain': 'T  M\n1  2' });
    expect(hashBundle({ 'text/plain': 'T  M\n1  3' })).not.toBe(base);
    expect(hashBundle({ 'text/plain': 'T  M\n1  2', 'text/html': '' })).not.toBe(base);
  });
  it('should hash JSON payloads by content', () => {
    const a = hashBundle({ 'application/json': { data: [1, 2] } });
    expect(hashBundle({ 'application/json': { data: [1, 2] } })).toBe(a);
    expect(hashBundle({ 'application/json': { data: [2, 1] } })).not.toBe(a);
  });
  it('should give a 16-hex-digit string, also for an empty bundle', () => {
    expect(hashBundle({})).toMatch(/^[0-9a-f]{16}$/);
  });
});
