import { createBrowserRouter, RouterProvider } from 'react-router';
import { paths } from '@/config/paths.ts';
import { RouteError } from './routes/route-error.tsx';
import { AppLayout } from './layout.tsx';

const router = createBrowserRouter([
  {
    path: paths.signIn.path,
    lazy: () => import('./routes/sign-in.tsx').then((m) => ({ Component: m.SignInRoute })),
    errorElement: <RouteError />,
  },
  {
    path: paths.forgotPassword.path,
    lazy: () => import('./routes/password.tsx').then((m) => ({ Component: m.ForgotPasswordRoute })),
    errorElement: <RouteError />,
  },
  {
    path: paths.resetPassword.path,
    lazy: () => import('./routes/password.tsx').then((m) => ({ Component: m.ResetPasswordRoute })),
    errorElement: <RouteError />,
  },
  {
    // Pages behind sign-in. The frame is part of the first download and draws at once; it checks
    // the session itself (no session → the sign-in page, remembering where the user was going).
    path: '/',
    Component: AppLayout,
    errorElement: <RouteError />,
    children: [
      {
        errorElement: <RouteError />,
        children: [
          { index: true, lazy: () => import('./routes/home.tsx').then((m) => ({ Component: m.HomeRoute })) },
          { path: paths.catalogue.path, lazy: () => import('./routes/catalogue.tsx').then((m) => ({ Component: m.CatalogueRoute })) },
          { path: paths.catalogueBrowse.path, lazy: () => import('./routes/catalogue-browse.tsx').then((m) => ({ Component: m.CatalogueBrowseRoute })) },
          { path: paths.partNew.path, lazy: () => import('./routes/part-edit.tsx').then((m) => ({ Component: m.PartNewRoute })) },
          { path: paths.part.path, lazy: () => import('./routes/part.tsx').then((m) => ({ Component: m.PartRoute })) },
          { path: paths.partEdit.path, lazy: () => import('./routes/part-edit.tsx').then((m) => ({ Component: m.PartEditRoute })) },
          { path: paths.planner.path, lazy: () => import('./routes/planner.tsx').then((m) => ({ Component: m.PlannerRoute })) },
          { path: paths.plans.path, lazy: () => import('./routes/plans.tsx').then((m) => ({ Component: m.SavedPlansRoute })) },
          { path: paths.plan.path, lazy: () => import('./routes/plan.tsx').then((m) => ({ Component: m.SavedPlanRoute })) },
          { path: paths.rangeEdit.path, lazy: () => import('./routes/range-edit.tsx').then((m) => ({ Component: m.RangeEditRoute })) },
          { path: paths.jobs.path, lazy: () => import('./routes/jobs.tsx').then((m) => ({ Component: m.JobsRoute })) },
          { path: paths.jobNew.path, lazy: () => import('./routes/job-new.tsx').then((m) => ({ Component: m.NewJobRoute })) },
          { path: paths.job.path, lazy: () => import('./routes/job.tsx').then((m) => ({ Component: m.JobRoute })) },
          { path: paths.stock.path, lazy: () => import('./routes/stock.tsx').then((m) => ({ Component: m.StockRoute })) },
          { path: paths.stockMovements.path, lazy: () => import('./routes/stock-movements.tsx').then((m) => ({ Component: m.StockMovementsRoute })) },
          { path: paths.stockEntry.path, lazy: () => import('./routes/stock-entry.tsx').then((m) => ({ Component: m.StockEntryRoute })) },
          { path: paths.stockLow.path, lazy: () => import('./routes/stock-low.tsx').then((m) => ({ Component: m.StockLowRoute })) },
          { path: paths.warehouses.path, lazy: () => import('./routes/admin-warehouses.tsx').then((m) => ({ Component: m.AdminWarehousesRoute })) },
          { path: paths.users.path, lazy: () => import('./routes/admin-users.tsx').then((m) => ({ Component: m.AdminUsersRoute })) },
          { path: paths.outbox.path, lazy: () => import('./routes/admin-outbox.tsx').then((m) => ({ Component: m.AdminOutboxRoute })) },
          { path: paths.outboxMessage.path, lazy: () => import('./routes/admin-outbox-message.tsx').then((m) => ({ Component: m.AdminOutboxMessageRoute })) },
          { path: paths.pickQueue.path, lazy: () => import('./routes/pick-queue.tsx').then((m) => ({ Component: m.PickQueueRoute })) },
          { path: paths.pick.path, lazy: () => import('./routes/pick.tsx').then((m) => ({ Component: m.PickRoute })) },
          { path: paths.pickList.path, lazy: () => import('./routes/pick-list.tsx').then((m) => ({ Component: m.PickListRoute })) },
          { path: paths.labels.path, lazy: () => import('./routes/labels.tsx').then((m) => ({ Component: m.LabelsRoute })) },
          { path: paths.handover.path, lazy: () => import('./routes/handover.tsx').then((m) => ({ Component: m.HandoverRoute })) },
          { path: paths.priceLists.path, lazy: () => import('./routes/price-lists.tsx').then((m) => ({ Component: m.PriceListsRoute })) },
          { path: paths.priceList.path, lazy: () => import('./routes/price-list.tsx').then((m) => ({ Component: m.PriceListRoute })) },
          { path: paths.suppliers.path, lazy: () => import('./routes/suppliers.tsx').then((m) => ({ Component: m.SuppliersRoute })) },
          { path: paths.supplier.path, lazy: () => import('./routes/supplier.tsx').then((m) => ({ Component: m.SupplierRoute })) },
          { path: paths.pricing.path, lazy: () => import('./routes/pricing.tsx').then((m) => ({ Component: m.PricingRoute })) },
          { path: paths.reorder.path, lazy: () => import('./routes/reorder.tsx').then((m) => ({ Component: m.ReorderRoute })) },
          { path: paths.purchaseOrders.path, lazy: () => import('./routes/purchase-orders.tsx').then((m) => ({ Component: m.PurchaseOrdersRoute })) },
          { path: paths.purchaseOrder.path, lazy: () => import('./routes/purchase-order.tsx').then((m) => ({ Component: m.PurchaseOrderRoute })) },
          { path: '*', lazy: () => import('./routes/not-found.tsx').then((m) => ({ Component: m.NotFoundRoute })) },
        ],
      },
    ],
  },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
