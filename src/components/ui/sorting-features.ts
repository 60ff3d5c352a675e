import { createSortedRowModel, rowSortingFeature, tableFeatures } from "@tanstack/react-table";

/** The TanStack Table features of the app's sortable tables: sorting by one column, rows sorted on the client. */
export const sortingFeatures = tableFeatures({ rowSortingFeature, sortedRowModel: createSortedRowModel() });
