export default defineEventHandler(async (event) => {
  const { clubId, postId } = validParams(event, postParams)
  const { user, membership } = await requireClubRole(event, clubId, POST_ROLES)
  const db = useDb()
  const post = await findPost(db, clubId, postId)
  return {
    post: await postView(db, post),
    canEdit: canEdit(membership.roles, user.id, post),
    canPublish: isPublisher(membership.roles),
  }
})
