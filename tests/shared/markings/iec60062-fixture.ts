// Reads tests/fixtures/iec/iec60062-marking-codes.txt (IEC 60062 compiled from public secondary
// sources; see its first line) into rows: section|key|value|note.
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

export interface Iec60062Row {
  section: string;
  key: string;
  value: string;
  note: string;
}

const path = fileURLToPath(new URL('../../fixtures/iec/iec60062-marking-codes.txt', import.meta.url));

export const IEC60062_TEXT = readFileSync(path, 'utf8');

export const IEC60062_ROWS: Iec60062Row[] = IEC60062_TEXT.split('\n')
  .filter((l) => l.trim() !== '' && !l.startsWith('#'))
  .map((l) => {
    const [section = '', key = '', value = '', ...rest] = l.split('|');
    return { section, key, value, note: rest.join('|') };
  });

export function rows(section: string): Iec60062Row[] {
  return IEC60062_ROWS.filter((r) => r.section === section);
}

/** Value text such as "100 pF", "4.7 kohm", "0.47 ohm", "4.7 nF", "100000 pF = 100 nF" → SI value. */
export function siFromText(text: string): number {
  const m = /^([\d.]+)\s*(pF|nF|uF|ohm|kohm|Mohm)\b/.exec(text.trim());
  if (!m) throw new Error(`unreadable value text in the fixture: ${text}`);
  const scale: Record<string, number> = { pF: -12, nF: -9, uF: -6, ohm: 0, kohm: 3, Mohm: 6 };
  return Number(`${m[1]}e${scale[m[2]!]}`);
}
