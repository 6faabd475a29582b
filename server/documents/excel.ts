import type ExcelJSModule from 'exceljs';

/**
 * exceljs, loaded on the first workbook read or written: it holds about 28 MB once loaded, which a
 * server that never exports or imports a sheet should not carry.
 */
export type ExcelJS = typeof ExcelJSModule;

let loaded: Promise<ExcelJS> | undefined;

export function loadExcel(): Promise<ExcelJS> {
  loaded ??= import('exceljs').then((mod) => (mod as unknown as { default?: ExcelJS }).default ?? (mod as unknown as ExcelJS));
  loaded.catch(() => {
    loaded = undefined;
  });
  return loaded;
}
