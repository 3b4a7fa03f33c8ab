// Sign-up, sign-in, /api/me and sign-out against the built server and real PostgreSQL.
import { afterAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, GOOD_PASSWORD, randomAddress, signedUpClient, uniqueEmail } from '../../../support/api'
import { closeTestDb, testDb } from '../../../support/db'
import { MESSAGES } from '../../../../shared/constants/messages'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

describe('sign-up → sign-in → me → sign-out', () => {
  it('walks the whole path and ends signed out', async () => {
    const email = uniqueEmail('path')
    const first = new ApiClient(baseUrl)
    const signUp = await first.post('/api/auth/signup', { email: email.toUpperCase(), name: 'Aino Vesterlund', password: GOOD_PASSWORD })
    expect(signUp.status).toBe(202)
    expect(signUp.body).toEqual({ message: MESSAGES.signUpCheckMail(email) })
    // Sign-up signs nobody in.
    expect((await first.get('/api/me')).status).toBe(401)

    const stored = await testDb()('users').where({ email }).first()
    expect(stored.password_hash).toMatch(/^\$scrypt\$/)
    expect(stored.password_hash).not.toContain(GOOD_PASSWORD)

    const client = new ApiClient(baseUrl)
    expect((await client.get('/api/me')).status).toBe(401)
    const login = await client.post('/api/auth/login', { email, password: GOOD_PASSWORD })
    expect(login.status).toBe(200)
    expect(login.headers.getSetCookie().join()).toMatch(/gridmark-session=.*HttpOnly/i)

    const me = await client.get('/api/me')
    expect(me.status).toBe(200)
    expect(me.body).toEqual({ user: { id: stored.id, email, name: 'Aino Vesterlund', isAdmin: false, emailVerified: false }, memberships: [] })

    const stolenCookie = client.cookie
    expect((await client.post('/api/auth/logout')).status).toBe(200)
    expect((await client.get('/api/me')).status).toBe(401)

    // A copy of the cookie taken before sign-out no longer works either.
    const copy = new ApiClient(baseUrl)
    copy.cookie = stolenCookie
    const replay = await copy.get('/api/me')
    expect(replay.status).toBe(401)
    expect(replay.body.message).toBe('Your session has ended. Please sign in again.')
  })

  it('records the sign-up in the audit log', async () => {
    const { user } = await signedUpClient(baseUrl)
    const entry = await testDb()('audit_log').where({ subject_id: user.id, action: 'user.signed-up' }).first()
    expect(entry).toMatchObject({ actor_user_id: user.id, subject_type: 'user' })
  })
})

describe('sign-up refusals', () => {
  it('creates no second account for an address that has one, whatever its case', async () => {
    const { email } = await signedUpClient(baseUrl)
    const res = await new ApiClient(baseUrl).post('/api/auth/signup', { email: email.toUpperCase(), name: 'Someone Else', password: GOOD_PASSWORD })
    expect(res.status).toBe(202)
    expect(await testDb()('users').whereRaw('lower(email) = ?', [email]).count()).toEqual([{ count: '1' }])
  })

  it('answers 400 with a message for each bad field and stores nothing', async () => {
    const email = uniqueEmail('bad')
    const res = await new ApiClient(baseUrl).post('/api/auth/signup', { email: 'nobody', name: '   ', password: 'short' })
    expect(res.status).toBe(400)
    expect(res.body.data.fieldErrors).toEqual({
      email: ['Enter an e-mail address like name@example.org.'],
      name: ['Enter your name.'],
      password: ['Use at least 10 characters.'],
    })
    expect(await testDb()('users').where({ email }).first()).toBeUndefined()
  })

  it('answers 400 in plain words to a body that is not JSON', async () => {
    const res = await new ApiClient(baseUrl).postRaw('/api/auth/signup', '{"email": "x@y.org",')
    expect(res.status).toBe(400)
    expect(res.body.message).toBe('The request body is not valid JSON.')
  })
})

