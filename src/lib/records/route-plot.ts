import { existsSync } from 'node:fs';
import { Resvg } from '@resvg/resvg-js';
import type { CaseResult } from '../calc/bonding/results';

const COLOURS = ['#a4522a', '#1f5f8b', '#2f6b3a', '#7a4ca0', '#b07d00', '#4a5668', '#c2185b', '#00796b', '#5d4037'];
const FONT_CANDIDATES = ['/usr/share/fonts/truetype/dejavu/DejaVuSans.ttf', '/usr/share/fonts/truetype/liberation/LiberationSans-Regular.ttf'];

const esc = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;');

/** The along-route voltage plot of one case as SVG, with the limit drawn and link boxes marked. */
export function routePlotSvg(c: CaseResult, limitV: number | null, width: number, height: number): string {
  const m = { left: 90, right: 30, top: 30, bottom: 70 };
  const xs = c.profile.chainageM;
  const xMax = xs[xs.length - 1] || 1;
  const values = c.profile.series.flatMap((s) => s.voltageV.filter((v): v is number => v !== null));
  const yMax = niceCeiling(Math.max(limitV ?? 0, ...values, 1e-9) * 1.1);
  const px = (x: number) => m.left + (x / xMax) * (width - m.left - m.right);
  const py = (y: number) => height - m.bottom - (y / yMax) * (height - m.top - m.bottom);
  const parts: string[] = [`<rect width="${width}" height="${height}" fill="#ffffff"/>`];
  for (let k = 0; k <= 5; k++) {
    const y = (yMax * k) / 5;
    parts.push(`<line x1="${m.left}" x2="${width - m.right}" y1="${py(y)}" y2="${py(y)}" stroke="#e4dfd4"/>`);
    parts.push(`<text x="${m.left - 10}" y="${py(y) + 6}" font-size="18" text-anchor="end">${formatTick(y)}</text>`);
  }
  for (let k = 0; k <= 5; k++) {
    const x = (xMax * k) / 5;
    parts.push(`<text x="${px(x)}" y="${height - m.bottom + 28}" font-size="18" text-anchor="middle">${formatTick(x)}</text>`);
  }
  for (const p of c.points) parts.push(`<line x1="${px(p.chainageM)}" x2="${px(p.chainageM)}" y1="${height - m.bottom}" y2="${height - m.bottom - 14}" stroke="#16202e" stroke-width="2"/>`);
  c.profile.series.forEach((s, i) => {
    let d = '';
    s.voltageV.forEach((v, k) => {
      if (v === null) return;
      d += `${d && s.voltageV[k - 1] !== null ? 'L' : 'M'}${px(xs[k]).toFixed(1)},${py(v).toFixed(1)}`;
    });
    parts.push(`<path d="${d}" fill="none" stroke="${COLOURS[i % COLOURS.length]}" stroke-width="2.5"${s.kind === 'ecc' ? ' stroke-dasharray="2 4"' : ''}/>`);
    parts.push(`<text x="${width - m.right - 8}" y="${m.top + 22 * (i + 1)}" font-size="16" text-anchor="end" fill="${COLOURS[i % COLOURS.length]}">${esc(s.label)}</text>`);
  });
  if (limitV !== null) {
    parts.push(`<line x1="${m.left}" x2="${width - m.right}" y1="${py(limitV)}" y2="${py(limitV)}" stroke="#b3261e" stroke-width="2.5" stroke-dasharray="12 8"/>`);
    parts.push(`<text x="${m.left + 8}" y="${py(limitV) - 8}" font-size="16" fill="#b3261e">limit ${formatTick(limitV)} V (to local earth)</text>`);
  }
  parts.push(`<line x1="${m.left}" x2="${width - m.right}" y1="${height - m.bottom}" y2="${height - m.bottom}" stroke="#16202e"/>`);
  parts.push(`<line x1="${m.left}" x2="${m.left}" y1="${m.top}" y2="${height - m.bottom}" stroke="#16202e"/>`);
  parts.push(`<text x="${(width + m.left) / 2}" y="${height - 16}" font-size="18" text-anchor="middle">distance along the route (m)</text>`);
  parts.push(`<text x="24" y="${(height - m.bottom) / 2}" font-size="18" text-anchor="middle" transform="rotate(-90 24 ${(height - m.bottom) / 2})">voltage to remote earth (V)</text>`);
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" font-family="DejaVu Sans, Liberation Sans, sans-serif" fill="#16202e">${parts.join('')}</svg>`;
}

/** Renders the SVG to PNG for the Word document (fonts from the machine, DejaVu or Liberation). */
export function svgToPng(svg: string): Buffer {
  const fontFiles = FONT_CANDIDATES.filter((f) => existsSync(f));
  return new Resvg(svg, { font: { loadSystemFonts: fontFiles.length === 0, fontFiles, defaultFontFamily: 'DejaVu Sans' } }).render().asPng();
}

function niceCeiling(v: number): number {
  const p = 10 ** Math.floor(Math.log10(v));
  return [1, 2, 2.5, 5, 10].map((k) => k * p).find((c) => c >= v)!;
}

const formatTick = (v: number) => (v >= 100 ? v.toFixed(0) : v >= 10 ? v.toFixed(1) : v.toPrecision(2));
