/**
 * The 409 for an update whose `version` no longer matches the stored record (optimistic
 * concurrency): names the current version so the client can reload and apply its change again.
 */
export async function staleVersionError(table: 'sites' | 'options', id: number, sent: number, noun: string) {
  const current = await useDb().selectFrom(table).select(['version', 'updated_at']).where('id', '=', id).executeTakeFirst()
  return createError({
    statusCode: 409,
    statusMessage: 'Conflict',
    message: `version: the ${noun} was changed by someone else (now version ${current?.version ?? '?'}, you sent ${sent}); reload it and apply your change again`,
    data: { currentVersion: current?.version ?? null, updatedAt: current?.updated_at ?? null },
  })
}
