import { useState } from 'react'
import { useNavigate, useParams, useSearchParams } from 'react-router-dom'
import { CRACK_EDGES, INCIDENT_KIND_LABELS, INCIDENT_KINDS, type CrackEdge, type IncidentKind } from '../../../../shared/firing/incidents'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { Card, PageHeader } from '../../../components/ui/Card'
import { Checkbox, Field, Select, TextArea, TextInput } from '../../../components/ui/Field'
import type { ApiError } from '../../../lib/api'
import { useReportIncident } from '../api/incidents'

const EDGE_WORDS: Record<CrackEdge, string> = {
  sharp: 'Sharp and clean, through glaze and body',
  rounded: 'Rounded: glaze flowed into it',
  unknown: 'Cannot tell',
}

const tagsOf = (value: string) => value.split(/[\s,;]+/).filter(Boolean)

/**
 * Reporting what went wrong in a firing: the crew from the firing (naming the failed pieces and any
 * other potters' pieces it hurt, by tag), or the potter from their ask.
 */
export function ReportIncidentPage() {
  const { firingId = '' } = useParams()
  const [params] = useSearchParams()
  const requestId = params.get('request') ?? undefined
  const byPotter = requestId !== undefined
  const navigate = useNavigate()
  const report = useReportIncident(firingId)
  const [kind, setKind] = useState<IncidentKind>('blowout')
  const [crackEdge, setCrackEdge] = useState<CrackEdge>('unknown')
  const [flags, setFlags] = useState({ shards: false, neighboursHit: false, shelfDamage: false, elementDamage: false })
  const [whereInKiln, setWhere] = useState('')
  const [note, setNote] = useState('')
  const [pieceTags, setPieceTags] = useState('')
  const [hurtTags, setHurtTags] = useState('')
  const [photos, setPhotos] = useState<File[]>([])
  const error = report.error as ApiError | null
  const fieldError = (name: string) =>
    error?.fields?.[name] ?? Object.entries(error?.fields ?? {}).find(([key]) => key.startsWith(`${name}.`))?.[1]

  return (
    <>
      <PageHeader
        title="Report what went wrong"
        lead="Say what you saw when the kiln was opened. Conewright reads the likely phase from it, the ware’s own check and the firing’s log."
      />
      <Card>
        <form
          className="space-y-4"
          onSubmit={(event) => {
            event.preventDefault()
            report.mutate(
              {
                body: {
                  kind,
                  ...(kind === 'crack' ? { crackEdge } : {}),
                  ...flags,
                  whereInKiln,
                  note,
                  pieceTags: tagsOf(pieceTags),
                  hurtTags: byPotter ? [] : tagsOf(hurtTags),
                  ...(requestId ? { requestId } : {}),
                },
                photos,
              },
              { onSuccess: (incident) => navigate(`/incidents/${incident.id}`) },
            )
          }}
        >
          <Field label="What happened" error={fieldError('kind')}>
            {(props) => (
              <Select {...props} value={kind} onChange={(e) => setKind(e.target.value as IncidentKind)}>
                {INCIDENT_KINDS.map((k) => (
                  <option key={k} value={k}>
                    {INCIDENT_KIND_LABELS[k]}
                  </option>
                ))}
              </Select>
            )}
          </Field>
          {kind === 'crack' && (
            <fieldset className="space-y-1">
              <legend className="text-sm font-medium text-slip-800">The edge of the crack</legend>
              {CRACK_EDGES.map((edge) => (
                <label key={edge} className="flex items-center gap-2 text-sm text-slip-800">
                  <input
                    type="radio"
                    name="crack-edge"
                    value={edge}
                    checked={crackEdge === edge}
                    onChange={() => setCrackEdge(edge)}
                    className="focus-ring size-4 accent-clay-600"
                  />
                  {EDGE_WORDS[edge]}
                </label>
              ))}
            </fieldset>
          )}
          <fieldset className="grid gap-2 sm:grid-cols-2">
            <legend className="mb-1 text-sm font-medium text-slip-800">What else</legend>
            <Checkbox
              label="Shards thrown about the kiln"
              checked={flags.shards}
              onChange={(e) => setFlags({ ...flags, shards: e.target.checked })}
            />
            <Checkbox
              label="Other ware hit or stuck"
              checked={flags.neighboursHit}
              onChange={(e) => setFlags({ ...flags, neighboursHit: e.target.checked })}
            />
            <Checkbox
              label="Shelf damaged"
              checked={flags.shelfDamage}
              onChange={(e) => setFlags({ ...flags, shelfDamage: e.target.checked })}
            />
            <Checkbox
              label="Elements damaged"
              checked={flags.elementDamage}
              onChange={(e) => setFlags({ ...flags, elementDamage: e.target.checked })}
            />
          </fieldset>
          <Field label="Where in the kiln" hint="Shelf and place, e.g. middle shelf, back." error={fieldError('whereInKiln')}>
            {(props) => <TextInput {...props} value={whereInKiln} onChange={(e) => setWhere(e.target.value)} />}
          </Field>
          <Field
            label={byPotter ? 'Your pieces concerned (tags, optional)' : 'The pieces that failed (tags)'}
            hint="As printed on the labels, separated by spaces."
            error={fieldError('pieceTags')}
          >
            {(props) => <TextInput {...props} value={pieceTags} onChange={(e) => setPieceTags(e.target.value)} />}
          </Field>
          {!byPotter && (
            <Field
              label="Other potters’ pieces it hurt (tags)"
              hint="Their potters are told, with the photos."
              error={fieldError('hurtTags')}
            >
              {(props) => <TextInput {...props} value={hurtTags} onChange={(e) => setHurtTags(e.target.value)} />}
            </Field>
          )}
          <Field label="Note" error={fieldError('note')}>
            {(props) => <TextArea {...props} rows={3} value={note} onChange={(e) => setNote(e.target.value)} />}
          </Field>
          <Field label="Photos" hint="Up to 8; JPEG, PNG or WebP." error={fieldError('photos')}>
            {(props) => (
              <input
                {...props}
                type="file"
                accept="image/*"
                multiple
                className="block text-sm text-slip-800"
                onChange={(e) => setPhotos(Array.from(e.target.files ?? []))}
              />
            )}
          </Field>
          {error && <Alert tone="danger">{error.message}</Alert>}
          <Button type="submit" busy={report.isPending}>
            Report it
          </Button>
        </form>
      </Card>
    </>
  )
}
