import type { Migration, MigrationProvider } from 'kysely'
import * as m0001 from './0001_foundation'
import * as m0002 from './0002_sites'
import * as m0003 from './0003_options_assessments'
import * as m0004 from './0004_review_mail_links'
import * as m0005 from './0005_sessions_verification_throttle'
import * as m0006 from './0006_operating_rules'
import * as m0007 from './0007_unit_suffixes'
import * as m0008 from './0008_bubble_model'
import * as m0009 from './0009_organisation_currency'
import * as m0010 from './0010_civils_per_design_flow'
import * as m0011 from './0011_assessment_money'
import * as m0012 from './0012_assessment_uncertainty'
import * as m0013 from './0013_assessment_baseline'
import * as m0014 from './0014_flow_rules'
import * as m0015 from './0015_consents'
import * as m0016 from './0016_commissioning'

// Listed by hand: a folder scan does not survive bundling into the built server.
// Add each new migration here, in order; never rename or edit one that has shipped.
export const migrations: Record<string, Migration> = {
  '0001_foundation': m0001,
  '0002_sites': m0002,
  '0003_options_assessments': m0003,
  '0004_review_mail_links': m0004,
  '0005_sessions_verification_throttle': m0005,
  '0006_operating_rules': m0006,
  '0007_unit_suffixes': m0007,
  '0008_bubble_model': m0008,
  '0009_organisation_currency': m0009,
  '0010_civils_per_design_flow': m0010,
  '0011_assessment_money': m0011,
  '0012_assessment_uncertainty': m0012,
  '0013_assessment_baseline': m0013,
  '0014_flow_rules': m0014,
  '0015_consents': m0015,
  '0016_commissioning': m0016,
}

/** Kysely migration provider over the static list above. */
export const migrationProvider: MigrationProvider = {
  getMigrations: async () => migrations,
}

/** Name of the newest migration this build knows. */
export const LATEST_MIGRATION = Object.keys(migrations).at(-1)!
