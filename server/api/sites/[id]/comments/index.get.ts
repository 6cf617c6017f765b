import { CommentListQuerySchema, ReviewParamsSchema, type CommentListDto } from '../../../../../shared/schemas/review'
import { READER_ROLES } from '../../../../../shared/utils/roles'

// A site's comment thread, oldest first, paged.
export default defineEventHandler(async (event): Promise<CommentListDto> => {
  const { id } = await getValidatedRouterParams(event, validator(ReviewParamsSchema, 'params'))
  const { site } = await requireSite(event, id, READER_ROLES)
  const { page, pageSize } = await getValidatedQuery(event, validator(CommentListQuerySchema, 'query'))
  const db = useDb()
  const [rows, total] = await Promise.all([
    db.selectFrom('comments').selectAll().where('site_id', '=', site.id).orderBy('id').limit(pageSize).offset((page - 1) * pageSize).execute(),
    db.selectFrom('comments').select((eb) => eb.fn.countAll<number>().as('n')).where('site_id', '=', site.id).executeTakeFirstOrThrow(),
  ])
  return { page, pageSize, total: Number(total.n), comments: await commentDtos(rows) }
})
