import type { Face } from '../schemas/schedule.schema';
import type { EngineWarning, InputProblem } from './result';

/** The engine's warnings and the error it throws for a face it cannot lay. */

/** Thrown by estimate() when a face cannot be laid with the system; callers should check first. */
export class ScheduleRejectedError extends Error {
  readonly problems: InputProblem[];
  constructor(problems: InputProblem[]) {
    super(`the schedule cannot be estimated: ${problems.map((p) => p.message).join('; ')}`);
    this.name = 'ScheduleRejectedError';
    this.problems = problems;
  }
}

export function belowPitchMessage(pitch: number, low: number): string {
  return `${pitch}° is below the lowest pitch this tile may be laid at (${low}°)`;
}

/** 1st, 2nd, 3rd, 4th … 11th, 12th, 13th, 21st. */
export function ordinal(n: number): string {
  const teen = n % 100 >= 11 && n % 100 <= 13;
  const suffix = teen ? 'th' : n % 10 === 1 ? 'st' : n % 10 === 2 ? 'nd' : n % 10 === 3 ? 'rd' : 'th';
  return `${n}${suffix}`;
}

/** A warning (a class for the reason FaceFigures is one: a big job has hundreds). */
export class Notice implements EngineWarning {
  declare code: string;
  declare building: string | null;
  declare face: string | null;
  declare message: string;
  constructor(code: string, building: string | null, face: string | null, message: string) {
    this.code = code;
    this.building = building;
    this.face = face;
    this.message = message;
  }
}

export function warnBuilding(warnings: EngineWarning[], building: string, code: string, message: string) {
  warnings.push(new Notice(code, building, null, message));
}

export function warnFace(warnings: EngineWarning[], face: Face, code: string, message: string) {
  warnings.push(new Notice(code, face.building, face.face, message));
}
