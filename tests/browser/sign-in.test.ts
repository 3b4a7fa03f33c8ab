import { afterAll, beforeAll, beforeEach, describe, expect, it, inject } from 'vitest'
import { ROLE_LABELS } from '../../shared/constants/roles'
import { MESSAGES } from '../../shared/constants/messages'
import { DEMO_PASSWORD, DEMO_PEOPLE } from '../../seeds/demo-data'
import { launchBrowser, openPage, screenshot, signInThroughForm, type Browser } from '../support/browser'

const baseUrl = inject('baseUrl')
const DEMO_COMPETITION_NAME = 'Kestrel Moor Regionals 2027'

const accounts = [
  'admin@gridmark.example',
  'organiser@gridmark.example',
  'scrutineer@gridmark.example',
  'scrutineer2@gridmark.example',
  'director@gridmark.example',
  'entrant@gridmark.example',
].map(email => DEMO_PEOPLE.find(p => p.email === email)!)

let browser: Browser
beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
})
beforeEach(async () => {
  await browser.context.clearCookies()
})

describe('signing in through the form', () => {
  it.each(accounts)('$email lands on the home page with their role shown', async (person) => {
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    try {
      await signInThroughForm(page, baseUrl, person.email, DEMO_PASSWORD)
      expect(new URL(page.url()).pathname).toBe('/')
      await expect.poll(() => page.getByTestId('signed-in-as').textContent()).toContain(person.name)
      await page.getByRole('heading', { level: 1, name: 'Your competitions' }).waitFor()

      if (person.isAdmin) {
        await page.getByTestId('admin-note').getByText('Site administration').waitFor()
      }
      const card = page.getByTestId('membership-card').filter({ hasText: DEMO_COMPETITION_NAME })
      await card.waitFor()
      const chips = await card.getByTestId('role-chip').allTextContents()
      // A site administrator holds no role there but acts with an organiser's rights.
      const roles = person.isAdmin ? ['organiser' as const] : person.roles
      expect(chips).toEqual(roles.map(r => ROLE_LABELS[r]))
      await screenshot(page, `home-${person.email.split('@')[0]}-phone`)

      await page.getByTestId('sign-out').click()
      await page.waitForURL(url => url.pathname === '/sign-in')
      const me = await page.request.get(new URL('/api/me', baseUrl).toString())
      expect(me.status()).toBe(401)
    }
    finally {
      await page.close()
    }
  })

  it('shows the director’s home and the competition on a wall screen', async () => {
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'wall')
    try {
      await signInThroughForm(page, baseUrl, 'director@gridmark.example', DEMO_PASSWORD)
      await page.getByTestId('membership-card').first().waitFor()
      await screenshot(page, 'home-director-wall')

      await page.getByRole('link', { name: DEMO_COMPETITION_NAME }).click()
      await page.getByRole('heading', { level: 1, name: DEMO_COMPETITION_NAME }).waitFor()
      expect(await page.getByTestId('class-card').count()).toBe(3)
      await page.getByTestId('role-duties').filter({ hasText: ROLE_LABELS.director }).waitFor()
      await screenshot(page, 'competition-director-wall')
    }
    finally {
      await page.close()
    }
  })

  it('shows the competition overview on a phone', async () => {
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    try {
      await signInThroughForm(page, baseUrl, 'scrutineer@gridmark.example', DEMO_PASSWORD)
      await page.getByRole('link', { name: DEMO_COMPETITION_NAME }).click()
      await page.getByRole('heading', { level: 1, name: DEMO_COMPETITION_NAME }).waitFor()
      await screenshot(page, 'competition-scrutineer-phone')
    }
    finally {
      await page.close()
    }
  })

  it('sends a visitor to sign in first and back to the page they asked for', async () => {
    // Find the demo competition's address with a throwaway API sign-in, then forget it.
    const api = browser.context.request
    await api.post(new URL('/api/auth/login', baseUrl).toString(), { data: { email: 'entrant@gridmark.example', password: DEMO_PASSWORD } })
    const me = await (await api.get(new URL('/api/me', baseUrl).toString())).json() as { memberships: { competitionId: string }[] }
    const target = `/competitions/${me.memberships[0]!.competitionId}`
    await browser.context.clearCookies()

    const page = await openPage(browser.context, baseUrl, target, 'phone')
    try {
      const asked = new URL(page.url())
      expect(asked.pathname).toBe('/sign-in')
      expect(asked.searchParams.get('next')).toBe(target)

      await signInThroughForm(page, baseUrl, 'entrant@gridmark.example', DEMO_PASSWORD, target)
      expect(new URL(page.url()).pathname).toBe(target)
      await page.getByRole('heading', { level: 1, name: DEMO_COMPETITION_NAME }).waitFor()
    }
    finally {
      await page.close()
    }
  })

  it('explains a failed sign-in in an alert that takes focus', async () => {
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    try {
      await page.getByLabel('E-mail address').fill('entrant@gridmark.example')
      await page.getByLabel('Password').fill('not the password')
      await page.getByRole('button', { name: 'Sign in' }).click()
      const alert = page.getByRole('alert')
      await alert.getByText('Sign-in did not work').waitFor()
      expect(await alert.evaluate(el => el === document.activeElement)).toBe(true)
      expect(new URL(page.url()).pathname).toBe('/sign-in')
      await screenshot(page, 'sign-in-failed-phone')

      // Client-side checks use the shared schema: nothing is sent for an empty form.
      await page.getByLabel('E-mail address').fill('')
      await page.getByRole('button', { name: 'Sign in' }).click()
      await page.locator('#sign-in-email-error').waitFor()
      expect(await page.getByLabel('E-mail address').getAttribute('aria-invalid')).toBe('true')
    }
    finally {
      await page.close()
    }
  })

  it('answers an unknown address with a plain not-found page and a way home', async () => {
    const page = await openPage(browser.context, baseUrl, '/no-such-page', 'phone')
    try {
      await page.getByRole('heading', { level: 1, name: 'Not found' }).waitFor()
      await page.getByRole('button', { name: 'Go to the home page' }).click()
      await page.waitForURL(url => url.pathname === '/')
    }
    finally {
      await page.close()
    }
  })

  it('says plainly when a competition does not exist or is not the user’s', async () => {
    const page = await openPage(browser.context, baseUrl, '/sign-in', 'phone')
    try {
      await signInThroughForm(page, baseUrl, 'entrant@gridmark.example', DEMO_PASSWORD, '/competitions/00000000-0000-4000-8000-000000000000')
      await page.getByRole('heading', { level: 1, name: 'Not found' }).waitFor()
      expect(await page.getByTestId('error-page').textContent()).toContain(MESSAGES.competitionNotFound)
      await screenshot(page, 'error-competition-not-found-phone')
    }
    finally {
      await page.close()
    }
  })
})
