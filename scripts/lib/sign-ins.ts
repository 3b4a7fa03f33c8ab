// The table of demo accounts printed by `npm start` and `npm run seed:reset`.
import { DEMO_SIGN_INS } from '../../seeds/demo'

export function formatTable(headers: string[], rows: string[][]): string {
  const widths = headers.map((header, i) => Math.max(header.length, ...rows.map(row => (row[i] ?? '').length)))
  const line = (cells: string[]) => `  ${cells.map((cell, i) => cell.padEnd(widths[i] ?? 0)).join('   ')}`.trimEnd()
  return [line(headers), line(widths.map(w => '-'.repeat(w))), ...rows.map(line)].join('\n')
}

export function printSignIns(): void {
  console.log('Demo sign-ins:')
  console.log(formatTable(['Role', 'E-mail', 'Password'], DEMO_SIGN_INS.map(s => [s.role, s.email, s.password])))
}
