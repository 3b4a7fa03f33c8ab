// Reading decoded tag texts and finding the entry in the day's pack without the network.
import { createHash } from 'node:crypto'
import { describe, expect, it } from 'vitest'
import type { GridPack } from '#shared/types/api-grid'
import { formatShortCode, packEntryByCode, packEntryByToken, tagTokenOf, tokenHash } from '~/utils/gridTag'

const TOKEN = 'AbCdEfGhIjKlMnOpQrStUvWxYz0123456789-_abcde'

describe('tagTokenOf', () => {
  it('reads /t/<token> on any origin, and a bare token', () => {
    expect(TOKEN).toHaveLength(43)
    expect(tagTokenOf(`https://grid.example/t/${TOKEN}`)).toBe(TOKEN)
    expect(tagTokenOf(`http://127.0.0.1:3000/t/${TOKEN}/`)).toBe(TOKEN)
    expect(tagTokenOf(`  ${TOKEN} `)).toBe(TOKEN)
  })
  it('refuses anything else', () => {
    expect(tagTokenOf(`https://grid.example/t/${TOKEN.slice(1)}`)).toBeNull()
    expect(tagTokenOf(`https://grid.example/x/${TOKEN}`)).toBeNull()
    expect(tagTokenOf(`javascript:/t/${TOKEN}`)).toBeNull()
    expect(tagTokenOf('hello')).toBeNull()
  })
})

describe('pack look-ups', () => {
  it('hashes the token with SHA-256 as the server stores it, and finds the tag by hash or short code', async () => {
    const hash = createHash('sha256').update(TOKEN).digest('hex')
    expect(await tokenHash(TOKEN)).toBe(hash)
    const pack = { entries: [{ dossier: { entry: { id: 'e1', compId: 'K7' } }, tag: { shortCode: 'K7MP9RTX', tokenHash: hash } }] } as unknown as GridPack
    expect((await packEntryByToken(pack, TOKEN))?.dossier.entry.id).toBe('e1')
    expect(await packEntryByToken(pack, TOKEN.replace('A', 'B'))).toBeUndefined()
    expect(packEntryByCode(pack, 'k7mp-9rtx')?.dossier.entry.id).toBe('e1')
    expect(formatShortCode('k7mp9rtx')).toBe('K7MP-9RTX')
  })
})
