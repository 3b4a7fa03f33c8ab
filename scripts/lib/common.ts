// Small helpers shared by the scripts: repository paths, messages for a person, and child
// processes. Kept free of side effects so tests can import the modules that use it.
import { spawn } from 'node:child_process'
import type { ChildProcess, SpawnOptions } from 'node:child_process'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'

export const repoRoot = dirname(dirname(dirname(fileURLToPath(import.meta.url))))
/** Git-ignored folder for local state: demo database, session password, cluster record. */
export const localDataDir = join(repoRoot, '.data')
export const artifactsDir = join(repoRoot, 'artifacts')

/**
 * A failure with a message meant for a person (what went wrong and what to do); the
 * scripts print it without a stack trace.
 */
export class ScriptError extends Error {
  override name = 'ScriptError'
}

export function step(message: string): void {
  console.log(`▸ ${message}`)
}

export function isRoot(): boolean {
  return process.getuid?.() === 0
}

export function formatDuration(ms: number): string {
  return ms < 1000 ? `${ms} ms` : `${(ms / 1000).toFixed(1)} s`
}

/**
 * Prints an error: a ScriptError as its message (plus the stack of its cause, if any, since
 * that points at the code to fix), anything else as an unexpected error with its stack.
 */
export function reportError(error: unknown): void {
  if (!(error instanceof ScriptError)) {
    console.error('\n✖ Unexpected error:', error)
    return
  }
  console.error(`\n✖ ${error.message}`)
  const causeStack = error.cause instanceof Error ? error.cause.stack : undefined
  // The stack's first line repeats the message already shown.
  if (causeStack) console.error(indent(causeStack.split('\n').slice(1).map(line => line.trim()).join('\n')))
}

/** Runs a script's main function, turning a thrown error into a message and exit code 1. */
export function runMain(main: () => Promise<void>): void {
  main().catch((error: unknown) => {
    reportError(error)
    process.exit(1)
  })
}

export interface RunResult {
  code: number
  output: string
}

/**
 * Runs a command to completion and captures stdout+stderr together, so a failure can be
 * shown in context. Never rejects for a non-zero exit; callers decide what that means.
 */
export function capture(command: string, args: string[], options: SpawnOptions = {}): Promise<RunResult> {
  return new Promise((resolve, reject) => {
    const child = spawn(command, args, { ...options, stdio: ['ignore', 'pipe', 'pipe'] })
    let output = ''
    child.stdout?.on('data', (chunk: Buffer) => (output += chunk.toString()))
    child.stderr?.on('data', (chunk: Buffer) => (output += chunk.toString()))
    child.on('error', error => reject(new ScriptError(`Could not run ${command}: ${error.message}`)))
    child.on('close', (code, signal) => resolve({ code: code ?? (signal ? 128 : 1), output }))
  })
}

/** Like capture(), but throws a ScriptError carrying the output when the exit code is non-zero. */
export async function mustRun(what: string, command: string, args: string[], options: SpawnOptions = {}): Promise<string> {
  const result = await capture(command, args, options)
  if (result.code !== 0) {
    throw new ScriptError(`${what} failed (exit code ${result.code}):\n${indent(result.output.trim())}`)
  }
  return result.output
}

/**
 * Runs a command with the terminal attached (output shown live); resolves to its exit code.
 * onSpawn receives the child, e.g. to forward a signal to it.
 */
export function runInherited(
  command: string,
  args: string[],
  options: SpawnOptions = {},
  onSpawn?: (child: ChildProcess) => void,
): Promise<number> {
  return new Promise((resolve, reject) => {
    const child = spawn(command, args, { ...options, stdio: 'inherit' })
    onSpawn?.(child)
    child.on('error', error => reject(new ScriptError(`Could not run ${command}: ${error.message}`)))
    child.on('close', (code, signal) => resolve(code ?? (signal ? 128 : 1)))
  })
}

export function indent(text: string, prefix = '    '): string {
  return text.split('\n').map(line => prefix + line).join('\n')
}

/**
 * A script's Ctrl-C. The first SIGINT or SIGTERM is remembered (a terminal and a parent may
 * both deliver one): the current step finishes quickly, the rest is skipped, clean-up still
 * runs. `timed` prints a step with its duration and starts none once interrupted; `onStop`
 * runs once, on the signal (to stop a child process, or wake a sleeper).
 */
export interface Interrupts {
  /** The signal that stopped the run, if one came. */
  readonly signal: NodeJS.Signals | undefined
  /** Throws a ScriptError once a signal came. */
  check: () => void
  timed: <T>(label: string, task: () => Promise<T>) => Promise<T>
  /** Starts listening for the signals (again after `release`). */
  listen: () => void
  release: () => void
}

export function interrupts(stopping: string, onStop?: (signal: NodeJS.Signals) => void): Interrupts {
  let signal: NodeJS.Signals | undefined
  const onSignal = (received: NodeJS.Signals) => {
    if (signal) return
    signal = received
    console.log(`\n▸ ${received}: ${stopping}, then cleaning up`)
    onStop?.(received)
  }
  const check = () => {
    if (signal) throw new ScriptError(`Interrupted by ${signal}`)
  }
  return {
    get signal() { return signal },
    check,
    timed: async (label, task) => {
      check()
      const started = Date.now()
      const result = await task()
      console.log(`  ✓ ${label} (${formatDuration(Date.now() - started)})`)
      return result
    },
    listen: () => {
      process.on('SIGINT', onSignal)
      process.on('SIGTERM', onSignal)
    },
    release: () => {
      process.off('SIGINT', onSignal)
      process.off('SIGTERM', onSignal)
    },
  }
}
