import { Link, useParams } from 'react-router-dom';
import type { PropellantDto } from '../../../contract/hazards';
import { Badge } from '../../../components/ui/Badge';
import { Glyph } from '../../../components/ui/Glyph';
import { Notice } from '../../../components/ui/Notice';
import { Loading, Page, Section } from '../../../components/ui/Page';
import { Time } from '../../../components/ui/Time';
import { errorMessage } from '../../../lib/api';
import { usePropellant } from '../api/getPropellant';
import { usePropellants } from '../api/listPropellants';
import { HazardsNav } from './HazardsNav';

const ROLE_WORDS: Record<PropellantDto['role'], string> = {
  oxidiser: 'Oxidiser',
  fuel: 'Fuel',
  pressurant: 'Pressurant',
  'inert-cryogen': 'Inert cryogen',
};
const STATE_WORDS: Record<PropellantDto['state'], string> = {
  'cryogenic-liquid': 'Cryogenic liquid',
  liquid: 'Liquid',
  'liquefied-gas': 'Liquefied gas under pressure',
  'compressed-gas': 'Compressed gas',
};
const BASIS_WORDS: Record<string, string> = {
  F: 'Found in the named source',
  F2: 'Found in a secondary copy of the source',
  M: 'From memory, not yet checked',
  D: 'Derived by arithmetic',
};

function formatValue(value: number | readonly [number, number]): string {
  return Array.isArray(value) ? `${value[0]} to ${value[1]}` : String(value);
}

export function PropellantLibraryPage() {
  const list = usePropellants();
  return (
    <Page
      title="Propellant library"
      kicker="Hazards"
      lead="Physical properties with the source of each value, and the handling warnings, cautions and PPE for the propellants and pressurants used on the stand."
    >
      <HazardsNav />
      {list.isPending ? <Loading label="Loading the library…" /> : null}
      {list.isError ? (
        <Notice tone="danger" title="Could not load the library">
          <p>{errorMessage(list.error)}</p>
        </Notice>
      ) : null}
      {list.data ? (
        <ul className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
          {list.data.map((p) => {
            const warnings = p.cautions.filter((c) => c.severity === 'warning').length;
            const cautions = p.cautions.length - warnings;
            return (
              <li key={p.id} className="rounded-md border-2 border-line bg-surface p-4">
                <h2 className="text-xl font-bold">
                  <Link to={`/hazards/propellants/${p.id}`}>{p.name}</Link>
                </h2>
                <p className="text-ink-muted">
                  {ROLE_WORDS[p.role]} · {STATE_WORDS[p.state]}
                </p>
                <p className="mt-2 flex flex-wrap gap-2">
                  <Badge tone="danger" glyph="diamond">
                    {warnings} {warnings === 1 ? 'warning' : 'warnings'}
                  </Badge>
                  <Badge tone="caution" glyph="triangle">
                    {cautions} {cautions === 1 ? 'caution' : 'cautions'}
                  </Badge>
                  {p.cautionsEdited ? <Badge glyph="person">Edited by your team</Badge> : null}
                </p>
              </li>
            );
          })}
        </ul>
      ) : null}
    </Page>
  );
}

