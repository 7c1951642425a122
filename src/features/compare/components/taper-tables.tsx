// The figures beside the overlay: per group the mean and spread of m and of the total, per pot the
// fitted law, m, R², largest deviation, total and its deviation, end resistances.
import type { CompareGroup } from '@shared/analysis/compare';
import { TAPER_LAW_LABEL } from '@shared/taper/law';
import { Button } from '@/components/ui/button';
import { downloadCsv } from '@/lib/download';
import type { Condition } from '@shared/csv/conditions';
import type { TaperPot } from '../api/types';
import { groupRows, ohms, pct, potRows, signedPct } from './compare-model';

const TH = 'border-b border-paper-edge px-3 py-2 text-left text-xs font-semibold uppercase tracking-wide text-ink-soft';
const THN = `${TH} text-right`;
const TD = 'border-b border-paper-edge/60 px-3 py-1.5';
const TDN = `${TD} num text-right whitespace-nowrap`;

function Swatch({ colour }: { colour?: string }) {
  return <span className="mr-2 inline-block size-2.5 rounded-full align-middle" style={{ background: colour }} aria-hidden="true" />;
}

export function GroupTable({
  groups,
  colours,
  conditions,
}: {
  groups: CompareGroup[];
  colours: Map<string, string>;
  conditions: Condition[];
}) {
  return (
    <div>
      <div className="mb-2 flex flex-wrap items-center justify-between gap-2">
        <h3 className="text-sm font-semibold text-ink">Groups</h3>
        <Button size="sm" onClick={() => downloadCsv(groupRows(groups), 'taper-groups.csv', conditions)}>
          Groups as CSV
        </Button>
      </div>
      <div className="overflow-x-auto rounded-md border border-paper-edge">
        <table className="w-full min-w-[640px] border-collapse text-sm">
          <caption className="sr-only">
            Mean and spread of the fitted mid-rotation value m and of the total resistance for each group
          </caption>
          <thead className="bg-paper-deep/60">
            <tr>
              <th scope="col" className={TH}>
                Group
              </th>
              <th scope="col" className={THN}>
                Pots
              </th>
              <th scope="col" className={THN}>
                m mean
              </th>
              <th scope="col" className={THN}>
                m SD
              </th>
              <th scope="col" className={THN}>
                m range
              </th>
              <th scope="col" className={THN}>
                Total mean
              </th>
              <th scope="col" className={THN}>
                Total SD
              </th>
              <th scope="col" className={THN}>
                Total range
              </th>
            </tr>
          </thead>
          <tbody>
            {groups.map((g) => (
              <tr key={g.key}>
                <th scope="row" className={`${TD} text-left font-medium`}>
                  <Swatch colour={colours.get(g.key)} />
                  {g.label}
                </th>
                <td className={TDN}>{g.partIds.length}</td>
                <td className={TDN}>{pct(g.m?.mean)}</td>
                <td className={TDN}>{pct(g.m?.sd, 2)}</td>
                <td className={TDN}>
                  {pct(g.m?.min)} – {pct(g.m?.max)}
                </td>
                <td className={TDN}>{ohms(g.total?.mean)}</td>
                <td className={TDN}>{ohms(g.total?.sd)}</td>
                <td className={TDN}>
                  {ohms(g.total?.min)} – {ohms(g.total?.max)}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p className="mt-1 text-xs text-ink-soft">SD is the sample standard deviation (n − 1); a group of one pot has none.</p>
    </div>
  );
}

export function PotTable({
  pots,
  colours,
  groupLabel,
  conditions,
}: {
  pots: TaperPot[];
  colours: Map<string, string>;
  groupLabel: (p: TaperPot) => string;
  conditions: Condition[];
}) {
  return (
    <div>
      <div className="mb-2 flex flex-wrap items-center justify-between gap-2">
        <h3 className="text-sm font-semibold text-ink">Pots ({pots.length})</h3>
        <Button size="sm" onClick={() => downloadCsv(potRows(pots, groupLabel), 'taper-fits.csv', conditions)}>
          Fits as CSV
        </Button>
      </div>
      <div className="max-h-[28rem] overflow-auto rounded-md border border-paper-edge">
        <table className="w-full min-w-[860px] border-collapse text-sm">
          <caption className="sr-only">Fitted taper of each pot in the comparison</caption>
          <thead className="sticky top-0 bg-paper-deep">
            <tr>
              <th scope="col" className={TH}>
                Part
              </th>
              <th scope="col" className={TH}>
                Group
              </th>
              <th scope="col" className={TH}>
                Law
              </th>
              <th scope="col" className={THN}>
                m
              </th>
              <th scope="col" className={THN}>
                R²
              </th>
              <th scope="col" className={THN}>
                Max dev.
              </th>
              <th scope="col" className={THN}>
                Total
              </th>
              <th scope="col" className={THN}>
                Total dev.
              </th>
              <th scope="col" className={THN}>
                End R (0)
              </th>
              <th scope="col" className={THN}>
                End R (full)
              </th>
            </tr>
          </thead>
          <tbody>
            {pots.map((p) => (
              <tr key={p.partId}>
                <th scope="row" className={`${TD} text-left font-medium whitespace-nowrap`}>
                  {p.label}
                </th>
                <td className={`${TD} whitespace-nowrap`}>
                  <Swatch colour={colours.get(p.group)} />
                  {groupLabel(p)}
                </td>
                <td className={TD}>{TAPER_LAW_LABEL[p.fit.law]}</td>
                <td className={TDN}>{pct(p.fit.m)}</td>
                <td className={TDN}>{p.fit.r2.toFixed(4)}</td>
                <td className={TDN}>{pct(p.fit.maxPct / 100, 2)}</td>
                <td className={TDN}>{ohms(p.fit.total)}</td>
                <td className={TDN}>{signedPct(p.fit.totalDeviationPct)}</td>
                <td className={TDN}>{ohms(p.fit.endResistance.start)}</td>
                <td className={TDN}>{ohms(p.fit.endResistance.end)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
