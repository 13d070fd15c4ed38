import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Sequelize, Transaction } from 'sequelize';
import { isDeepStrictEqual } from 'node:util';
import { ArmModel } from '../models';
import { audit } from '../services/audit/audit';
import { ArmModelInput } from '../services/armModels';
import type { SeedStep } from './seed';

export const DEMO_CATALOGUE_DIR = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../../samples/arm-models');

/** Every samples/arm-models/*.json, parsed with the arm model schema (throws naming the file on a bad sample). */
export function readDemoCatalogue(dir = DEMO_CATALOGUE_DIR): ArmModelInput[] {
  return readdirSync(dir)
    .filter((f) => f.endsWith('.json'))
    .sort()
    .map((file) => {
      const parsed = ArmModelInput.safeParse(JSON.parse(readFileSync(path.join(dir, file), 'utf8')));
      if (!parsed.success) {
        const first = parsed.error.issues[0];
        throw new Error(`samples/arm-models/${file}: ${first?.path.join('.') || 'file'}: ${first?.message ?? 'invalid'}`);
      }
      return parsed.data;
    });
}

/**
 * Creates or refreshes the built-in models from the samples (by name). A person's own model that
 * already carries a sample's name is left alone. Returns the names created and updated.
 */
export async function upsertBuiltInCatalogue(transaction: Transaction): Promise<{ created: string[]; updated: string[] }> {
  const created: string[] = [];
  const updated: string[] = [];
  for (const sample of readDemoCatalogue()) {
    const existing = await ArmModel.findOne({ where: { name: sample.name }, transaction });
    if (!existing) {
      const row = await ArmModel.create({ name: sample.name, family: sample.params.family, params: sample.params, builtIn: true, createdBy: null }, { transaction });
      await audit(null, 'armModel.builtIn.create', 'armModel', row.id, { name: row.name }, transaction);
      created.push(sample.name);
    } else if (existing.builtIn && (!isDeepStrictEqual(existing.params, sample.params) || existing.family !== sample.params.family)) {
      await existing.update({ family: sample.params.family, params: sample.params }, { transaction });
      await audit(null, 'armModel.builtIn.update', 'armModel', existing.id, { name: existing.name }, transaction);
      updated.push(sample.name);
    }
  }
  return { created, updated };
}

/** Demo seed step: the built-in catalogue (runs before steps whose layouts name its models). */
export const seedDemoCatalogue: SeedStep = async ({ transaction }) => {
  await upsertBuiltInCatalogue(transaction);
};

/** Idempotent start-up step for databases seeded before a sample was added or changed. */
export async function ensureBuiltInCatalogue(sequelize: Sequelize): Promise<{ created: string[]; updated: string[] }> {
  return sequelize.transaction((transaction) => upsertBuiltInCatalogue(transaction));
}
