import { Fragment, useState } from 'react';
import { ErrorNotice, Progress } from '../components/Notice';
import { EmptyState, PageHeader, Panel } from '../components/Panel';
import { useMe } from '../features/auth';
import { useCaughtMail, type CaughtMail } from '../features/admin';
import { formatUtc } from '../lib/format';

export default function AdminMail() {
  const me = useMe();
  const isAdmin = me.data?.user.isAdmin === true;
  if (!isAdmin) {
    return (
      <div className="flex flex-col gap-2 py-8">
        <h1 className="text-xl font-semibold text-ink-strong">Mail is for site admins</h1>
        <p className="text-sm text-ink-soft">
          This page lists the messages the local mail catcher received; only site admins see it.
        </p>
      </div>
    );
  }
  return <MailBox />;
}

function MailBox() {
  const mail = useCaughtMail();
  const [openId, setOpenId] = useState<string | null>(null);
  const messages = [...(mail.data ?? [])].sort((a, b) => (b.date ?? '').localeCompare(a.date ?? ''));
  const open = messages.find((m) => m.id === openId) ?? null;

  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        kicker="Site admin"
        title="Mail"
        meta="What the local mail catcher received: invitations, reset links, release notices. Nothing here was delivered to a real inbox."
      />
      <div className="grid gap-5 lg:grid-cols-[minmax(0,26rem)_minmax(0,1fr)]">
        <Panel
          title="Caught messages"
          titleId="caught"
          actions={mail.isSuccess && <span className="font-mono text-xs text-ink-muted">{messages.length}</span>}
        >
          {mail.isPending && <Progress label="Loading the caught mail…" />}
          {mail.isError && (
            <div className="p-4">
              <ErrorNotice error={mail.error} title="The mail could not be loaded" />
            </div>
          )}
          {mail.isSuccess && messages.length === 0 && <EmptyState title="No messages caught yet" />}
          {messages.length > 0 && (
            <ul className="max-h-[36rem] divide-y divide-paper-rule overflow-auto" aria-label="Caught messages">
              {messages.map((m) => (
                <li key={m.id}>
                  <button
                    type="button"
                    onClick={() => setOpenId(m.id)}
                    aria-current={m.id === openId ? 'true' : undefined}
                    className={`block w-full px-4 py-2 text-left hover:bg-ink-wash/50 ${m.id === openId ? 'bg-ink-wash' : ''}`}
                  >
                    <span className="block truncate font-semibold text-ink-strong">{m.subject}</span>
                    <span className="block truncate font-mono text-xs text-ink-soft">to {m.to.join(', ')}</span>
                    <span className="block font-mono text-xs tabular-nums text-ink-muted">{formatUtc(m.date)}</span>
                  </button>
                </li>
              ))}
            </ul>
          )}
        </Panel>
        <Panel title={open ? 'Message' : 'No message open'} titleId="message">
          {open ? <MessageView message={open} /> : <EmptyState title="Open a message to read it" />}
        </Panel>
      </div>
    </div>
  );
}

function MessageView({ message }: { message: CaughtMail }) {
  const [view, setView] = useState<'text' | 'html'>(message.text ? 'text' : 'html');
  return (
    <article aria-label={message.subject}>
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-0.5 border-b border-paper-rule px-4 py-3 text-sm">
        <dt className="text-ink-muted">Subject</dt>
        <dd className="font-semibold text-ink-strong">{message.subject}</dd>
        <dt className="text-ink-muted">From</dt>
        <dd className="font-mono text-[0.8rem]">{message.from}</dd>
        <dt className="text-ink-muted">To</dt>
        <dd className="font-mono text-[0.8rem]">{message.to.join(', ')}</dd>
        <dt className="text-ink-muted">Date</dt>
        <dd className="font-mono text-[0.8rem] tabular-nums">{formatUtc(message.date)}</dd>
      </dl>
      <div role="tablist" aria-label="Message body" className="flex gap-1 border-b border-paper-rule px-4 pt-2">
        {(['text', 'html'] as const).map((v) => (
          <button
            key={v}
            role="tab"
            type="button"
            aria-selected={view === v}
            disabled={v === 'html' ? !message.html : !message.text}
            onClick={() => setView(v)}
            className={`-mb-px border-b-2 px-3 py-1 text-sm disabled:text-ink-faint ${view === v ? 'border-ink font-semibold text-ink-strong' : 'border-transparent text-ink-soft'}`}
          >
            {v === 'text' ? 'Text' : 'HTML'}
          </button>
        ))}
      </div>
      {view === 'text' ? (
        <pre
          className="max-h-[30rem] overflow-auto whitespace-pre-wrap px-4 py-3 font-mono text-[0.8rem] text-ink-strong"
          role="tabpanel"
        >
          <Linkified text={message.text} />
        </pre>
      ) : (
        // No scripts, no same-origin access, no forms: the message is shown, nothing in it runs.
        <iframe
          title="Message as HTML"
          sandbox=""
          srcDoc={message.html}
          className="h-[30rem] w-full bg-white"
          role="tabpanel"
        />
      )}
    </article>
  );
}

/** Make the links in a plain-text message clickable (same-site ones open in place). */
function Linkified({ text }: { text: string }) {
  const parts = text.split(/(https?:\/\/[^\s<>"]+)/g);
  return (
    <>
      {parts.map((part, i) => {
        if (!/^https?:\/\//.test(part)) return <Fragment key={i}>{part}</Fragment>;
        let local: string | null = null;
        try {
          const url = new URL(part);
          if (url.origin === window.location.origin || url.hostname === '127.0.0.1' || url.hostname === 'localhost')
            local = url.pathname + url.search;
        } catch {
          local = null;
        }
        return (
          <a key={i} href={local ?? part} rel="noreferrer noopener" target={local ? undefined : '_blank'}>
            {part}
          </a>
        );
      })}
    </>
  );
}
