/** A fresh block id (a UUID fits the document schema's 6–40 character id rule). */
export const newBlockId = () => crypto.randomUUID();
