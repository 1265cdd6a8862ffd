import { describe, expect, it } from 'vitest';
import { sparklinePoints } from './sparkline-points';
import { headlineRanges } from './headline-ranges';

describe('sparklinePoints(values, points)', () => {
  it('is empty for an empty series', () => expect(sparklinePoints([])).toEqual([]));
  it('keeps a series shorter than the number of points', () => expect(sparklinePoints([3, 1, 2], 32)).toEqual([3, 1, 2]));
  it('averages equal bins', () => expect(sparklinePoints([1, 3, 5, 7, 9, 11], 3)).toEqual([2, 6, 10]));
  it('skips null and NaN and leaves out bins with nothing finite', () => expect(sparklinePoints([null, NaN, 4, 6], 2)).toEqual([5]));
  it('does not mutate its input', () => {
    const v = Float64Array.from([1, 2, 3, 4]);
    sparklinePoints(v, 2);
    expect(Array.from(v)).toEqual([1, 2, 3, 4]);
  });
});

describe('headlineRanges(marked)', () => {
  it('returns plain text and the ranges of the marked words', () =>
    expect(headlineRanges('a \u0002swarm\u0003 of \u0002midges\u0003')).toEqual({ text: 'a swarm of midges', highlights: [[2, 7], [11, 17]] }));
  it('keeps markup-like text as text', () => expect(headlineRanges('<b>x</b> \u0002y\u0003')).toEqual({ text: '<b>x</b> y', highlights: [[9, 10]] }));
  it('drops an unbalanced mark', () => expect(headlineRanges('\u0003a\u0002b')).toEqual({ text: 'ab', highlights: [] }));
});
