import { QueryTypes } from 'sequelize';
import { z } from 'zod';
import { json, signedInRoute } from '@/lib/api/route-handlers';
import { studyDescriptionSchema, studyTitleSchema } from '@/lib/api/schemas';
import { readJsonBody } from '@/lib/api/validation';
import { studyView } from '@/lib/api/views';
import { db } from '@/lib/db/connection';
import type { StudyRole } from '@/models/vocabulary';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

const newStudySchema = z.strictObject({
  title: studyTitleSchema,
  description: studyDescriptionSchema.optional(),
});

interface StudyListRow {
  id: number;
  title: string;
  description: string;
  myRole: StudyRole | null;
  memberCount: number;
  entryCount: number;
  updatedAt: string;
}

// Member studies; a site admin sees every study, with a null role where not a member.
const STUDY_LIST_SQL = `
  SELECT s.id, s.title, s.description, m.role AS myRole, s.updated_at AS updatedAt,
    (SELECT COUNT(*) FROM memberships x WHERE x.study_id = s.id) AS memberCount,
    (SELECT COUNT(*) FROM entries e WHERE e.study_id = s.id) AS entryCount
  FROM studies s
  LEFT JOIN memberships m ON m.study_id = s.id AND m.user_id = :userId
  WHERE m.id IS NOT NULL OR :isAdmin
  ORDER BY s.updated_at DESC, s.id DESC`;

export const GET = signedInRoute({}, async ({ user }) => {
  const rows = await db().sequelize.query<StudyListRow>(STUDY_LIST_SQL, {
    type: QueryTypes.SELECT,
    replacements: { userId: user.id, isAdmin: user.siteRole === 'admin' ? 1 : 0 },
  });
  const studies = rows.map((row) => ({ ...row, updatedAt: new Date(row.updatedAt) }));
  return json({ studies });
});

export const POST = signedInRoute({}, async ({ request, user }) => {
  const input = await readJsonBody(request, newStudySchema);
  const { models, write } = db();
  const study = await write(async (transaction) => {
    const created = await models.Study.create(input, { transaction });
    await models.Membership.create({ studyId: created.id, userId: user.id, role: 'owner' }, { transaction });
    return created;
  });
  return json({ study: studyView(study) }, 201);
});
