import type { Role } from '../../shared/contracts/common';

export { roles, type Role } from '../../shared/contracts/common';

/** Display label for a role. The server enforces roles; the client only hides. */
export const roleLabel: Record<Role, string> = {
  admin: 'Admin',
  editor: 'Editor',
  setter: 'Setter',
  printer: 'Printer',
};
