// POST /api/auth/signup {email,name,password} — anyone. 201 {user} and signed in;
// 400 with per-field messages; 409 when the e-mail address already has an account.
import { signUpSchema } from '#shared/schemas/auth'
import { MESSAGES } from '#shared/constants/messages'

export default defineApiHandler(async (event) => {
  const body = await validBody(event, signUpSchema)
  if (await findUserByEmail(body.email)) throw httpError(409, MESSAGES.emailTaken)

  const passwordHash = await hashPassword(body.password)
  const user = await useDb().transaction(async (trx) => {
    const created = await createUser({ email: body.email, name: body.name, passwordHash }, trx)
    await audit(trx, { actorUserId: created.id, action: 'user.signed-up', subjectType: 'user', subjectId: created.id })
    return created
  }).catch((err) => {
    // Two sign-ups racing for one address: the unique index decides.
    if ((err as { code?: string }).code === '23505') throw httpError(409, MESSAGES.emailTaken)
    throw err
  })

  await startSession(event, user)
  setResponseStatus(event, 201)
  return { user: toPublicUser(user) }
})
