import type { Organization } from '@shared/schemas/users';
import { useState } from 'react';
import { Button } from '../../../components/button';
import { EmptyState } from '../../../components/query-states';
import { OrganizationForm } from './organization-form';

interface OrganizationsListProps {
  organizations: Organization[];
  canEdit: boolean;
  onSaved: (organization: Organization) => void;
}

export function OrganizationsList({ organizations, canEdit, onSaved }: OrganizationsListProps) {
  const [editingId, setEditingId] = useState<number | null>(null);
  if (organizations.length === 0) return <EmptyState title="No client organisations yet">{canEdit && 'Add the first one above.'}</EmptyState>;
  return (
    <ul className="flex flex-col divide-y-2 divide-neutral-300 rounded-md border-2 border-neutral-300">
      {organizations.map((o) => (
        <li key={o.id} className="p-3">
          {editingId === o.id ? (
            <OrganizationForm
              organization={o}
              onSaved={(saved) => {
                setEditingId(null);
                onSaved(saved);
              }}
              onCancel={() => setEditingId(null)}
            />
          ) : (
            <div className="flex flex-wrap items-center justify-between gap-2">
              <div>
                <p className="text-lg font-semibold">{o.name}</p>
                <p className="text-neutral-800">{o.contactEmails.length > 0 ? o.contactEmails.join(', ') : 'No report contacts'}</p>
              </div>
              {canEdit && (
                <Button variant="secondary" onClick={() => setEditingId(o.id)} aria-label={`Edit ${o.name}`}>
                  Edit
                </Button>
              )}
            </div>
          )}
        </li>
      ))}
    </ul>
  );
}
