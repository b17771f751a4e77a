/**
 * The two nodes under a section's controls: an alert paragraph for a
 * message (hidden until there is one) and the container of the result.
 */
export interface IOutcomeNodes {
  error: HTMLParagraphElement;
  result: HTMLDivElement;
}

/** Creates the message and result nodes with the shared classes. */
export function outcomeNodes(): IOutcomeNodes {
  const error = document.createElement('p');
  error.className = 'jp-psiscape-fit-error';
  error.setAttribute('role', 'alert');
  error.hidden = true;
  const result = document.createElement('div');
  result.className = 'jp-psiscape-fit-result';
  return { error, result };
}
