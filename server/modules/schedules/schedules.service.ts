import { parseOpeningsCsv } from '../../../shared/engine/openings-parse';
import { parseScheduleCsv } from '../../../shared/engine/schedule-parse';
import type { InputProblem } from '../../../shared/engine/result';
import { checkOpeningsAgainstFaces, openingsSchema, type Opening } from '../../../shared/schemas/openings.schema';
import { scheduleSchema, type Face } from '../../../shared/schemas/schedule.schema';
import { MAX_SCHEDULE_FACES, type ScheduleProblem } from '../../../shared/schemas/schedule-upload.schema';
import type { AppDeps } from '../../app-deps';
import type { AuthUser } from '../../auth/auth-user';
import { CONTROL_CHARACTER_MESSAGE, linesWithControlCharacters } from '../../http/control-text';
import { AppError } from '../../http/app-error';
import { projectsService } from '../projects/projects.service';
import { engineFace, engineOpening } from '../../../shared/domain/stored-schedule';
import { schedulesRepository } from './schedules.repository';

/** The one error a rejected schedule gives, whether it came as a file or as JSON. */
export function invalidSchedule(problems: ScheduleProblem[]): AppError {
  const n = problems.length;
  return AppError.unprocessable('invalid_schedule', `The schedule was not stored: ${n} ${n === 1 ? 'problem' : 'problems'} to fix`, problems);
}

const toProblem = (p: InputProblem): ScheduleProblem => ({
  ...(p.row !== undefined ? { row: p.row } : {}),
  ...(p.column !== undefined ? { column: p.column } : {}),
  ...(p.file === 'openings' ? { path: `openings${p.row !== undefined ? `.${p.row - 1}` : ''}${p.column !== undefined ? `.${p.column}` : ''}` } : {}),
  message: p.message,
});

/** Reads an uploaded file's bytes as UTF-8, refusing other encodings rather than guessing. */
export function decodeScheduleBytes(bytes: Buffer): string {
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    throw invalidSchedule([{ row: 1, message: 'the file is not UTF-8 text: save it from the spreadsheet as "CSV UTF-8" and upload it again' }]);
  }
}

