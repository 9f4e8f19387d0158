/** Customers and their units. The page is a route module: `/customers` (src/app/routes.ts). */
export {};
