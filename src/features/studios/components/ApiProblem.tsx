import { LoadProblem, type LoadProblemProps } from '../../../components/LoadProblem'

/** A failed load of studio pages: a studio that is gone or unpublished, or one the viewer is not crew of. */
export function ApiProblem(props: Pick<LoadProblemProps, 'error' | 'what' | 'onRetry'>) {
  return (
    <LoadProblem
      {...props}
      notFoundHint="It may have been taken down, or it is not published yet. Check the link you followed."
      forbiddenHint="If you work at this studio, ask its owner to invite you to the crew."
    />
  )
}
