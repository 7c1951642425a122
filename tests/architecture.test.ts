import { expect, test } from 'vitest';
import { importViolations } from './support/check-imports';

test('imports flow one way: shared → server or src, never between server and src or between client features', () => {
  expect(importViolations()).toEqual([]);
});
