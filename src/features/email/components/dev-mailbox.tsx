import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Button } from '../../../components/button';
import { ApiError } from '../../../lib/api-client';
import { emailQueries, useClearDevMail } from '../api';
import { DateText } from '../../units/components/date-text';

/** Links in a text part, so a message's verify/reset/unsubscribe link is one click away. */
const linksIn = (text: string | null) => [...new Set(text?.match(/https?:\/\/[^\s<>"]+/g) ?? [])];

function MessageView({ id }: { id: number }) {
  const message = useQuery(emailQueries.devMailMessage(id));
  const [part, setPart] = useState<'html' | 'text'>('html');
  if (message.isLoading) return <p className="text-ink/70">Opening…</p>;
  if (message.error) return <p role="alert">{message.error.message}</p>;
  const m = message.data!;
  const tab = (value: 'html' | 'text', label: string) => (
    <button
      type="button"
      role="tab"
      aria-selected={part === value}
      className={`rounded-md px-3 py-1 text-sm ${part === value ? 'bg-fig-100 font-medium text-fig-700' : 'text-ink/70 hover:bg-fig-50'}`}
      onClick={() => setPart(value)}
    >
      {label}
    </button>
  );
  return (
    <article className="flex min-h-0 flex-col gap-3" aria-label={`Message: ${m.subject}`}>
      <header>
        <h2 className="text-lg font-semibold text-fig-900">{m.subject || '(no subject)'}</h2>
        <p className="text-sm text-ink/70">
          From {m.from} to {m.to} · <DateText iso={m.receivedAt} withTime />
        </p>
      </header>
      <div role="tablist" className="flex gap-1">
        {tab('html', 'HTML part')}
        {tab('text', 'Text part')}
      </div>
      {part === 'html' ? (
        m.html ? (
          // The message's own HTML in a sandbox: no scripts; links open at the top level.
          <iframe title="HTML part" sandbox="allow-top-navigation-by-user-activation" srcDoc={`<base target="_top">${m.html}`} className="h-[32rem] w-full rounded-md border border-fig-100 bg-white" />
        ) : (
          <p className="text-ink/70">This message has no HTML part.</p>
        )
      ) : (
        <pre className="max-h-[32rem] overflow-auto whitespace-pre-wrap rounded-md border border-fig-100 bg-white p-4 font-mono text-sm">{m.text ?? '(no text part)'}</pre>
      )}
      {linksIn(m.text).length > 0 && (
        <div>
          <h3 className="text-sm font-medium">Links in this message</h3>
          <ul className="mt-1 flex flex-col gap-1 text-sm">
            {linksIn(m.text).map((url) => (
              <li key={url}>
                <a className="break-all text-fig-600 underline" href={url}>
                  {url}
                </a>
              </li>
            ))}
          </ul>
        </div>
      )}
    </article>
  );
}

/** Every message the local mail server received, newest first, and the chosen one in full. */
export function DevMailbox() {
  const list = useQuery(emailQueries.devMail());
  const clear = useClearDevMail();
  const [selected, setSelected] = useState<number | null>(null);

  // A failed refresh keeps showing the messages already loaded.
  if (!list.data && list.error instanceof ApiError && list.error.status === 404) {
    return <p className="text-ink/80">The development mailbox is off on this server (it is off in production unless SYCONIUM_DEV_MAIL=true).</p>;
  }
  if (list.isLoading) return <p className="text-ink/70">Loading the mailbox…</p>;
  if (!list.data) return <p role="alert">{list.error?.message ?? 'The mailbox could not be read.'}</p>;
  const messages = list.data!.messages;
  const current = selected ?? messages[0]?.id ?? null;

  return (
    <div className="grid gap-6 md:grid-cols-[minmax(16rem,22rem)_1fr]">
      <div className="flex flex-col gap-3">
        <div className="flex items-center justify-between">
          <p className="text-sm text-ink/70">
            {messages.length} message{messages.length === 1 ? '' : 's'} · refreshes by itself
          </p>
          <Button variant="quiet" disabled={!messages.length || clear.isPending} onClick={() => clear.mutate(undefined, { onSuccess: () => setSelected(null) })}>
            Empty mailbox
          </Button>
        </div>
        {messages.length === 0 ? (
          <p className="rounded-md border border-dashed border-fig-200 p-4 text-sm text-ink/70">No mail yet. Join with a new account or ask for a password reset, and the message appears here.</p>
        ) : (
          <ul className="flex flex-col divide-y divide-fig-100 rounded-lg border border-fig-100 bg-white" aria-label="Messages">
            {messages.map((m) => (
              <li key={m.id}>
                <button
                  type="button"
                  aria-current={m.id === current ? 'true' : undefined}
                  className={`w-full px-3 py-2 text-left ${m.id === current ? 'bg-fig-50' : 'hover:bg-fig-50/60'}`}
                  onClick={() => setSelected(m.id)}
                >
                  <span className="block truncate text-sm font-medium">{m.subject || '(no subject)'}</span>
                  <span className="block truncate text-xs text-ink/70">
                    to {m.to} · <DateText iso={m.receivedAt} withTime />
                  </span>
                </button>
              </li>
            ))}
          </ul>
        )}
      </div>
      {current !== null && <MessageView key={current} id={current} />}
    </div>
  );
}
