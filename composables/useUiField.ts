import type { ComputedRef, InjectionKey } from 'vue'

/**
 * Wiring between <UiField> (label, hint, error) and the control inside it
 * (<UiInput>, <UiSelect>, <UiTextarea>): the control takes its id,
 * aria-describedby, aria-invalid and required state from the field, so a
 * label is always tied to its input without repeating ids in every form.
 */
export interface UiFieldContext {
  inputId: string
  describedBy: ComputedRef<string | undefined>
  invalid: ComputedRef<boolean>
  required: ComputedRef<boolean>
}

const uiFieldKey: InjectionKey<UiFieldContext> = Symbol('ui-field')

/** Called by <UiField> to offer its wiring to the control in its slot. */
export function provideUiField(context: UiFieldContext): void {
  provide(uiFieldKey, context)
}

/** Called by a form control; null when the control stands outside a <UiField>. */
export function useUiField(): UiFieldContext | null {
  return inject(uiFieldKey, null)
}
