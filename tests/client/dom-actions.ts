import { expect } from 'vitest'
import { settle } from './mount-app'

/** The element with a data-testid anywhere on the page (dialogs render outside the wrapper). */
export const byTestId = (id: string) => document.querySelector<HTMLElement>(`[data-testid="${id}"]`)

/** Clicks the element with a data-testid and lets the page settle; fails when there is none. */
export async function click(id: string): Promise<void> {
  const el = byTestId(id)
  expect(el, `no element with data-testid ${id}`).not.toBeNull()
  el!.click()
  await settle()
}

/** Types into the input inside the element with a data-testid and lets the page settle. */
export async function type(id: string, value: string): Promise<void> {
  const input = document.querySelector<HTMLInputElement>(`[data-testid="${id}"] input`)
  expect(input, `no input in ${id}`).not.toBeNull()
  input!.value = value
  input!.dispatchEvent(new Event('input'))
  await settle()
}
