import { Fragment } from 'react';
import type { MailMessage } from '../../../contract/people';
import { Button } from '../../../components/ui/Button';
import { Notice } from '../../../components/ui/Notice';
import { Loading, Page } from '../../../components/ui/Page';
import { Time } from '../../../components/ui/Time';
import { errorMessage } from '../../../lib/api';
import { useOutbox } from '../api/listOutbox';

export function MailOutboxPage() {
  const outbox = useOutbox();

  return (
    <Page
      title="Mail outbox"
      kicker="Administration"
      lead={
        <p>
          Mail this install sent, as caught by its built-in local mail server, newest first. While there is no real mail server,
          invitation and password-reset links can be copied from here and passed on in person.
        </p>
      }
      actions={
        <Button onClick={() => void outbox.refetch()} pending={outbox.isFetching && !outbox.isPending} pendingLabel="Refreshing…">
          Refresh
        </Button>
      }
    >
      {outbox.isPending ? (
        <Loading label="Loading mail…" />
      ) : outbox.isError ? (
        <Notice tone="danger" title="Could not load the outbox">
          <p>{errorMessage(outbox.error)}</p>
        </Notice>
      ) : outbox.data.length === 0 ? (
        <Notice title="No mail yet">
          <p>Invitations and password resets will appear here when they are sent.</p>
        </Notice>
      ) : (
        <>
          <p className="mb-3 text-ink-muted" role="status">
            {outbox.data.length === 1 ? '1 message' : `${outbox.data.length} messages`}
          </p>
          <ol className="flex flex-col gap-4">
            {outbox.data.map((message) => (
              <MailItem key={message.id} message={message} />
            ))}
          </ol>
        </>
      )}
    </Page>
  );
}

function MailItem({ message }: { message: MailMessage }) {
  return (
    <li className="rounded-md border-2 border-line bg-surface p-4">
      <article aria-label={message.subject}>
        <h2 className="text-xl font-bold leading-snug">{message.subject}</h2>
        <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1">
          <dt className="font-bold">To</dt>
          <dd className="break-all">{message.to}</dd>
          <dt className="font-bold">Sent</dt>
          <dd>
            <Time value={message.sentAt} seconds relative />
          </dd>
        </dl>
        <details className="group mt-3">
          <summary className="inline-flex min-h-12 items-center gap-2 rounded-md border-2 border-line px-3 font-bold hover:bg-selected">
            <span aria-hidden="true" className="inline-block transition-transform group-open:rotate-90 motion-reduce:transition-none">
              ▶
            </span>
            Message text
          </summary>
          <pre className="mt-3 overflow-x-auto whitespace-pre-wrap break-words rounded-md border-2 border-line-soft bg-sunken p-3 font-sans text-base">
            <Linkified text={message.text} />
          </pre>
        </details>
      </article>
    </li>
  );
}

const URL_PATTERN = /(https?:\/\/[^\s<>"]+)/g;

/** Links in mail (invitation, reset) become real links, so the outbox is usable for onboarding. */
function Linkified({ text }: { text: string }) {
  const parts = text.split(URL_PATTERN);
  return (
    <>
      {parts.map((part, index) =>
        index % 2 === 1 ? (
          <a key={index} href={part} className="break-all font-bold">
            {part}
          </a>
        ) : (
          <Fragment key={index}>{part}</Fragment>
        ),
      )}
    </>
  );
}
