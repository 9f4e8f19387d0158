/**
 * Repair orders: the public surface of the feature. Pages are route modules registered in
 * src/app/routes.ts (`/repair-orders`, `/repair-orders/new`, `/repair-orders/:orderId`,
 * `/procedures`, the public `/r/:token`).
 */
export { useCustomers, useCustomer, useCreateCustomer, useCreateUnit, useOrders, useOrder } from './api';
export { ReadingSetTable } from './components/ReadingSets';
export { StatusTag, StalledTag } from './components/StatusTag';
