// @vitest-environment jsdom
import { describe, expect, it } from 'vitest';
import { csvCell, fileStem, standaloneSvg, toCsv } from './export-chart';

describe('csvCell(value)', () => {
  it('csvCell(value) writes numbers as they are, negative ones included', () => {
    expect(csvCell(-0.25)).toBe('-0.25');
    expect(csvCell(3e-7)).toBe('3e-7');
    expect(csvCell(0)).toBe('0');
  });
  it('csvCell(value) leaves empty cells for null, undefined and non-finite numbers', () => {
    expect(csvCell(null)).toBe('');
    expect(csvCell(undefined)).toBe('');
    expect(csvCell(Number.NaN)).toBe('');
    expect(csvCell(Infinity)).toBe('');
  });
  it('csvCell(value) prefixes text that a spreadsheet would run as a formula with a quote', () => {
    expect(csvCell('=HYPERLINK("x")')).toBe(`"'=HYPERLINK(""x"")"`);
    expect(csvCell('+1')).toBe("'+1");
    expect(csvCell('-2')).toBe("'-2");
    expect(csvCell('@SUM(A1)')).toBe("'@SUM(A1)");
    expect(csvCell('track 7')).toBe('track 7');
  });
  it('csvCell(value) quotes text holding commas, quotes or line ends', () => {
    expect(csvCell('a,b')).toBe('"a,b"');
    expect(csvCell('say "hi"')).toBe('"say ""hi"""');
    expect(csvCell('two\nlines')).toBe('"two\nlines"');
  });
});

describe('toCsv(header, rows)', () => {
  it('toCsv(header, rows) writes a header line and CRLF-terminated rows', () => {
    expect(toCsv(['r (m)', 'n(r) (m⁻³)'], [[0.01, 2000], [0.02, null]])).toBe('r (m),n(r) (m⁻³)\r\n0.01,2000\r\n0.02,\r\n');
  });
  it('toCsv(header, rows) is the header alone for no rows', () => {
    expect(toCsv(['t (s)'], [])).toBe('t (s)\r\n');
  });
});

describe('fileStem(title)', () => {
  it('fileStem(title) keeps ASCII letters and digits joined by hyphens', () => {
    expect(fileStem('Radial density profile n(r)')).toBe('radial-density-profile-n-r');
    expect(fileStem('Velocity, v_x — histogram')).toBe('velocity-v-x-histogram');
    expect(fileStem('⟨⟩')).toBe('figure');
  });
});

describe('standaloneSvg(svg, extras)', () => {
  it('standaloneSvg(svg, extras) wraps the chart with a title and legend and inlines presentation styles', () => {
    document.body.innerHTML = '<svg class="recharts-surface" width="300" height="200"><style>.c{stroke:#ff0000}</style><path class="c" d="M0 0L10 10"/><text>x & y</text></svg>';
    const svg = document.querySelector('svg') as SVGSVGElement;
    const out = standaloneSvg(svg, { title: 'Speed <histogram>', legend: [{ label: 'Gaussian', color: '#0072B2', dashed: true }] });
    expect(out.width).toBe(300);
    expect(out.height).toBe(200 + 28 + 28);
    const doc = new DOMParser().parseFromString(out.markup, 'image/svg+xml');
    expect(doc.querySelector('parsererror')).toBeNull();
    expect(doc.documentElement.getAttribute('viewBox')).toBe('0 0 300 256');
    expect(out.markup).toContain('Speed &lt;histogram&gt;');
    expect(out.markup).toContain('stroke-dasharray="5 3"');
    expect(doc.querySelector('path')?.getAttribute('style')).toContain('stroke');
    expect(doc.querySelectorAll('svg svg')).toHaveLength(1);
  });
});
