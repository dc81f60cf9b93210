import { useId } from 'react'
import { ANSWER_WORDS, type Answer, type AnswerTally } from '../../../shared/reviews'
import { Badge, type BadgeTone } from '../ui/Badge'

const TONES: Record<Answer, BadgeTone> = { yes: 'celadon', partly: 'ember', no: 'danger' }

/** One answer as a word on a coloured chip: the word carries the meaning, the colour only repeats it. */
export function AnswerBadge({ answer }: { answer: Answer }) {
  return <Badge tone={TONES[answer]}>{ANSWER_WORDS[answer]}</Badge>
}

/** Questions with the answers given, as a definition list. */
export function AnswerList({ rows }: { rows: { label: string; answer: Answer | null }[] }) {
  const given = rows.filter((r): r is { label: string; answer: Answer } => r.answer !== null)
  return (
    <dl className="grid grid-cols-[1fr_auto] gap-x-3 gap-y-1 text-sm">
      {given.map((row) => (
        <div key={row.label} className="contents" data-testid="answer" data-answer={row.answer}>
          <dt className="text-slip-700">{row.label}</dt>
          <dd>
            <AnswerBadge answer={row.answer} />
          </dd>
        </div>
      ))}
    </dl>
  )
}

/** "8 yes · 1 partly": how often each answer was given to one question, leaving out the ones never given. */
export function tallyInWords(counts: AnswerTally): string {
  const parts = (['yes', 'partly', 'no'] as const).filter((a) => counts[a] > 0).map((a) => `${counts[a]} ${ANSWER_WORDS[a].toLowerCase()}`)
  return parts.length ? parts.join(' · ') : 'not answered yet'
}

interface AnswerChoiceProps<T extends string> {
  legend: string
  value: T | undefined
  choices: readonly { value: T; label: string }[]
  onChange: (value: T) => void
  error?: string
}

/** A question answered by one of a few words, as a radio group: the arrow keys move along the choices. */
export function AnswerChoice<T extends string>({ legend, value, choices, onChange, error }: AnswerChoiceProps<T>) {
  const name = useId()
  return (
    <fieldset className="space-y-1" aria-describedby={error ? `${name}-error` : undefined}>
      <legend className="text-sm font-medium text-slip-800">{legend}</legend>
      <div className="flex flex-wrap gap-1.5">
        {choices.map((choice) => (
          <label key={choice.value} className="cursor-pointer">
            <input
              type="radio"
              className="peer sr-only"
              name={name}
              value={choice.value}
              checked={value === choice.value}
              onChange={() => onChange(choice.value)}
            />
            <span className="block rounded-control border border-slip-300 bg-white px-3 py-1 text-sm font-medium text-slip-700 peer-checked:border-clay-600 peer-checked:bg-clay-600 peer-checked:text-white peer-focus-visible:outline-2 peer-focus-visible:outline-offset-2 peer-focus-visible:outline-clay-500">
              {choice.label}
            </span>
          </label>
        ))}
      </div>
      {error && (
        <p id={`${name}-error`} className="text-xs font-medium text-danger-700" role="alert">
          {error}
        </p>
      )}
    </fieldset>
  )
}
