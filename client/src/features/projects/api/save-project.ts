import type { Project, ProjectInput } from '@shared/schemas/projects';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { projectKeys } from './project-keys';

export function createProject(input: ProjectInput): Promise<Project> {
  return api.post<Project>('/api/projects', input);
}

export function updateProject(id: number, input: Partial<ProjectInput>): Promise<Project> {
  return api.patch<Project>(`/api/projects/${id}`, input);
}

/** Creates a project, or updates it when an id is given; the saved project goes into the cache. */
export function useSaveProject(id?: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ProjectInput) => (id === undefined ? createProject(input) : updateProject(id, input)),
    onSuccess: (project) => {
      queryClient.setQueryData(projectKeys.detail(project.id), project);
      return queryClient.invalidateQueries({ queryKey: projectKeys.list() });
    },
  });
}
