import type { DemoUser } from './types';

/*
 * The four role accounts the README documents for trying the product, plus community
 * authors so the guide list shows more than one voice. All people are invented.
 */
export const demoUsers: DemoUser[] = [
	{ email: 'admin@slotwise.test', name: 'Ines Halloran', role: 'admin' },
	{ email: 'editor@slotwise.test', name: 'Dario Vesely', role: 'editor' },
	{ email: 'author@slotwise.test', name: 'Priya Lindqvist', role: 'author' },
	{ email: 'reader@slotwise.test', name: 'Sam Okonkwo-Reyes', role: 'reader' },
	{ email: 'mira.falkenberg@slotwise.test', name: 'Mira Falkenberg', role: 'author' },
	{ email: 'tobias.wren@slotwise.test', name: 'Tobias Wren', role: 'author' },
	{ email: 'aiko.tanabe@slotwise.test', name: 'Aiko Tanabe', role: 'author' }
];
