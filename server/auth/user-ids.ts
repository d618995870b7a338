import { generateIdFromEntropySize } from 'lucia';

/** 80 random bits, base32: short enough to read aloud at the hut, long enough never to collide. */
export const generateUserId = (): string => generateIdFromEntropySize(10);
