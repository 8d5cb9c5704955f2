/** Shared test helpers: building the app without a port, and a default fillet body. */
import { buildApp } from '../src/app.js';

export async function app() {
  return buildApp({ config: { DOCS: false } });
}

/** Relative closeness: |a - b| <= tol · |b|. */
export function near(actual: number, expected: number, tol = 1e-3): boolean {
  return Math.abs(actual - expected) <= tol * Math.abs(expected);
}

/** A small RFC 4180 reader: rows of cells, quotes doubled inside quoted cells. */
export function readCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let cell = '';
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i]!;
    if (quoted) {
      if (c === '"' && text[i + 1] === '"') {
        cell += '"';
        i++;
      } else if (c === '"') quoted = false;
      else cell += c;
    } else if (c === '"') quoted = true;
    else if (c === ',') {
      row.push(cell);
      cell = '';
    } else if (c === '\r' && text[i + 1] === '\n') {
      row.push(cell);
      rows.push(row);
      row = [];
      cell = '';
      i++;
    } else cell += c;
  }
  if (cell !== '' || row.length > 0) {
    row.push(cell);
    rows.push(row);
  }
  return rows;
}

