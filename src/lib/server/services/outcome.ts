/** Field name → messages, as forms show them. */
export type Issues = Record<string, string[]>;

/** What a change returns: routes map invalid to 400, not_found to 404, conflict to 409. */
export type Outcome<T extends object = object> =
	| ({ kind: 'ok' } & T)
	| { kind: 'invalid'; issues: Issues }
	| { kind: 'not_found' }
	| { kind: 'conflict'; message: string };
