import type { ZodType } from 'zod'

type FieldRule = (value: string) => true | string

/**
 * Vuetify field rules from the shared zod schemas, so a field says the same sentence the
 * server would answer: `useSchemaRules(createProjectSchema.shape).name`.
 */
export function useSchemaRules<K extends string>(shape: Record<K, ZodType>): Record<K, FieldRule[]> {
  const rules = {} as Record<K, FieldRule[]>
  for (const key of Object.keys(shape) as K[]) {
    rules[key] = [
      (value) => {
        const result = shape[key].safeParse(value)
        return result.success || (result.error.issues[0]?.message ?? 'Check this field.')
      },
    ]
  }
  return rules
}
