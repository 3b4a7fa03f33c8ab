// The board's chime when a glider becomes held: two short tones made with the Web Audio API,
// so no sound file is fetched. Browsers let a page make sound only after a person has touched
// it, so the context is created (or resumed) from a click or key press: `unlock` is called by
// the chime toggle and by the first gesture on the page.

export interface BoardChime {
  /** Creates or resumes the audio context; call from a user gesture. True when sound can play. */
  unlock: () => Promise<boolean>
  /** Whether sound can play now without another gesture. */
  ready: () => boolean
  /** Plays the two tones (does nothing while the browser still blocks sound). */
  play: () => void
  close: () => void
}

type AudioContextClass = typeof AudioContext

function audioContextClass(): AudioContextClass | null {
  if (typeof window === 'undefined') return null
  const w = window as unknown as { AudioContext?: AudioContextClass, webkitAudioContext?: AudioContextClass }
  return w.AudioContext ?? w.webkitAudioContext ?? null
}

export function chimeSupported(): boolean {
  return audioContextClass() !== null
}

export function createBoardChime(): BoardChime {
  let context: AudioContext | null = null

  function tone(ctx: AudioContext, frequency: number, start: number, length: number) {
    const osc = ctx.createOscillator()
    const gain = ctx.createGain()
    osc.type = 'sine'
    osc.frequency.value = frequency
    // A soft attack and decay: a chime, not a click.
    gain.gain.setValueAtTime(0.0001, start)
    gain.gain.exponentialRampToValueAtTime(0.35, start + 0.02)
    gain.gain.exponentialRampToValueAtTime(0.0001, start + length)
    osc.connect(gain).connect(ctx.destination)
    osc.start(start)
    osc.stop(start + length + 0.05)
  }

  return {
    async unlock() {
      const Ctx = audioContextClass()
      if (!Ctx) return false
      context ??= new Ctx()
      if (context.state === 'suspended') {
        try {
          await context.resume()
        }
        catch {
          return false
        }
      }
      return context.state === 'running'
    },
    ready() {
      return context?.state === 'running'
    },
    play() {
      if (!context || context.state !== 'running') return
      const now = context.currentTime
      // A falling pair (E6 then A5): heard across a briefing room, unlike any alarm siren.
      tone(context, 1318.5, now, 0.22)
      tone(context, 880, now + 0.2, 0.32)
    },
    close() {
      void context?.close().catch(() => {})
      context = null
    },
  }
}
