// Sign-in and sign-up limits that fit an airfield: only failures count, per address and per
// account at an address; the points are taken before the password is checked; sign-up is
// throttled per address, and so are password reset requests. The test server trusts one proxy
// hop (tests/support/server.ts).
import { afterAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, GOOD_PASSWORD, randomAddress, signedUpClient, uniqueEmail } from '../../../support/api'
import { closeTestDb, testDb } from '../../../support/db'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

const signIn = (address: string, email: string, password: string) =>
  new ApiClient(baseUrl, address).post('/api/auth/login', { email, password })

async function addressPoints(address: string): Promise<number> {
  const row = await testDb()('rate_limits').where({ key: `login-address:${address}` }).first('points')
  return row ? Number(row.points) : 0
}

describe('successful sign-ins', () => {
  it('never count: 60 from one address all succeed and leave its counter as it was', async () => {
    const { email } = await signedUpClient(baseUrl)
    const address = randomAddress()
    const statuses: number[] = []
    for (let round = 0; round < 6; round++) {
      const batch = await Promise.all(Array.from({ length: 10 }, () => signIn(address, email, GOOD_PASSWORD)))
      statuses.push(...batch.map(r => r.status))
    }
    expect(statuses).toEqual(Array(60).fill(200))
    expect(await addressPoints(address)).toBe(0)
  })
})

describe('failed sign-ins', () => {
  it('stop at the account-and-address limit, while the same account signs in from elsewhere', async () => {
    const { email } = await signedUpClient(baseUrl)
    const here = randomAddress()
    for (let i = 0; i < 10; i++) expect((await signIn(here, email, `guess ${i}`)).status).toBe(401)
    const refused = await signIn(here, email, GOOD_PASSWORD)
    expect(refused.status).toBe(429)
    expect(Number(refused.headers.get('retry-after'))).toBeGreaterThan(0)

    expect((await signIn(randomAddress(), email, GOOD_PASSWORD)).status).toBe(200)
    // Other accounts at the first address are not held either.
    const other = await signedUpClient(baseUrl)
    expect((await signIn(here, other.email, GOOD_PASSWORD)).status).toBe(200)
  })

  it('key on the address the trusted proxy saw, whatever the client writes further left', async () => {
    const { email } = await signedUpClient(baseUrl)
    const real = randomAddress()
    for (let i = 0; i < 10; i++) {
      // A fresh forged address each time, in front of the one the proxy appended.
      expect((await signIn(`${randomAddress()}, ${real}`, email, `guess ${i}`)).status).toBe(401)
    }
    expect((await signIn(`${randomAddress()}, ${real}`, email, GOOD_PASSWORD)).status).toBe(429)
  })

  it('are counted before the password is checked: of 40 simultaneous guesses only 10 are checked', async () => {
    const { email } = await signedUpClient(baseUrl)
    const address = randomAddress()
    const answers = await Promise.all(Array.from({ length: 40 }, (_, i) => signIn(address, email, `simultaneous guess ${i}`)))
    const statuses = answers.map(r => r.status)
    // A 401 is a checked password; a 429 was refused before any check.
    expect(statuses.filter(s => s === 401)).toHaveLength(10)
    expect(statuses.filter(s => s === 429)).toHaveLength(30)
    // Refused attempts are not failures of the address: only the ten checked ones count there.
    expect(await addressPoints(address)).toBe(10)
  })
})

describe('sign-up', () => {
  it('is throttled per address (20 an hour by default), with 429 and Retry-After; another address is not', async () => {
    const address = randomAddress()
    const statuses: number[] = []
    for (let i = 0; i < 20; i++) {
      const res = await new ApiClient(baseUrl, address).post('/api/auth/signup', { email: uniqueEmail('many'), name: 'Club Member', password: GOOD_PASSWORD })
      statuses.push(res.status)
    }
    expect(statuses).toEqual(Array(20).fill(202))
    const email = uniqueEmail('one-too-many')
    const refused = await new ApiClient(baseUrl, address).post('/api/auth/signup', { email, name: 'Club Member', password: GOOD_PASSWORD })
    expect(refused.status).toBe(429)
    expect(Number(refused.headers.get('retry-after'))).toBeGreaterThan(0)
    expect(refused.body.message).toMatch(/Too many accounts were requested from this network\. Try again in \d+ minutes?\./)
    expect(await testDb()('users').where({ email }).first()).toBeUndefined()

    expect((await new ApiClient(baseUrl).post('/api/auth/signup', { email, name: 'Club Member', password: GOOD_PASSWORD })).status).toBe(202)
  })
})

describe('password reset requests', () => {
  it('are throttled per address (10 an hour by default), with 429 and Retry-After; another address is not', async () => {
    const address = randomAddress()
    const statuses: number[] = []
    for (let i = 0; i < 10; i++) {
      const res = await new ApiClient(baseUrl, address).post('/api/auth/password-reset', { email: uniqueEmail('forgetful') })
      statuses.push(res.status)
    }
    expect(statuses).toEqual(Array(10).fill(202))
    const refused = await new ApiClient(baseUrl, address).post('/api/auth/password-reset', { email: uniqueEmail('forgetful') })
    expect(refused.status).toBe(429)
    expect(Number(refused.headers.get('retry-after'))).toBeGreaterThan(0)
    expect(refused.body.message).toMatch(/Too many password reset requests from this network\. Try again in \d+ minutes?\./)

    expect((await new ApiClient(baseUrl, randomAddress()).post('/api/auth/password-reset', { email: uniqueEmail('forgetful') })).status).toBe(202)
  })
})
