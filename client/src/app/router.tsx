import type { QueryClient } from '@tanstack/react-query';
import { createBrowserRouter, type RouteObject } from 'react-router-dom';
import { LoadingState } from '../components/query-states';
import { paths } from '../config/paths';
import { AppShell } from './layout/app-shell';
import { requireUser } from './route-guards';
import { AccountRoute } from './routes/account';
import { HomeRoute } from './routes/home';
import { ImportsRoute, importsLoader } from './routes/imports';
import { InstrumentDetailRoute, instrumentLoader } from './routes/instrument-detail';
import { EditInstrumentRoute, editInstrumentLoader, InstrumentsRoute, instrumentsLoader, NewInstrumentRoute, newInstrumentLoader } from './routes/instruments';
import { InterpretationRoute, interpretationLoader } from './routes/interpretation';
import { LocationDetailRoute, locationLoader } from './routes/location-detail';
import { MailboxRoute, mailboxLoader } from './routes/mailbox';
import { EditLocationRoute, editLocationLoader, NewLocationRoute, newLocationLoader } from './routes/location-form-pages';
import { OrganizationsRoute, organizationsLoader } from './routes/organizations';
import { NewPlanRoute, newPlanLoader, PlanDetailRoute, planLoader } from './routes/plan-pages';
import { ProjectDetailRoute, projectLoader } from './routes/project-detail';
import { EditProjectRoute, editProjectLoader, NewProjectRoute, newProjectLoader } from './routes/project-form-pages';
import { ProjectsRoute, projectsLoader } from './routes/projects';
import { ReplayRoute, replayLoader } from './routes/replay';
import { ReportsRoute, reportsLoader } from './routes/reports';
import { DeviceProfilesRoute, deviceProfileFormLoader, deviceProfilesLoader, EditDeviceProfileRoute, NewDeviceProfileRoute } from './routes/device-profiles';
import { RigCheckRoute, rigCheckLoader } from './routes/rig-check';
import { EditRigRoute, NewRigRoute, RigsRoute, rigFormLoader, rigsLoader } from './routes/rigs';
import { NotFoundRoute, RouteError } from './routes/route-error';
import { RunConsoleRoute, RunSetupRoute, runLoader, runSetupLoader } from './routes/run-pages';
import { SignInRoute, signInLoader } from './routes/sign-in';
import { SignoffRoute, signoffLoader } from './routes/signoff';
import { signOutAction } from './routes/sign-out';
import { UsersRoute, usersLoader } from './routes/users';

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
            { path: paths.instruments.pattern, element: <InstrumentsRoute />, loader: instrumentsLoader(queryClient) },
            { path: paths.newInstrument.pattern, element: <NewInstrumentRoute />, loader: newInstrumentLoader(queryClient) },
            { path: paths.instrument.pattern, element: <InstrumentDetailRoute />, loader: instrumentLoader(queryClient) },
            { path: paths.editInstrument.pattern, element: <EditInstrumentRoute />, loader: editInstrumentLoader(queryClient) },
            { path: paths.rigs.pattern, element: <RigsRoute />, loader: rigsLoader(queryClient) },
            { path: paths.newRig.pattern, element: <NewRigRoute />, loader: rigFormLoader(queryClient) },
            { path: paths.editRig.pattern, element: <EditRigRoute />, loader: rigFormLoader(queryClient) },
            { path: paths.rigCheck.pattern, element: <RigCheckRoute />, loader: rigCheckLoader(queryClient) },
            { path: paths.deviceProfiles.pattern, element: <DeviceProfilesRoute />, loader: deviceProfilesLoader(queryClient) },
            { path: paths.newDeviceProfile.pattern, element: <NewDeviceProfileRoute />, loader: deviceProfileFormLoader(queryClient) },
            { path: paths.editDeviceProfile.pattern, element: <EditDeviceProfileRoute />, loader: deviceProfileFormLoader(queryClient) },
            { path: paths.organizations.pattern, element: <OrganizationsRoute />, loader: organizationsLoader(queryClient) },
            { path: paths.users.pattern, element: <UsersRoute />, loader: usersLoader(queryClient) },
            { path: paths.newRun.pattern, element: <RunSetupRoute />, loader: runSetupLoader(queryClient) },
            { path: paths.run.pattern, element: <RunConsoleRoute />, loader: runLoader(queryClient) },
            { path: paths.interpretation.pattern, element: <InterpretationRoute />, loader: interpretationLoader(queryClient) },
            { path: paths.replay.pattern, element: <ReplayRoute />, loader: replayLoader(queryClient) },
            { path: paths.imports.pattern, element: <ImportsRoute />, loader: importsLoader(queryClient) },
            { path: paths.signoff.pattern, element: <SignoffRoute />, loader: signoffLoader(queryClient) },
            { path: paths.reports.pattern, element: <ReportsRoute />, loader: reportsLoader(queryClient) },
            { path: paths.mailbox.pattern, element: <MailboxRoute />, loader: mailboxLoader(queryClient) },
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
