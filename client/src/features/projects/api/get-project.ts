import type { Project } from '@shared/schemas/projects';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { projectKeys } from './project-keys';

export function getProject(id: number, signal?: AbortSignal): Promise<Project> {
  return api.get<Project>(`/api/projects/${id}`, signal);
}

export const projectQueryOptions = (id: number) => queryOptions({ queryKey: projectKeys.detail(id), queryFn: ({ signal }) => getProject(id, signal) });

export function useProject(id: number, options: { enabled?: boolean } = {}) {
  return useQuery({ ...projectQueryOptions(id), ...options });
}
