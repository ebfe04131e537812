import type { ListResponse } from '@shared/schemas/common';
import type { Project } from '@shared/schemas/projects';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { projectKeys } from './project-keys';

/** Projects the user may see (a client user sees only their organisation's). */
export async function getProjects(signal?: AbortSignal): Promise<Project[]> {
  return (await api.get<ListResponse<Project>>('/api/projects', signal)).items;
}

export const projectsQueryOptions = () => queryOptions({ queryKey: projectKeys.list(), queryFn: ({ signal }) => getProjects(signal) });

export function useProjects() {
  return useQuery(projectsQueryOptions());
}
