/**
 * The route registry. Each page is a lazily loaded module that exports
 * `Component` (and, if it wants, `ErrorBoundary`, `loader`, `handle`), so a
 * page's code is fetched only when someone opens it.
 *
 * To add a signed-in page, add ONE line to `routes`, e.g.
 *   { path: 'pin-cards/:connectorId', roles: ['owner', 'lead', 'tech'], lazy: () => import('@/features/pin-cards/pages/PinCardPage') },
 * `path` is relative to '/'. `roles` left out means every signed-in person.
 * A person whose role is not listed sees a "not open to your role" page.
 * Public pages (no sign-in needed) go in `publicRoutes`.
 */
import type { LazyRouteFunction, RouteObject } from 'react-router';
import type { Role } from '@shared/api/auth';

export interface AppRoute {
  path: string;
  lazy: LazyRouteFunction<RouteObject>;
  roles?: readonly Role[];
}

export const routes: AppRoute[] = [
  { path: 'account', lazy: () => import('@/features/account/AccountPage') },
  { path: 'people', roles: ['owner'], lazy: () => import('@/features/people/PeoplePage') },
  { path: 'outbox', roles: ['owner'], lazy: () => import('@/features/outbox/OutboxPage') },
  { path: 'outbox/:messageId', roles: ['owner'], lazy: () => import('@/features/outbox/OutboxPage') },
  { path: 'repair-orders', lazy: () => import('@/features/repair-orders/pages/OrdersPage') },
  { path: 'repair-orders/new', roles: ['writer', 'lead', 'owner'], lazy: () => import('@/features/repair-orders/pages/NewOrderPage') },
  { path: 'repair-orders/:orderId', lazy: () => import('@/features/repair-orders/pages/OrderPage') },
  { path: 'procedures', lazy: () => import('@/features/repair-orders/pages/ProceduresPage') },
  { path: 'customers', lazy: () => import('@/features/customers/pages/CustomersPage') },
  { path: 'harnesses', lazy: () => import('@/features/drawing/pages/HarnessesPage') },
  { path: 'harnesses/:harnessId/drawing', lazy: () => import('@/features/drawing/pages/DrawingPage') },
  { path: 'pin-cards', lazy: () => import('@/features/pincards/pages/FindPage') },
  { path: 'pin-cards/:harnessId/:revisionId/:connectorId', lazy: () => import('@/features/pincards/pages/PinCardPage') },
  { path: 'walk', lazy: () => import('@/features/pincards/pages/WalkPage') },
  { path: 'bus', roles: ['owner', 'lead', 'tech'], lazy: () => import('@/features/bus/pages/BusPage') },
  { path: 'bus/:harnessId', roles: ['owner', 'lead', 'tech'], lazy: () => import('@/features/bus/pages/BusPage') },
];

export const publicRoutes: Array<Omit<AppRoute, 'roles'>> = [
  { path: 'sign-in', lazy: () => import('@/features/auth/SignInPage') },
  { path: 'forgot-password', lazy: () => import('@/features/auth/ForgotPasswordPage') },
  { path: 'reset-password/:token', lazy: () => import('@/features/auth/ResetPasswordPage') },
  { path: 'r/:token', lazy: () => import('@/features/repair-orders/pages/PublicReportPage') },
  { path: 'invite/:token', lazy: () => import('@/features/auth/AcceptInvitationPage') },
];
