import type { QueryClient } from '@tanstack/react-query';
import { createBrowserRouter, type RouteObject } from 'react-router-dom';
import { LoadingState } from '../components/query-states';
import { paths } from '../config/paths';
import { runPaths } from '../features/runs/run-paths';
import { importPaths } from '../features/imports/import-paths';
import { interpretationPaths } from '../features/interpretation/interpretation-paths';
import { instrumentPaths } from '../features/instruments/instrument-paths';
import { rigPaths } from '../features/rigs/rig-paths';
import { AppShell } from './layout/app-shell';
import { requireUser } from './route-guards';
import { AccountRoute } from './routes/account';
import { HomeRoute } from './routes/home';
import { instrumentLoader, InstrumentDetailRoute } from './routes/instrument-detail';
import { EditInstrumentRoute, editInstrumentLoader, InstrumentsRoute, instrumentsLoader, NewInstrumentRoute, newInstrumentLoader } from './routes/instruments';
import { editLocationLoader, EditLocationRoute, newLocationLoader, NewLocationRoute } from './routes/location-form-pages';
import { locationLoader, LocationDetailRoute } from './routes/location-detail';
import { organizationsLoader, OrganizationsRoute } from './routes/organizations';
import { newPlanLoader, NewPlanRoute, planLoader, PlanDetailRoute } from './routes/plan-pages';
import { projectLoader, ProjectDetailRoute } from './routes/project-detail';
import { EditProjectRoute, editProjectLoader, NewProjectRoute, newProjectLoader } from './routes/project-form-pages';
import { projectsLoader, ProjectsRoute } from './routes/projects';
import { rigCheckLoader, RigCheckRoute } from './routes/rig-check';
import { EditRigRoute, NewRigRoute, rigFormLoader, RigsRoute, rigsLoader } from './routes/rigs';
import { importsLoader, ImportsRoute } from './routes/imports';
import { interpretationLoader, InterpretationRoute } from './routes/interpretation';
import { NotFoundRoute, RouteError } from './routes/route-error';
import { RunConsoleRoute, runLoader, runSetupLoader, RunSetupRoute } from './routes/run-pages';
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
            { path: instrumentPaths.instruments.pattern, element: <InstrumentsRoute />, loader: instrumentsLoader(queryClient) },
            { path: instrumentPaths.newInstrument.pattern, element: <NewInstrumentRoute />, loader: newInstrumentLoader(queryClient) },
            { path: instrumentPaths.instrument.pattern, element: <InstrumentDetailRoute />, loader: instrumentLoader(queryClient) },
            { path: instrumentPaths.editInstrument.pattern, element: <EditInstrumentRoute />, loader: editInstrumentLoader(queryClient) },
            { path: rigPaths.rigs.pattern, element: <RigsRoute />, loader: rigsLoader(queryClient) },
            { path: rigPaths.newRig.pattern, element: <NewRigRoute />, loader: rigFormLoader(queryClient) },
            { path: rigPaths.editRig.pattern, element: <EditRigRoute />, loader: rigFormLoader(queryClient) },
            { path: rigPaths.rigCheck.pattern, element: <RigCheckRoute />, loader: rigCheckLoader(queryClient) },
            { path: paths.organizations.pattern, element: <OrganizationsRoute />, loader: organizationsLoader(queryClient) },
            { path: paths.users.pattern, element: <UsersRoute />, loader: usersLoader(queryClient) },
            { path: runPaths.newRun.pattern, element: <RunSetupRoute />, loader: runSetupLoader(queryClient) },
            { path: runPaths.run.pattern, element: <RunConsoleRoute />, loader: runLoader(queryClient) },
            { path: interpretationPaths.interpretation.pattern, element: <InterpretationRoute />, loader: interpretationLoader(queryClient) },
            { path: importPaths.imports.pattern, element: <ImportsRoute />, loader: importsLoader(queryClient) },
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
