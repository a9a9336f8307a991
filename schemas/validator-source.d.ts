/** The text of src/input/schema-validators.generated.ts for these two schemas. */
export function standaloneValidatorSource(networkSchema: object, studySchema: object): string;
