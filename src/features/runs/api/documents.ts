/** Addresses of the printed documents; the server makes each PDF and checks who asks. */
export const runDocuments = {
  loadingSheet: (runId: number) => `/api/runs/${runId}/loading-sheet.pdf`,
  labels: (runId: number) => `/api/runs/${runId}/labels.pdf`,
  deliveryNote: (orderId: number) => `/api/orders/${orderId}/delivery-note.pdf`,
};
