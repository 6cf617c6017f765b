// The comment thread of a site's review: typed fetch wrappers over server/api/sites/[id]/comments*
// (the thread's pure helpers are in utils/comments.ts).
import type { CommentDto, CommentInput, CommentListDto } from '#shared/schemas/review'

/** The site's comments, oldest first. */
export function useComments(siteId: Ref<number>) {
  return useFetch<CommentListDto>(() => `/api/sites/${siteId.value}/comments`, {
    key: computed(() => `comments-${siteId.value}`),
    query: { pageSize: 200 },
  })
}

/** Adds a comment; `@name` or `@e-mail` in the body notifies that member. */
export function postComment(siteId: number, body: CommentInput): Promise<CommentDto> {
  return $fetch<CommentDto>(`/api/sites/${siteId}/comments`, { method: 'POST', body })
}
