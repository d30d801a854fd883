'use client';

import useSWR from 'swr';
import { sendJson, type ApiError } from '@/lib/api/client';
import { NOTIFICATION_KINDS, NOTIFICATION_KIND_LABELS, type NotificationKind } from '@/models/vocabulary';
import { LoadingBlock } from '../loading-block';
import { Notice } from '../notice';
import { Panel } from '../panel';
import { useAction } from '../use-action';

interface MailChoices {
  kinds: Record<NotificationKind, boolean>;
  digest: boolean;
}

const checkbox = 'mt-0.5 h-4 w-4 accent-accent';

/** Which notifications come by mail, and whether one at a time or as one digest a day. Saved on each change. */
export function MailChoicesPanel() {
  const { data, error, mutate } = useSWR<{ choices: MailChoices }, ApiError>('/api/me/mail');
  const choices = data?.choices;
  // Shown at once (a checkbox follows the click), put back if the server refuses.
  const save = useAction(async (change: { kinds?: Partial<MailChoices['kinds']>; digest?: boolean }) => {
    if (!choices) return;
    const expected = { kinds: { ...choices.kinds, ...change.kinds }, digest: change.digest ?? choices.digest };
    await mutate(() => sendJson<{ choices: MailChoices }>('PATCH', '/api/me/mail', change), {
      optimisticData: { choices: expected },
      rollbackOnError: true,
      revalidate: false,
    });
  });
  return (
    <section id="mail" className="mt-6 max-w-3xl scroll-mt-6">
      <Panel title="Mail" lead="Invitations and password resets always come; choose the rest.">
        {error && <Notice tone="error">{error.message}</Notice>}
        {!choices && !error && <LoadingBlock />}
        {choices && (
          <div className="space-y-4">
            <fieldset className="space-y-2">
              <legend className="mb-1 text-sm font-medium">Mail me when…</legend>
              {NOTIFICATION_KINDS.map((kind) => (
                <label key={kind} className="flex items-start gap-2 text-sm">
                  <input
                    type="checkbox"
                    className={checkbox}
                    checked={choices.kinds[kind]}
                    onChange={(event) => save.run({ kinds: { [kind]: event.target.checked } })}
                  />
                  {NOTIFICATION_KIND_LABELS[kind]}
                </label>
              ))}
            </fieldset>
            <fieldset className="space-y-2 border-t border-ink/10 pt-3">
              <legend className="sr-only">How often</legend>
              <label className="flex items-start gap-2 text-sm">
                <input type="radio" name="digest" className={checkbox} checked={!choices.digest} onChange={() => save.run({ digest: false })} />
                One mail for each event
              </label>
              <label className="flex items-start gap-2 text-sm">
                <input type="radio" name="digest" className={checkbox} checked={choices.digest} onChange={() => save.run({ digest: true })} />
                One digest a day with everything since the last one
              </label>
            </fieldset>
            {save.error && <Notice tone="error">{save.error}</Notice>}
          </div>
        )}
      </Panel>
    </section>
  );
}
