import { describe, expect, it } from 'vitest';
import { parseForm } from './form';

describe('parseForm(body)', () => {
  it('nests brackets, turns numeric keys into arrays and keeps values as strings', () => {
    const body = 'mode=subscription&line_items[0][price]=price_1&line_items[0][quantity]=1&metadata[lab]=x&recurring[interval]=month&expand[]=a&expand[]=b&unit_amount=500';
    expect(parseForm(body)).toEqual({
      mode: 'subscription',
      line_items: [{ price: 'price_1', quantity: '1' }],
      metadata: { lab: 'x' },
      recurring: { interval: 'month' },
      expand: ['a', 'b'],
      unit_amount: '500',
    });
  });

  it('decodes percent-encoding and returns an empty object for an empty body', () => {
    expect(parseForm('success_url=http%3A%2F%2Fx%2Fy%3Fa%3D1')).toEqual({ success_url: 'http://x/y?a=1' });
    expect(parseForm('')).toEqual({});
  });
});