export function schedulesService(deps: Pick<AppDeps, 'db'>) {
  const { db } = deps;
  const schedules = schedulesRepository(db);
  const projects = projectsService(deps);

  async function store(user: AuthUser, projectId: number, source: 'csv' | 'form', filename: string | null, faces: Face[], openings: Opening[]) {
    if (faces.length > MAX_SCHEDULE_FACES) {
      throw invalidSchedule([{ row: MAX_SCHEDULE_FACES + 2, message: `a schedule has at most ${MAX_SCHEDULE_FACES} faces; split the job into several sites` }]);
    }
    const id = await db.transaction(async (trx) => {
      await projects.requireOpen(user, projectId, trx);
      return schedules.insertVersion(trx, { organisationId: user.organisation.id, projectId, userId: user.id, source, filename, faces, openings });
    });
    return (await schedules.findById(user.organisation.id, id))!;
  }

  return {
    /** A CSV as spreadsheets export it; every problem is reported at once and nothing is stored. */
    async importCsv(user: AuthUser, projectId: number, text: string, filename: string | null) {
      // Refuse a site that is not theirs before reading what they sent.
      await projects.requireOpen(user, projectId);
      const controlLines = linesWithControlCharacters(text);
      if (controlLines.length > 0) throw invalidSchedule(controlLines.map((row) => ({ row, message: `row ${row} ${CONTROL_CHARACTER_MESSAGE}` })));
      const parsed = parseScheduleCsv(text);
      if (!parsed.ok) throw invalidSchedule(parsed.errors.map(toProblem));
      // The openings of the version before stay with the faces they name; those naming a face no longer there are dropped.
      const before = await schedules.findVersion(user.organisation.id, projectId);
      const kept = (before?.openings ?? []).map(engineOpening);
      const fits = new Set(checkOpeningsAgainstFaces(kept, parsed.faces).map((p) => p.index));
      const openings = kept.filter((_, i) => !fits.has(i));
      const stored = await store(user, projectId, 'csv', filename, parsed.faces, openings);
      const warnings: Array<{ code: string; message: string }> = parsed.warnings.map(({ code, message }) => ({ code, message }));
      if (fits.size > 0) {
        warnings.push({ code: 'openings_dropped', message: `${fits.size} opening(s) of the previous version name a face that is not in this schedule or no longer fit it, and were left out` });
      }
      return { ...stored, warnings };
    },

    /**
     * An openings file (CSV) for the site's current faces: saved as a new version with the same faces
     * and these openings in place of the old ones. Every problem is reported at once and nothing is stored.
     */
    async importOpeningsCsv(user: AuthUser, projectId: number, text: string, filename: string | null) {
      await projects.requireOpen(user, projectId);
      const current = await schedules.findVersion(user.organisation.id, projectId);
      if (!current) throw AppError.conflict('no_schedule', 'Import or enter the roof schedule before its openings');
      const faces = current.faces.map(engineFace);
      const parsed = parseOpeningsCsv(text, faces);
      if (!parsed.ok) throw invalidSchedule(parsed.errors.map(toProblem));
      const stored = await store(user, projectId, 'csv', filename ?? current.filename, faces, parsed.openings);
      return { ...stored, warnings: parsed.warnings.map(({ code, message }) => ({ code, message })) };
    },

    /** The whole face list typed or edited by hand; saved as a new version, like an upload. */
    async replaceFaces(user: AuthUser, projectId: number, rows: unknown[], openingRows: unknown[] = []) {
      await projects.requireOpen(user, projectId);
      const parsed = scheduleSchema.safeParse(rows);
      const openings = openingsSchema.safeParse(openingRows);
      const openingProblems: ScheduleProblem[] = [];
      if (!openings.success) {
        for (const issue of openings.error.issues) {
          const [index, column] = issue.path;
          openingProblems.push({
            ...(typeof index === 'number' ? { row: index + 1 } : {}),
            ...(typeof column === 'string' ? { column } : {}),
            path: ['openings', ...issue.path.map(String)].join('.'),
            message: issue.message,
          });
        }
      } else if (parsed.success) {
        for (const p of checkOpeningsAgainstFaces(openings.data, parsed.data)) {
          openingProblems.push({ row: p.index + 1, column: p.column, path: `openings.${p.index}.${p.column}`, message: p.message });
        }
      }
      if (!parsed.success) {
        throw invalidSchedule([
          ...parsed.error.issues.map((issue) => {
            const [index, column] = issue.path;
            return {
              ...(typeof index === 'number' ? { row: index + 1 } : {}),
              ...(typeof column === 'string' ? { column } : {}),
              path: ['faces', ...issue.path.map(String)].join('.'),
              message: issue.message,
            };
          }),
          ...openingProblems,
        ]);
      }
      if (openingProblems.length > 0 || !openings.success) throw invalidSchedule(openingProblems);
      return { ...(await store(user, projectId, 'form', null, parsed.data, openings.data)), warnings: [] };
    },

    async current(user: AuthUser, projectId: number) {
      await projects.get(user, projectId);
      const found = await schedules.findVersion(user.organisation.id, projectId);
      if (!found) throw new AppError(404, 'no_schedule', 'This site has no roof schedule yet');
      return { ...found, warnings: [] };
    },

    async version(user: AuthUser, projectId: number, version: number) {
      const found = await schedules.findVersion(user.organisation.id, projectId, version);
      if (!found) throw AppError.notFound('Schedule version');
      return { ...found, warnings: [] };
    },

    async history(user: AuthUser, projectId: number) {
      await projects.get(user, projectId);
      return { schedules: await schedules.listVersions(user.organisation.id, projectId) };
    },
  };
}

export type SchedulesService = ReturnType<typeof schedulesService>;
