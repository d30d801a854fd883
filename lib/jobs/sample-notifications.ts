// Tells the uploader that their sample finished or failed (a notification row; the mailer decides how, by their
// choices), in the transaction that records the outcome.
import type { Transaction } from 'sequelize';
import { db } from '@/lib/db/connection';
import { recordNotifications } from '@/lib/notifications/record';

export async function notifySampleOutcome(sampleId: number, outcome: 'finished' | 'failed', transaction: Transaction): Promise<void> {
  const sample = await db().models.Sample.findByPk(sampleId, { transaction });
  if (!sample || sample.uploadedById === null) return;
  const jets = sample.counts ? `: ${sample.counts.jets.toLocaleString('en-GB')} jets` : '';
  const summary =
    outcome === 'finished'
      ? `Your sample “${sample.name}” finished processing${jets}.`
      : `Your sample “${sample.name}” failed: ${sample.error?.message ?? 'no reason recorded'}`;
  await recordNotifications(
    {
      kind: outcome === 'finished' ? 'sample-finished' : 'sample-failed',
      userIds: [sample.uploadedById],
      actorId: null,
      studyId: sample.studyId,
      summary,
      link: `/samples/${sample.id}`,
    },
    transaction,
  );
}
