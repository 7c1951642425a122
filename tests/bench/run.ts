// `npm run bench`: every speed figure of docs/computation.md §7 beside its reference, measured in this run.
import { bench as fits } from './fits';
import { bench as harness } from './harness';
import { bench as listen } from './listen';
import { bench as lotReads } from './lot-reads';
import { bench as lotUpload } from './lot-upload';
import type { BenchFigure } from './report';
import { bench as valuesAndLots } from './values-and-lots';

const areas: [string, () => Promise<BenchFigure[]>][] = [
  ['Measurement engine', valuesAndLots],
  ['Fits', fits],
  ['Harness engine', harness],
  ['Listen', listen],
  ['Lot upload', lotUpload],
  ['Lot reads', lotReads],
];

let missed = 0;
// `npm run bench -- "Lot reads"` runs the areas whose title contains the text given.
const only = process.argv[2];
for (const [title, run] of areas.filter(([title]) => !only || title.toLowerCase().includes(only.toLowerCase()))) {
  console.log(`\n## ${title}`);
  for (const f of await run()) {
    if (!f.met) missed++;
    console.log(
      `${f.met ? 'met    ' : 'NOT MET'}  ${f.name}\n         measured ${f.measured}; goal ${f.goal}\n         reference: ${f.reference}`,
    );
  }
}
console.log(`\n${missed === 0 ? 'All goals met.' : `${missed} goal(s) not met on this run (figures depend on the machine's load).`}`);
process.exit(0);
