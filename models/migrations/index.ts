import { foundation } from './0001-foundation';
import { samples } from './0002-samples';
import { processingTime } from './0003-processing-time';
import { hardening } from './0004-hardening';
import { notifications } from './0005-notifications';
import { taggers } from './0006-taggers';
import { mail } from './0007-mail';
import { regions } from './0008-regions';
import type { SchemaMigration } from './types';

/** Every schema step in the order it runs. Listed here rather than found on disk so that any loader can run them. */
export const schemaMigrations: readonly SchemaMigration[] = [foundation, samples, processingTime, hardening, notifications, taggers, mail, regions];
