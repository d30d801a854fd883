import { db } from '../db/connection';
import { SITE_SETTINGS_ID } from '@/models/site-setting';

/** The site settings row (the first migration creates it). */
export function siteSettings() {
  return db().models.SiteSetting.findByPk(SITE_SETTINGS_ID, { rejectOnEmpty: true });
}