export function PropellantPage() {
  const { id = '' } = useParams();
  const p = usePropellant(id);
  if (p.isPending) return <Loading label="Loading…" />;
  if (p.isError)
    return (
      <Page title="Propellant" kicker="Propellant library">
        <Notice tone="danger" title="Could not load this propellant">
          <p>{errorMessage(p.error)}</p>
        </Notice>
        <p className="mt-4">
          <Link to="/hazards/propellants">Back to the library</Link>
        </p>
      </Page>
    );
  const d = p.data;
  const warnings = d.cautions.filter((c) => c.severity === 'warning');
  const cautions = d.cautions.filter((c) => c.severity === 'caution');
  return (
    <Page title={d.name} kicker="Propellant library">
      <HazardsNav />
      <p className="mb-4 text-lg">
        {ROLE_WORDS[d.role]} · {STATE_WORDS[d.state]} · <Link to="/hazards/propellants">Back to the library</Link>
      </p>
      <div className="flex flex-col gap-6">
        <Section title="Properties">
          {/* Phones: one card per property; the table from md up. Only one of the two is displayed. */}
          <ul className="flex flex-col gap-3 md:hidden">
            {d.properties.map((prop) => (
              <li key={prop.key} className="rounded-md border-2 border-line-soft p-3">
                <p className="font-bold">{prop.label}</p>
                <p className="text-lg">
                  {formatValue(prop.value)} {prop.unit}
                </p>
                <p className="text-sm">
                  <span className="font-bold">Source: </span>
                  {prop.source}
                </p>
                <p className="text-sm text-ink-muted">
                  {prop.basis === 'M' ? <Glyph shape="triangle" className="mr-1 size-3.5" /> : null}
                  {BASIS_WORDS[prop.basis] ?? prop.basis}
                </p>
              </li>
            ))}
          </ul>
          <div role="region" aria-labelledby="prop-caption" tabIndex={0} className="overflow-x-auto max-md:hidden">
            <table className="w-full min-w-[36rem] border-collapse text-left">
              <caption id="prop-caption" className="mb-2 text-left text-ink-muted">
                Each value with its unit, source and how sure we are of it.
              </caption>
              <thead className="bg-sunken">
                <tr>
                  <th scope="col" className="p-2">
                    Property
                  </th>
                  <th scope="col" className="p-2">
                    Value
                  </th>
                  <th scope="col" className="p-2">
                    Unit
                  </th>
                  <th scope="col" className="p-2">
                    Source
                  </th>
                </tr>
              </thead>
              <tbody>
                {d.properties.map((prop) => (
                  <tr key={prop.key} className="border-t-2 border-line-soft align-top">
                    <th scope="row" className="p-2 font-bold">
                      {prop.label}
                    </th>
                    <td className="p-2 whitespace-nowrap">{formatValue(prop.value)}</td>
                    <td className="p-2">{prop.unit}</td>
                    <td className="p-2">
                      {prop.source}
                      <span className="block text-sm text-ink-muted">
                        {prop.basis === 'M' ? <Glyph shape="triangle" className="mr-1 size-3.5" /> : null}
                        {BASIS_WORDS[prop.basis] ?? prop.basis}
                      </span>
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </Section>
        <Section title="Warnings: can harm people">
          {warnings.length === 0 ? <p>None listed.</p> : null}
          <ul className="flex flex-col gap-2">
            {warnings.map((c) => (
              <li key={c.key} className="flex gap-2 rounded-md border-2 border-l-8 border-danger bg-danger-wash p-3">
                <Glyph shape="diamond" className="mt-1 size-5 text-danger" />
                <p>
                  <span className="font-bold text-danger">Warning: </span>
                  {c.text}
                </p>
              </li>
            ))}
          </ul>
        </Section>
        <Section title="Cautions: can harm equipment">
          {cautions.length === 0 ? <p>None listed.</p> : null}
          <ul className="flex flex-col gap-2">
            {cautions.map((c) => (
              <li key={c.key} className="flex gap-2 rounded-md border-2 border-l-8 border-caution bg-caution-wash p-3">
                <Glyph shape="triangle" className="mt-1 size-5 text-caution" />
                <p>
                  <span className="font-bold text-caution">Caution: </span>
                  {c.text}
                </p>
              </li>
            ))}
          </ul>
          {d.cautionsEdited ? (
            <p className="mt-3 text-ink-muted">
              Cautions edited by {d.cautionsEditedBy ?? 'your team'}
              {d.cautionsEditedAt ? (
                <>
                  {' '}
                  on <Time value={d.cautionsEditedAt} />
                </>
              ) : null}
              .
            </p>
          ) : null}
        </Section>
        <Section title="Personal protective equipment">
          <ul className="list-disc space-y-1 pl-6">
            {d.ppe.map((item, i) => (
              <li key={i}>{item.text}</li>
            ))}
          </ul>
          <p className="mt-3 text-ink-muted">
            A starting list. Holdfire is a planning and record aid, not a safety authority: your site's rules and its licensed authority decide the PPE.
          </p>
        </Section>
      </div>
    </Page>
  );
}
