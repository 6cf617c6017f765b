import type { Kysely } from 'kysely'

// The discrete-bubble model replaces the single-pass bubble-contact method: stored option settings
// that chose bubble contact choose the bubble model; the contact method's slip velocity and plume
// time go (the bubble model takes its rise velocity from the bubble size and a plume velocity); a
// bubble diameter or per-metre transfer still at the old default (2 mm, 3 %/m) moves to the new one
// (3 mm, 4 %/m), and any other value is kept. Rows are rewritten one by one in JavaScript, so the
// migration reads the same on any database.
interface Db {
  options: { id: number, settings: string }
}

export async function up(raw: Kysely<unknown>): Promise<void> {
  const db = raw as unknown as Kysely<Db>
  const rows = await db.selectFrom('options').select(['id', 'settings']).execute()
  for (const r of rows) {
    const settings = JSON.parse(r.settings) as Record<string, unknown>
    if (settings.oxygenMethod === 'bubble-contact') settings.oxygenMethod = 'bubble-model'
    delete settings.slipVelocity_ms
    delete settings.plumeTime_s
    if (settings.bubbleDiameter_m === 0.002) settings.bubbleDiameter_m = 0.003
    if (settings.sotePerMetre === 0.03) settings.sotePerMetre = 0.04
    await db.updateTable('options').set({ settings: JSON.stringify(settings) }).where('id', '=', r.id).execute()
  }
}

export async function down(raw: Kysely<unknown>): Promise<void> {
  const db = raw as unknown as Kysely<Db>
  const rows = await db.selectFrom('options').select(['id', 'settings']).execute()
  for (const r of rows) {
    const settings = JSON.parse(r.settings) as Record<string, unknown>
    if (settings.oxygenMethod === 'bubble-model') settings.oxygenMethod = 'bubble-contact'
    delete settings.plumeVelocity_ms
    delete settings.filmModel
    delete settings.inDeviceTransfer
    delete settings.tdgExcessLimit_mmHg
    settings.slipVelocity_ms = 0.25
    settings.plumeTime_s = 2
    if (settings.bubbleDiameter_m === 0.003) settings.bubbleDiameter_m = 0.002
    if (settings.sotePerMetre === 0.04) settings.sotePerMetre = 0.03
    await db.updateTable('options').set({ settings: JSON.stringify(settings) }).where('id', '=', r.id).execute()
  }
}
