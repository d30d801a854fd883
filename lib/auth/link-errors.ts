// How a link sent by mail is refused, the same for invitations and password resets: a link that was changed,
// revoked or never made is "not valid" (404); a used or expired one is gone (410).
import { ApiError } from '../api/errors';

export function linkInvalid(what: string): ApiError {
  return new ApiError(404, 'link_invalid', `This ${what} link is not valid: it was changed or mistyped, or it was withdrawn.`);
}

export function linkUsed(what: string): ApiError {
  return new ApiError(410, 'link_used', `This ${what} link was already used; each link works once.`);
}

export function linkExpired(what: string, expiresAt: Date): ApiError {
  return new ApiError(410, 'link_expired', `This ${what} link expired on ${expiresAt.toUTCString()}; ask for a new one.`);
}
