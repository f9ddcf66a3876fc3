/** A fresh block id (a UUID fits the document schema's 6–40 character id rule). */
export const newBlockId = () => crypto.randomUUID();

/** Node types that carry attrs.id and that the procedure check can point at. */
export const BLOCK_TYPES = ['reckoner', 'reading', 'checkStep', 'hazardNote', 'image', 'file'] as const;
