import { LoadProblem, type LoadProblemProps } from '../../../components/LoadProblem'

/** A failed load of a request: not there, or not the viewer's, which looks the same from outside. */
export function RequestProblem(props: Pick<LoadProblemProps, 'error' | 'what' | 'onRetry' | 'back'>) {
  return (
    <LoadProblem
      {...props}
      notFoundHint="The link may be old, or it is for another account. Check that you are signed in as the right person."
    />
  )
}
