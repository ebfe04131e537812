import type { QueryClient } from '@tanstack/react-query';
import { createBrowserRouter, type RouteObject } from 'react-router-dom';
import { LoadingState } from '../components/query-states';
import { paths } from '../config/paths';
import { AppShell } from './layout/app-shell';
import { requireUser } from './route-guards';
import { AccountRoute } from './routes/account';
import { HomeRoute } from './routes/home';
import { editLocationLoader, EditLocationRoute, newLocationLoader, NewLocationRoute } from './routes/location-form-pages';
import { locationLoader, LocationDetailRoute } from './routes/location-detail';
import { organizationsLoader, OrganizationsRoute } from './routes/organizations';
import { newPlanLoader, NewPlanRoute, planLoader, PlanDetailRoute } from './routes/plan-pages';
import { projectLoader, ProjectDetailRoute } from './routes/project-detail';
import { EditProjectRoute, editProjectLoader, NewProjectRoute, newProjectLoader } from './routes/project-form-pages';
import { projectsLoader, ProjectsRoute } from './routes/projects';
import { NotFoundRoute, RouteError } from './routes/route-error';
import { signInLoader, SignInRoute } from './routes/sign-in';
import { signOutAction } from './routes/sign-out';
import { usersLoader, UsersRoute } from './routes/users';

/**
 * Every page. Loaders fill the query cache before a page shows (and stop pages a role may not
 * open); the pages then read the same data through their query hooks.
 */
export function appRoutes(queryClient: QueryClient): RouteObject[] {
  return [
    {
      path: paths.signIn.pattern,
      element: <SignInRoute />,
      loader: signInLoader(queryClient),
      errorElement: <RouteError />,
      hydrateFallbackElement: <LoadingState label="Starting Settlescope…" />,
    },
    { path: paths.signOut.pattern, action: signOutAction(queryClient), errorElement: <RouteError /> },
    {
      element: <AppShell />,
      loader: ({ request }) => requireUser(queryClient, request),
      errorElement: <RouteError />,
      hydrateFallbackElement: <LoadingState label="Starting Settlescope…" />,
      children: [
        {
          // Errors of a page show inside the frame, so the navigation stays usable.
          errorElement: <RouteError />,
          children: [
            { index: true, element: <HomeRoute /> },
            { path: paths.projects.pattern, element: <ProjectsRoute />, loader: projectsLoader(queryClient) },
            { path: paths.newProject.pattern, element: <NewProjectRoute />, loader: newProjectLoader(queryClient) },
            { path: paths.project.pattern, element: <ProjectDetailRoute />, loader: projectLoader(queryClient) },
            { path: paths.editProject.pattern, element: <EditProjectRoute />, loader: editProjectLoader(queryClient) },
            { path: paths.newLocation.pattern, element: <NewLocationRoute />, loader: newLocationLoader(queryClient) },
            { path: paths.location.pattern, element: <LocationDetailRoute />, loader: locationLoader(queryClient) },
            { path: paths.editLocation.pattern, element: <EditLocationRoute />, loader: editLocationLoader(queryClient) },
            { path: paths.newPlan.pattern, element: <NewPlanRoute />, loader: newPlanLoader(queryClient) },
            { path: paths.plan.pattern, element: <PlanDetailRoute />, loader: planLoader(queryClient) },
            { path: paths.organizations.pattern, element: <OrganizationsRoute />, loader: organizationsLoader(queryClient) },
            { path: paths.users.pattern, element: <UsersRoute />, loader: usersLoader(queryClient) },
            { path: paths.account.pattern, element: <AccountRoute /> },
            { path: '*', element: <NotFoundRoute /> },
          ],
        },
      ],
    },
  ];
}

export function createAppRouter(queryClient: QueryClient) {
  return createBrowserRouter(appRoutes(queryClient));
}
