/** The fields a step's form may refuse: typed fields, a toggle group's buttons, a fieldset's ticks. */
const REFUSED_FIELDS =
  'input.ng-invalid, textarea.ng-invalid, mat-button-toggle-group.ng-invalid button, fieldset.ng-invalid input[type="checkbox"]';

/** Takes a person on the keyboard (or a screen reader) to the first field a step's form refuses. */
export function focusFirstInvalid(step: HTMLElement): void {
  step.querySelector<HTMLElement>(REFUSED_FIELDS)?.focus();
}
