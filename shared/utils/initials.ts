/** "Sam Scrutineer" → "SS"; one name gives one letter; no name gives "?". */
export function initialsOf(name: string): string {
  const words = name.trim().split(/\s+/).filter(Boolean)
  if (!words.length) return '?'
  const first = words[0]![0]!
  const last = words.length > 1 ? words[words.length - 1]![0]! : ''
  return (first + last).toUpperCase()
}

/** "Sam Scrutineer" → "S. Scrutineer": a person on a board, never mistaken for a competition ID. */
export function shortNameOf(name: string): string {
  const words = name.trim().split(/\s+/).filter(Boolean)
  if (words.length < 2) return words[0] ?? '?'
  return `${words[0]![0]!.toUpperCase()}. ${words[words.length - 1]}`
}
