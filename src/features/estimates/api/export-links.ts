/**
 * Where an estimate's exports are downloaded from. Plain links: the browser sends the session cookie
 * and saves the file under the name the server gives it, so no fetch is involved.
 */
export const estimateExportUrls = (id: number) => ({
  xlsx: `/api/estimates/${id}/export.xlsx`,
  billCsv: `/api/estimates/${id}/export.csv?table=bill`,
  facesCsv: `/api/estimates/${id}/export.csv?table=faces`,
});
