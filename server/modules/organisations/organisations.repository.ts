import type { OrganisationKind } from '../../../shared/domain/roles';
import type { Db } from '../../db/knex';
import { nowIso } from '../../db/time';

export interface OrganisationRow {
  id: number;
  name: string;
  kind: OrganisationKind;
}

export interface BranchRow {
  id: number;
  organisation_id: number;
  name: string;
  address: string;
  town: string;
  phone: string | null;
}

export function organisationsRepository(db: Db) {
  return {
    async create(input: { name: string; kind: OrganisationKind }, trx: Db = db): Promise<OrganisationRow> {
      const [row] = await trx('organisations').insert({ name: input.name, kind: input.kind, created_at: nowIso() }).returning(['id', 'name', 'kind']);
      return row as OrganisationRow;
    },

    async findById(id: number): Promise<OrganisationRow | undefined> {
      return db('organisations').select('id', 'name', 'kind').where({ id }).first();
    },

    /** Branches of the caller's own organisation only. */
    async listBranches(organisationId: number): Promise<BranchRow[]> {
      return db('branches').select('id', 'organisation_id', 'name', 'address', 'town', 'phone').where({ organisation_id: organisationId }).orderBy('name');
    },

    async findBranch(organisationId: number, branchId: number): Promise<BranchRow | undefined> {
      return db('branches').select('id', 'organisation_id', 'name', 'address', 'town', 'phone').where({ id: branchId, organisation_id: organisationId }).first();
    },
  };
}
