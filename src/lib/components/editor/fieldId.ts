/** An element id for a dotted form name: "seats.spaces.0.heightMm" → "f-seats-spaces-0-heightMm". */
export const fieldId = (name: string) => `f-${name.replaceAll('.', '-')}`;
