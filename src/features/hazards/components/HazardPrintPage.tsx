import { useEffect } from 'react';
import { Link, useParams } from 'react-router-dom';
import { Button } from '../../../components/ui/Button';
import { Notice } from '../../../components/ui/Notice';
import { Loading, Page } from '../../../components/ui/Page';
import { Time } from '../../../components/ui/Time';
import { byPrecedence, MITIGATION_KIND_INFO } from '../../../domain/hazards/mitigation';
import { ROLE_LABELS } from '../../../domain/people/roles';
import { errorMessage } from '../../../lib/api';
import { formatDateTime } from '../../../lib/dates';
import type { HazardDto } from '../../../contract/hazards';
import { formatBytes } from '../../../contract/uploads';
import { useHazard } from '../api/getHazard';
import { useHazards } from '../api/listHazards';
import { VERIFICATION_LABELS } from '../lib/labels';
import { HazardFacts } from './HazardFacts';
import { StatusBadge } from './StatusBadge';
import { ACCEPTANCE_CAUTION } from './StatusPanel';

/**
 * A printable hazard report: paper colours and no app chrome under @media print (styles.css), one
 * hazard per printed page (.hf-print-page breaks after itself).
 */
export function HazardPrintPage() {
  const { id } = useParams();
  const numeric = id && /^[1-9]\d{0,8}$/.test(id) ? Number(id) : 0;
  const hazard = useHazard(numeric);
  useEffect(() => {
    if (hazard.data) document.title = `${hazard.data.code} hazard report · Holdfire`;
  }, [hazard.data]);

  if (hazard.isPending) return <Loading label="Loading hazard…" />;
  if (hazard.isError)
    return (
      <Page title="Hazard report" kicker="Hazards">
        <Notice tone="danger" title="Could not load this hazard">
          <p>{errorMessage(hazard.error)}</p>
        </Notice>
      </Page>
    );
  const h = hazard.data;
  return (
    <div>
      <div className="hf-no-print mb-4 flex flex-wrap gap-2">
        <Button variant="primary" onClick={() => window.print()}>
          Print this report
        </Button>
        <Link to={`/hazards/${h.id}`} className="self-center">
          Back to the hazard
        </Link>
      </div>
      <HazardReport hazard={h} />
    </div>
  );
}

/** Every hazard in the register, one per printed page, in register order. */
export function HazardRegisterPrintPage() {
  const hazards = useHazards();
  useEffect(() => {
    document.title = 'Hazard register report · Holdfire';
  }, []);
  if (hazards.isPending) return <Loading label="Loading hazards…" />;
  if (hazards.isError)
    return (
      <Page title="Hazard register report" kicker="Hazards">
        <Notice tone="danger" title="Could not load the register">
          <p>{errorMessage(hazards.error)}</p>
        </Notice>
      </Page>
    );
  return (
    <div>
      <div className="hf-no-print mb-4 flex flex-wrap items-center gap-3">
        <h1 className="sr-only">Hazard register report</h1>
        <Button variant="primary" onClick={() => window.print()}>
          Print {hazards.data.length} hazard reports
        </Button>
        <Link to="/hazards">Back to the register</Link>
      </div>
      {hazards.data.map((h) => (
        <HazardReport key={h.id} hazard={h} headingLevel={2} />
      ))}
    </div>
  );
}

export function HazardReport({ hazard: h, headingLevel = 1 }: { hazard: HazardDto; headingLevel?: 1 | 2 }) {
  const Heading = headingLevel === 1 ? 'h1' : 'h2';
  const Sub = headingLevel === 1 ? 'h2' : 'h3';
  return (
    <article className="hf-print-page mb-10 flex flex-col gap-4">
      <div className="border-b-4 border-line pb-2">
        <p className="text-sm font-bold uppercase tracking-wider text-ink-muted">Hazard report · printed from Holdfire</p>
        <Heading className="text-3xl font-bold">
          {h.code} {h.title}
        </Heading>
        <p className="mt-1">
          <StatusBadge status={h.status} />
        </p>
      </div>
      <HazardFacts hazard={h} />
      <section className="hf-print-avoid-break">
        <Sub className="mb-2 text-2xl font-bold">Mitigations</Sub>
        {h.mitigations.length === 0 ? (
          <p>None recorded.</p>
        ) : (
          <div role="region" aria-label={`Mitigations of ${h.code}`} tabIndex={0} className="overflow-x-auto">
          <table className="w-full min-w-[32rem] border-collapse text-left print:min-w-0">
            <thead>
              <tr>
                <th scope="col" className="border-2 border-line p-2">
                  Kind
                </th>
                <th scope="col" className="border-2 border-line p-2">
                  Mitigation
                </th>
                <th scope="col" className="border-2 border-line p-2">
                  Owner
                </th>
                <th scope="col" className="border-2 border-line p-2">
                  Verification
                </th>
              </tr>
            </thead>
            <tbody>
              {byPrecedence(h.mitigations).map((m) => (
                <tr key={m.id} className="align-top">
                  <td className="border-2 border-line p-2">
                    {MITIGATION_KIND_INFO[m.kind].precedence}. {MITIGATION_KIND_INFO[m.kind].label}
                  </td>
                  <td className="border-2 border-line p-2">{m.description}</td>
                  <td className="border-2 border-line p-2">{m.owner}</td>
                  <td className="border-2 border-line p-2">
                    {VERIFICATION_LABELS[m.verificationStatus]}
                    {m.verificationMethod ? ` — ${m.verificationMethod}` : ''}
                    {m.evidence.length ? (
                      <ul className="mt-1 list-disc pl-5 text-sm">
                        {m.evidence.map((ev) => (
                          <li key={ev.id}>
                            Evidence: {ev.label}
                            {ev.file ? ` (${ev.file.name}, ${formatBytes(ev.file.sizeBytes)})` : ' (frozen calculation)'}, {formatDateTime(ev.createdAt)}
                          </li>
                        ))}
                      </ul>
                    ) : null}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
          </div>
        )}
      </section>
      <section className="hf-print-avoid-break">
        <Sub className="mb-2 text-2xl font-bold">Acceptance</Sub>
        {h.acceptanceProgress ? (
          <p>
            Required: {h.acceptanceProgress.requiredRoles.map((r) => ROLE_LABELS[r]).join(', ')}.{' '}
            {h.acceptanceProgress.complete ? 'All recorded.' : `Missing: ${h.acceptanceProgress.missingRoles.map((r) => ROLE_LABELS[r]).join(', ')}.`}
          </p>
        ) : (
          <p>No residual risk assessed yet.</p>
        )}
        {h.acceptances.length ? (
          <ul className="list-disc pl-6">
            {h.acceptances.map((a) => (
              <li key={`${a.userId}-${a.role}`}>
                {a.userName} as {ROLE_LABELS[a.role]}, <Time value={a.at} />
              </li>
            ))}
          </ul>
        ) : null}
        <p className="mt-2 border-2 border-line p-2 text-sm">{ACCEPTANCE_CAUTION}</p>
      </section>
    </article>
  );
}
