import type { Kysely } from 'kysely'
import type { AttachmentRow, Database } from '../../db/schema'
import type { AttachmentDto, AttachmentType } from '../../shared/schemas/attachment'

// A site's attachments (photos, drawings) as stored: their rows, listing them, storing one once its
// file has arrived, and marking one deleted. The files themselves live in the uploads folder under
// the row's random storage key (server/utils/storage.ts).

/** An attachment row as the API shows it. */
export function attachmentDto(row: AttachmentRow, uploaderName: string | null): AttachmentDto {
  return {
    id: row.id,
    siteId: row.site_id,
    originalName: row.original_name,
    contentType: row.content_type as AttachmentType,
    sizeBytes: row.size_bytes,
    uploadedBy: row.uploaded_by !== null && uploaderName ? { id: row.uploaded_by, name: uploaderName } : null,
    createdAt: row.created_at,
  }
}

/** The attachment with this id unless it was deleted; undefined otherwise. */
export async function liveAttachmentById(db: Kysely<Database>, attachmentId: number): Promise<AttachmentRow | undefined> {
  return db.selectFrom('attachments').selectAll().where('id', '=', attachmentId).where('deleted_at', 'is', null).executeTakeFirst()
}

/** The site's attachments that are not deleted, newest first. */
export async function listAttachments(db: Kysely<Database>, siteId: number): Promise<AttachmentDto[]> {
  const rows = await db
    .selectFrom('attachments')
    .leftJoin('users', 'users.id', 'attachments.uploaded_by')
    .selectAll('attachments')
    .select('users.name as uploader_name')
    .where('attachments.site_id', '=', siteId)
    .where('attachments.deleted_at', 'is', null)
    .orderBy('attachments.id', 'desc')
    .execute()
  return rows.map((r) => attachmentDto(r, r.uploader_name))
}

/** Stores the row of an uploaded file kept under `storageKey`; returns it. */
export async function storeAttachment(
  db: Kysely<Database>,
  args: { siteId: number; storageKey: string; fileName: string; contentType: AttachmentType; sizeBytes: number; uploadedBy: number },
): Promise<AttachmentRow> {
  return db
    .insertInto('attachments')
    .values({ site_id: args.siteId, storage_key: args.storageKey, original_name: args.fileName, content_type: args.contentType, size_bytes: args.sizeBytes, uploaded_by: args.uploadedBy })
    .returningAll()
    .executeTakeFirstOrThrow()
}

/** Removes the row of an upload whose file never took its final name, as if it had never been stored. */
export async function forgetAttachment(db: Kysely<Database>, attachmentId: number): Promise<void> {
  await db.deleteFrom('attachments').where('id', '=', attachmentId).execute()
}

/** Marks an attachment deleted; the row stays as the record of what was uploaded and by whom. */
export async function deleteAttachment(db: Kysely<Database>, attachmentId: number, now: string): Promise<void> {
  await db.updateTable('attachments').set({ deleted_at: now }).where('id', '=', attachmentId).execute()
}

/** Every attachment's storage key and whether it is live, for putting the uploads folder in step. */
export async function attachmentKeys(db: Kysely<Database>): Promise<{ storageKey: string; live: boolean }[]> {
  const rows = await db.selectFrom('attachments').select(['storage_key', 'deleted_at']).execute()
  return rows.map((r) => ({ storageKey: r.storage_key, live: r.deleted_at === null }))
}
