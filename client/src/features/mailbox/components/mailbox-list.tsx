import { EmptyState } from '../../../components/query-states';
import type { MailboxMessage } from '../api/get-mailbox';

/** Size in kB with one decimal: attachments are mostly tens of kB. */
const kb = (bytes: number) => `${(bytes / 1024).toFixed(1)} kB`;

/** Captured messages, newest first; each opens to its text and attachment list. */
export function MailboxList({ messages }: { messages: MailboxMessage[] }) {
  if (messages.length === 0) return <EmptyState title="No mail yet">Reports sent to clients and run notices land here.</EmptyState>;
  return (
    <ul className="flex flex-col gap-2">
      {messages.map((m) => (
        <li key={m.id} className="rounded-md border-2 border-neutral-300">
          <details>
            <summary className="min-h-touch cursor-pointer px-3 py-2">
              <span className="font-semibold">{m.subject || '(no subject)'}</span>
              <span className="block text-sm text-neutral-800">
                To {m.to.join(', ')} · <span className="font-mono">{m.receivedAt.replace('T', ' ').slice(0, 19)} UTC</span>
                {m.attachments.length > 0 && ` · ${m.attachments.length} attachment${m.attachments.length === 1 ? '' : 's'}`}
              </span>
            </summary>
            <div className="border-t border-neutral-300 px-3 py-2">
              <p className="text-sm">From {m.from}</p>
              <pre className="my-2 font-sans whitespace-pre-wrap">{m.text}</pre>
              {m.attachments.length > 0 && (
                <ul className="list-disc pl-6">
                  {m.attachments.map((a) => (
                    <li key={a.fileName}>
                      <span className="font-mono">{a.fileName}</span> ({a.contentType}, {kb(a.sizeBytes)})
                    </li>
                  ))}
                </ul>
              )}
            </div>
          </details>
        </li>
      ))}
    </ul>
  );
}
