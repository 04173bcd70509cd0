import type { SensorDatasetDto } from '../../../contract/sensors';
import type { ChannelSummary, Excursion } from '../../../domain/sensors/summary';
import { formatT, formatValue, limitsWords } from './format';

const CELL = "p-2 max-sm:block max-sm:py-1 max-sm:before:font-bold max-sm:before:content-[attr(data-label)_':_']";

function excursionWords(e: Excursion, limit: number | null, unit: string): string {
  const side = e.side === 'high' ? 'Above' : 'Below';
  const until = e.to === null ? 'to the end of the data' : `to ${formatT(e.to)}`;
  return `${side} ${limit === null ? 'the limit' : formatValue(limit, unit)} from ${formatT(e.from)} ${until}; furthest ${formatValue(e.peak, unit)} at ${formatT(e.tPeak)}`;
}

/** The plot in words: per channel its minimum, maximum, when the maximum came, and every limit crossing. */
export function SensorSummaryTable({ dataset, summaries }: { dataset: SensorDatasetDto; summaries: ChannelSummary[] }) {
  return (
    <div className="min-w-0">
      {/* On a phone each row stacks, its cells labelled, so the page never scrolls sideways. */}
      <table className="w-full border-collapse text-left max-sm:block">
        <caption className="mb-2 text-left text-xl font-bold max-sm:block">Each channel in numbers</caption>
        <thead className="max-sm:sr-only">
          <tr className="border-b-2 border-line">
            <th scope="col" className="p-2">Channel</th>
            <th scope="col" className="p-2">Minimum</th>
            <th scope="col" className="p-2">Maximum</th>
            <th scope="col" className="p-2">Limits</th>
            <th scope="col" className="p-2">Limit crossings</th>
          </tr>
        </thead>
        <tbody className="max-sm:block">
          {summaries.map((s) => {
            const c = dataset.channels[s.index]!;
            return (
              <tr key={s.index} className="border-b border-line-soft align-top max-sm:block max-sm:py-2">
                <th scope="row" className="p-2 break-words max-sm:block">
                  {c.name}
                  {c.unit ? ` (${c.unit})` : ''}
                </th>
                <td data-label="Minimum" className={CELL}>{s.min === null ? 'no readings' : `${formatValue(s.min, c.unit)} at ${formatT(s.tMin!)}`}</td>
                <td data-label="Maximum" className={CELL}>{s.max === null ? 'no readings' : `${formatValue(s.max, c.unit)} at ${formatT(s.tMax!)}`}</td>
                <td data-label="Limits" className={CELL}>{limitsWords(c.low, c.high, c.unit)}</td>
                <td data-label="Limit crossings" className={CELL}>
                  {s.excursions.length === 0 ? (
                    c.low === null && c.high === null ? 'no limits set' : 'none: within limits throughout'
                  ) : (
                    <ul className="flex flex-col gap-1">
                      {s.excursions.map((e, i) => (
                        <li key={i}>{excursionWords(e, e.side === 'high' ? c.high : c.low, c.unit)}</li>
                      ))}
                      {s.moreExcursions ? <li>and {s.moreExcursions} more</li> : null}
                    </ul>
                  )}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
