import type { ComponentType } from 'react';
import { Navigate, type RouteObject } from 'react-router-dom';
import { AppFrame } from '../components/AppFrame';
import { LoadingNotice } from '../components/Notice';
import { RequireAuth } from '../components/RequireAuth';
import { RouteError } from '../components/RouteError';
import { prefetchLayoutEditor } from '../api/prefetch';
import { parseId } from '../lib/routeId';

type PageModule = { default: ComponentType };

/** Turns a page module's default export into a lazily loaded route component. */
function page(load: () => Promise<PageModule>): RouteObject['lazy'] {
  return async () => ({ Component: (await load()).default });
}

/**
 * The one route table of the client. Every page is its own module under `src/routes/`, loaded
 * when first visited. A new page adds a child of the signed-in frame here and, if it belongs in
 * the main navigation, an entry in `nav.ts`.
 */
export const routes: RouteObject[] = [
  {
    path: '/sign-in',
    lazy: page(() => import('./SignInPage')),
    errorElement: <RouteError />,
    HydrateFallback: () => <LoadingNotice className="px-8" />,
  },
  {
    path: '/invite/:token',
    lazy: page(() => import('./InvitePage')),
    errorElement: <RouteError />,
    HydrateFallback: () => <LoadingNotice className="px-8" />,
  },
  {
    path: '/',
    element: (
      <RequireAuth>
        <AppFrame />
      </RequireAuth>
    ),
    errorElement: <RouteError />,
    HydrateFallback: () => <LoadingNotice className="px-8" />,
    children: [
      {
        // Errors inside a page keep the frame (navigation, sign-out) around them.
        errorElement: <RouteError />,
        children: [
          { index: true, element: <Navigate to="/projects" replace /> },
          { path: 'projects', lazy: page(() => import('./ProjectsPage')) },
          { path: 'projects/:id', lazy: page(() => import('./ProjectPage')) },
          { path: 'projects/:id/floor-plans/:planId', lazy: page(() => import('./FloorPlanPage')) },
          {
            path: 'projects/:id/layouts/:layoutId',
            // Starts the editor's requests while its code loads (returns at once; the page reads them).
            loader: ({ params }) => {
              const id = parseId(params.layoutId);
              if (id !== null) prefetchLayoutEditor(id);
              return null;
            },
            lazy: page(() => import('./LayoutEditorPage')),
          },
          { path: 'projects/:id/revisions/:revisionId', lazy: page(() => import('./ReviewPage')) },
          { path: 'admin/users', lazy: page(() => import('./AdminUsersPage')) },
          { path: 'admin/invitations', lazy: page(() => import('./InvitePeoplePage')) },
          { path: 'admin/audit', lazy: page(() => import('./AdminAuditPage')) },
          { path: 'admin/mail', lazy: page(() => import('./AdminMailPage')) },
          { path: 'catalogue', lazy: page(() => import('./CataloguePage')) },
          { path: 'catalogue/new', lazy: page(() => import('./ArmModelNewPage')) },
          { path: 'catalogue/:id', lazy: page(() => import('./ArmModelPage')) },
          { path: '*', lazy: page(() => import('./NotFoundPage')) },
        ],
      },
    ],
  },
];
