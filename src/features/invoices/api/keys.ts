/** Query keys of invoices. Invalidate by prefix. */
export const invoiceKeys = {
  all: ['invoices'] as const,
  lists: () => [...invoiceKeys.all, 'list'] as const,
  list: (filters: { status?: string; page: number }) => [...invoiceKeys.lists(), filters] as const,
  details: () => [...invoiceKeys.all, 'detail'] as const,
  detail: (id: number) => [...invoiceKeys.details(), id] as const,
};

export const invoicePrintUrl = (id: number) => `/api/invoices/${id}/print`;
export const invoiceXlsxUrl = (id: number) => `/api/invoices/${id}/export.xlsx`;
