import type { Knex } from 'knex';
import type { OrganisationKind, Role } from '../shared/domain/roles';
import { hashPassword } from '../server/auth/passwords';

/** The demo scenario: invented firms, towns and people. Every demo account's password. */
export const DEMO_PASSWORD = 'ridgeload-demo';

interface DemoOrg {
  name: string;
  kind: OrganisationKind;
  branches?: { name: string; address: string; town: string; phone: string }[];
  people: { email: string; name: string; role: Role }[];
}

export const DEMO_ORGANISATIONS: DemoOrg[] = [
  {
    name: 'Brackenfold Roofworks',
    kind: 'contractor',
    people: [
      { email: 'contractor@demo.test', name: 'Tamsin Orrell', role: 'contractor_owner' },
      { email: 'estimator@demo.test', name: 'Idris Venmore', role: 'contractor_estimator' },
    ],
  },
  {
    name: 'Wrenhallow Slate & Tile',
    kind: 'contractor',
    people: [
      { email: 'contractor2@demo.test', name: 'Marek Ellery', role: 'contractor_owner' },
      { email: 'estimator2@demo.test', name: 'Niamh Corrow', role: 'contractor_estimator' },
    ],
  },
  {
    name: 'Tollerbeck Roofing Supplies',
    kind: 'merchant',
    branches: [
      { name: 'Tollerbeck Yard', address: 'Unit 4, Kilnworth Trading Estate, TB4 7QX', town: 'Tollerbeck', phone: '01632 960 114' },
      { name: 'Cindermoor Depot', address: 'Slagbank Lane, CX2 9LD', town: 'Cindermoor', phone: '01632 960 587' },
    ],
    people: [
      { email: 'merchant@demo.test', name: 'Priya Hallam', role: 'merchant_owner' },
      { email: 'sales@demo.test', name: 'Owen Stallard', role: 'merchant_sales' },
      { email: 'dispatch@demo.test', name: 'Bea Quillon', role: 'merchant_dispatcher' },
      { email: 'driver@demo.test', name: 'Kofi Brennagh', role: 'driver' },
    ],
  },
  {
    name: 'Caddonmere Tile & Timber',
    kind: 'merchant',
    branches: [
      { name: 'Caddonmere Wharf', address: 'Old Wharf Road, QD1 3RS', town: 'Caddonmere', phone: '01632 961 020' },
      { name: 'Pellingsby Yard', address: '7 Furzedown Way, QP6 2HE', town: 'Pellingsby', phone: '01632 961 733' },
    ],
    people: [
      { email: 'merchant2@demo.test', name: 'Sunniva Roath', role: 'merchant_owner' },
      { email: 'sales2@demo.test', name: 'Callum Tresize', role: 'merchant_sales' },
      { email: 'dispatch2@demo.test', name: 'Hana Lowick', role: 'merchant_dispatcher' },
      { email: 'driver2@demo.test', name: 'Dario Penwarden', role: 'driver' },
    ],
  },
];

/** Safe to run again: a firm whose first person already exists is left as it is. */
export async function seed(knex: Knex): Promise<void> {
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  const now = new Date().toISOString();
  for (const org of DEMO_ORGANISATIONS) {
    if (await knex('users').where({ email: org.people[0].email }).first()) continue;
    await knex.transaction(async (trx) => {
      const [row] = await trx('organisations').insert({ name: org.name, kind: org.kind, created_at: now }).returning('id');
      const organisationId = typeof row === 'object' ? (row as { id: number }).id : (row as number);
      for (const b of org.branches ?? []) {
        await trx('branches').insert({ organisation_id: organisationId, ...b, created_at: now });
      }
      for (const p of org.people) {
        await trx('users').insert({ organisation_id: organisationId, ...p, password_hash: passwordHash, created_at: now });
      }
    });
  }
}
