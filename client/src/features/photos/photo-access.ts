import type { Photo } from '@shared/schemas/photos';
import type { Role, User } from '@shared/schemas/users';
import { useUser } from '../../lib/auth';
import { can } from '../../lib/permissions';

/** Staff see and add photos; clients meet them only in the signed report. */
export const canSeePhotos = (role: Role | null | undefined) => can(role, 'photos:read');

/** Whether the user may edit the caption or kind of this photo, or delete it: engineers and admins any, operators their own. */
export function canChangePhoto(user: Pick<User, 'id' | 'role'> | null | undefined, photo: Pick<Photo, 'uploadedBy'>): boolean {
  if (!user) return false;
  return can(user.role, 'photos:change-any') || (user.role === 'operator' && photo.uploadedBy?.id === user.id);
}

export function useCanSeePhotos(): boolean {
  return canSeePhotos(useUser()?.role);
}
