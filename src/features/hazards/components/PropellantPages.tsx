import { Link, useNavigate, useParams } from 'react-router-dom';
import type { PropellantDto } from '../../../contract/hazards';
import { Badge } from '../../../components/ui/Badge';
import { buttonClasses } from '../../../components/ui/Button';
import { Glyph } from '../../../components/ui/Glyph';
import { Notice } from '../../../components/ui/Notice';
import { Loading, Page, Section } from '../../../components/ui/Page';
import { Time } from '../../../components/ui/Time';
import { errorMessage } from '../../../lib/api';
import { useSignedInMe } from '../../../lib/session';
import { usePropellant } from '../api/getPropellant';
import { usePropellants } from '../api/listPropellants';
import { HazardsNav } from './HazardsNav';

function CautionAuthority() {
  return (
    <Notice tone="warning" title="Holdfire is not a safety authority">
      <p>
        These cautions and PPE are a starting list kept by your safety officer, each with its source. Your site&apos;s governing code, its licensed
        authority and your team&apos;s practice decide what applies on your stand.
      </p>
    </Notice>
  );
}
import { PropellantCautionEditor } from './PropellantCautionEditor';
import { PropellantCautionHistory } from './PropellantCautionHistory';

/** The server lets only the safety officer edit cautions; admins do not override them. */
const canEditCautions = (roles: readonly string[]) => roles.includes('safety');

function Source({ text }: { text: string }) {
  return (
    <span className="mt-1 block text-sm text-ink">
      <span className="font-bold">Source: </span>
      {text}
    </span>
  );
}

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
  const me = useSignedInMe();
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
    <Page
      title={d.name}
      kicker="Propellant library"
      actions={
        canEditCautions(me.roles) ? (
          <Link to={`/hazards/propellants/${d.id}/cautions`} className={buttonClasses('primary')}>
            Edit cautions and PPE
          </Link>
        ) : null
      }
    >
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
        <CautionAuthority />
        <Section title="Warnings: can harm people">
          {warnings.length === 0 ? <p>None listed.</p> : null}
          <ul className="flex flex-col gap-2">
            {warnings.map((c) => (
              <li key={c.key} className="flex gap-2 rounded-md border-2 border-l-8 border-danger bg-danger-wash p-3">
                <Glyph shape="diamond" className="mt-1 size-5 text-danger" />
                <p>
                  <span className="font-bold text-danger">Warning: </span>
                  {c.text}
                  <Source text={c.source} />
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
                  <Source text={c.source} />
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
          {d.ppe.length === 0 ? <p>None listed.</p> : null}
          <ul className="list-disc space-y-2 pl-6">
            {d.ppe.map((item, i) => (
              <li key={i}>
                {item.text}
                <Source text={item.source} />
              </li>
            ))}
          </ul>
          <p className="mt-3 text-ink-muted">
            A starting list. Holdfire is a planning and record aid, not a safety authority: your site's rules and its licensed authority decide the PPE.
          </p>
        </Section>
        <Section title="Changes to cautions and PPE">
          <PropellantCautionHistory propellantId={d.id} />
        </Section>
      </div>
    </Page>
  );
}

/** The safety officer's editor on its own page, so a half-made edit has an address and a way back. */
export function PropellantCautionsPage() {
  const { id = '' } = useParams();
  const me = useSignedInMe();
  const p = usePropellant(id);
  const navigate = useNavigate();
  const back = `/hazards/propellants/${encodeURIComponent(id)}`;
  if (!canEditCautions(me.roles))
    return (
      <Page title="You cannot edit cautions" kicker="403 · Not allowed">
        <Notice tone="warning" title="This page needs another role">
          <p>Only the Safety officer edits the handling cautions and PPE. Everyone signed in can read them and their history.</p>
        </Notice>
        <p className="mt-4">
          <Link to={back}>Back to the propellant</Link>
        </p>
      </Page>
    );
  if (p.isPending) return <Loading label="Loading…" />;
  if (p.isError)
    return (
      <Page title="Edit cautions" kicker="Propellant library">
        <Notice tone="danger" title="Could not load this propellant">
          <p>{errorMessage(p.error)}</p>
        </Notice>
        <p className="mt-4">
          <Link to="/hazards/propellants">Back to the library</Link>
        </p>
      </Page>
    );
  return (
    <Page title={`Cautions and PPE: ${p.data.name}`} kicker="Propellant library">
      <p className="mb-4">
        <Link to={back}>Back to {p.data.name}</Link>
      </p>
      <div className="flex flex-col gap-5">
        <CautionAuthority />
        <PropellantCautionEditor propellant={p.data} onDone={() => navigate(back)} />
      </div>
    </Page>
  );
}
