import type { Express } from 'express';
import { expect } from 'vitest';
import { TEST_PASSWORD } from './factories';
import { Client } from './test-app';

/** A plain two-face gable, 8 m of eaves and 5 m rafters at 40°: the smallest roof an order is made from. */
export const GABLE_CSV = ['building,face,quantity,pitch_deg,rafter_mm,eaves_mm,left,right,top', 'House,Front,1,40,5000,8000,verge,verge,ridge', 'House,Back,1,40,5000,8000,verge,verge,ridge', ''].join('\n');

/** A calendar day n days from today, as YYYY-MM-DD (UTC). */
export const inDays = (n: number) => new Date(Date.now() + n * 86_400_000).toISOString().slice(0, 10);

/** A client signed in as a person the factories made (they all share TEST_PASSWORD). */
export async function signIn(app: Express, email: string): Promise<Client> {
  const c = new Client(app);
  expect((await c.login(email, TEST_PASSWORD)).status).toBe(200);
  return c;
}
