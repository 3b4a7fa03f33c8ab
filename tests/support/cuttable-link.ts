// A phone's link to the server that the browser tests can cut, as the signal goes on a windy
// airfield. Chromium's offline emulation (context.setOffline) sets navigator.onLine and fails
// the page's own requests, but it is not a wall: a service worker's fetches are not always
// held by it, so a test that asserts "nothing reached the server while offline" cannot rest on
// it alone. The browser talks to the app through this TCP relay on loopback instead; cutting
// it drops every open connection and refuses new ones until it is restored.
import { createServer, connect, type Socket } from 'node:net'

export interface CuttableLink {
  /** The app's address through the relay (same scheme, host 127.0.0.1, the relay's port). */
  url: string
  cut: () => void
  restore: () => void
  close: () => Promise<void>
}

export async function openCuttableLink(baseUrl: string): Promise<CuttableLink> {
  const target = new URL(baseUrl)
  const targetPort = Number(target.port || (target.protocol === 'https:' ? 443 : 80))
  const open = new Set<Socket>()
  let isCut = false

  const server = createServer((client) => {
    if (isCut) {
      client.destroy()
      return
    }
    const upstream = connect(targetPort, target.hostname)
    for (const s of [client, upstream]) {
      open.add(s)
      s.on('close', () => open.delete(s))
      s.on('error', () => { client.destroy(); upstream.destroy() })
    }
    client.pipe(upstream)
    upstream.pipe(client)
  })
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(0, '127.0.0.1', () => resolve())
  })
  const address = server.address()
  if (!address || typeof address === 'string') throw new Error('The relay has no port')

  return {
    url: `${target.protocol}//127.0.0.1:${address.port}`,
    cut: () => {
      isCut = true
      for (const s of open) s.destroy()
    },
    restore: () => { isCut = false },
    close: () => new Promise<void>((resolve) => {
      for (const s of open) s.destroy()
      server.close(() => resolve())
    }),
  }
}
