/** Address of the import page (same shape as config/paths). */
export const importPaths = {
  imports: { pattern: '/imports', href: () => '/imports' },
} as const;
