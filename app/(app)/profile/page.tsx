import type { Metadata } from 'next';
import { ApiTokensPanel } from '@/components/profile/api-tokens-panel';
import { MailChoicesPanel } from '@/components/profile/mail-choices-panel';
import { ProfileView } from '@/components/profile/profile-view';

export const metadata: Metadata = { title: 'Profile' };

export default function ProfilePage() {
  return (
    <>
      <ProfileView />
      <MailChoicesPanel />
      <ApiTokensPanel />
    </>
  );
}