describe('sign-in refusals', () => {
  it('answers a wrong password and an unknown address alike with 401', async () => {
    const { email } = await signedUpClient(baseUrl)
    const wrong = await new ApiClient(baseUrl).post('/api/auth/login', { email, password: 'not the password' })
    const unknown = await new ApiClient(baseUrl).post('/api/auth/login', { email: uniqueEmail('ghost'), password: 'not the password' })
    expect(wrong.status).toBe(401)
    expect(unknown.status).toBe(401)
    expect(wrong.body.message).toBe(unknown.body.message)
    expect(wrong.body.message).toBe('That e-mail address and password do not match an account.')
  })

  it('answers 400 with field messages to a malformed body', async () => {
    const res = await new ApiClient(baseUrl).post('/api/auth/login', { email: 42 })
    expect(res.status).toBe(400)
    expect(Object.keys(res.body.data.fieldErrors).sort()).toEqual(['email', 'password'])
  })

  it('throttles failed attempts on one account at one address with 429 and Retry-After', async () => {
    const { email } = await signedUpClient(baseUrl)
    const address = randomAddress()
    for (let i = 0; i < 10; i++) {
      const res = await new ApiClient(baseUrl, address).post('/api/auth/login', { email, password: `guess number ${i}` })
      expect(res.status).toBe(401)
    }
    // Even the right password is refused now from that address (10 per window by default).
    const blocked = await new ApiClient(baseUrl, address).post('/api/auth/login', { email, password: GOOD_PASSWORD })
    expect(blocked.status).toBe(429)
    expect(Number(blocked.headers.get('retry-after'))).toBeGreaterThan(0)
    expect(blocked.body.message).toMatch(/Too many sign-in attempts\. Try again in \d+ minutes?\./)
  })

  it('lets nobody elsewhere lock a named pilot out: failures from many addresses do not add up', async () => {
    const { email } = await signedUpClient(baseUrl)
    for (let i = 0; i < 15; i++) {
      expect((await new ApiClient(baseUrl).post('/api/auth/login', { email, password: `guess number ${i}` })).status).toBe(401)
    }
    expect((await new ApiClient(baseUrl).post('/api/auth/login', { email, password: GOOD_PASSWORD })).status).toBe(200)
  })

  it('throttles many failures from one address with 429 and Retry-After', async () => {
    const address = randomAddress()
    // 100 failures per address and window by default (runtimeConfig.loginLimit.perAddress), all
    // at once: each takes its point before its password is checked.
    const first = await Promise.all(Array.from({ length: 100 }, (_, i) =>
      new ApiClient(baseUrl, address).post('/api/auth/login', { email: uniqueEmail(`spray${i}`), password: 'whatever it is' })))
    expect(first.map(r => r.status)).toEqual(Array(100).fill(401))
    const res = await new ApiClient(baseUrl, address).post('/api/auth/login', { email: uniqueEmail('spray'), password: 'whatever it is' })
    expect(res.status).toBe(429)
    expect(Number(res.headers.get('retry-after'))).toBeGreaterThan(0)
    // Another address is not affected.
    const other = await new ApiClient(baseUrl).post('/api/auth/login', { email: uniqueEmail('other'), password: 'whatever it is' })
    expect(other.status).toBe(401)
  })

  it('a successful sign-in clears the failures counted against the account at that address', async () => {
    const { email } = await signedUpClient(baseUrl)
    const address = randomAddress()
    for (let i = 0; i < 9; i++) await new ApiClient(baseUrl, address).post('/api/auth/login', { email, password: `wrong ${i}` })
    expect((await new ApiClient(baseUrl, address).post('/api/auth/login', { email, password: GOOD_PASSWORD })).status).toBe(200)
    for (let i = 0; i < 9; i++) {
      expect((await new ApiClient(baseUrl, address).post('/api/auth/login', { email, password: `wrong again ${i}` })).status).toBe(401)
    }
  })
})
