'use client';

import useSWR from 'swr';
import { sendJson, type ApiError } from '@/lib/api/client';
import { Notice } from '../notice';
import { Panel } from '../panel';
import { useAction } from '../use-action';

interface Settings {
  openSignup: boolean;
}

/** The switch that lets anyone create an account, or only accounts made by an admin. */
export function SignupSetting() {
  const { data, error, mutate } = useSWR<Settings, ApiError>('/api/admin/settings');
  const toggle = useAction(async (openSignup: boolean) => {
    await mutate(sendJson<Settings>('PATCH', '/api/admin/settings', { openSignup }), { revalidate: false });
  });
  const open = data?.openSignup ?? false;

  return (
    <Panel title="Sign-up" className="mb-6">
      <label className="relative flex cursor-pointer items-start gap-3">
        <input
          type="checkbox"
          role="switch"
          className="peer sr-only"
          checked={open}
          disabled={!data || toggle.pending}
          onChange={(event) => toggle.run(event.target.checked)}
        />
        <span
          aria-hidden
          className="relative mt-0.5 h-5 w-9 shrink-0 rounded-full bg-ink/25 transition-colors peer-checked:bg-accent peer-focus-visible:outline-2 peer-focus-visible:outline-offset-2 peer-focus-visible:outline-accent after:absolute after:top-0.5 after:left-0.5 after:h-4 after:w-4 after:rounded-full after:bg-white after:transition-transform peer-checked:after:translate-x-4"
        />
        <span className="text-sm">
          <span className="font-medium">Open sign-up</span>
          <span className="block text-ink-soft">
            {open
              ? 'Anyone who can reach this server can create an account.'
              : 'Closed: the sign-up page refuses new accounts.'}
          </span>
        </span>
      </label>
      {(error || toggle.error) && (
        <Notice tone="error" className="mt-3">
          {error?.message ?? toggle.error}
        </Notice>
      )}
    </Panel>
  );
}
