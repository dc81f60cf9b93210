import { useState, type FormEvent } from 'react'
import { formatDateTime } from '../../../../shared/dates'
import { messageSchema } from '../../../../shared/schemas/requests'
import { Alert } from '../../../components/ui/Alert'
import { Button } from '../../../components/ui/Button'
import { Field, TextArea } from '../../../components/ui/Field'
import { Spinner } from '../../../components/ui/Spinner'
import { ApiError } from '../../../lib/api'
import { useMessages, usePostMessage } from '../api/requests'

interface MessageThreadProps {
  requestId: string
  zone: string
  /** Who is on the other side, in the reader's words ("the studio", "Hazel"). */
  otherSide: string
  canWrite: boolean
}

/** The conversation between the potter and the studio; it refreshes while the page is open. */
export function MessageThread({ requestId, zone, otherSide, canWrite }: MessageThreadProps) {
  const messages = useMessages(requestId)
  const post = usePostMessage(requestId)
  const [body, setBody] = useState('')
  const [error, setError] = useState<string | null>(null)

  const submit = (event: FormEvent) => {
    event.preventDefault()
    const parsed = messageSchema.safeParse({ body })
    if (!parsed.success) return setError(parsed.error.issues[0]?.message ?? 'Write a message.')
    setError(null)
    post.mutate(parsed.data.body, {
      onSuccess: () => setBody(''),
      onError: (failure) => setError(failure instanceof ApiError ? failure.message : 'Not sent. Please try again.'),
    })
  }

  return (
    <div className="space-y-4">
      {messages.isPending ? (
        <Spinner label="Loading messages…" />
      ) : messages.isError ? (
        <Alert tone="danger">
          Could not load the messages: {messages.error.message}{' '}
          <button type="button" className="font-semibold underline" onClick={() => messages.refetch()}>
            Try again
          </button>
        </Alert>
      ) : messages.data.length === 0 ? (
        <p className="text-sm text-slip-600">No messages yet. Ask {otherSide} anything about the ware or the drop-off.</p>
      ) : (
        <ol className="space-y-3" aria-label="Messages" data-testid="messages">
          {messages.data.map((message) => (
            <li key={message.id} className={`flex ${message.mine ? 'justify-end' : 'justify-start'}`}>
              <div
                className={`max-w-[85%] rounded-card px-3 py-2 text-sm ${message.mine ? 'bg-clay-50 text-slip-900' : 'border border-slip-200 bg-white text-slip-900'}`}
              >
                <p className="whitespace-pre-line">{message.body}</p>
                <p className="mt-1 text-xs text-slip-500">
                  {message.mine ? 'You' : message.author}
                  {message.side === 'studio' && !message.mine ? ' (studio)' : ''} ·{' '}
                  <time dateTime={message.at}>{formatDateTime(message.at, zone)}</time>
                </p>
              </div>
            </li>
          ))}
        </ol>
      )}
      {canWrite && (
        <form onSubmit={submit} className="space-y-2" aria-label="Write a message">
          <Field
            label={`Message to ${otherSide}`}
            hint="They get a mail shortly after you write; several messages in a row come as one mail."
            error={error ?? undefined}
          >
            {(a11y) => <TextArea {...a11y} rows={3} value={body} maxLength={4000} onChange={(event) => setBody(event.target.value)} />}
          </Field>
          <div className="flex justify-end">
            <Button type="submit" busy={post.isPending} disabled={body.trim() === ''}>
              Send message
            </Button>
          </div>
        </form>
      )}
    </div>
  )
}
