/*
 * Price sightings, as readers and the editors' queue see them. Types only.
 */
import type { Money } from '$lib/domain/types';
import type { PriceSightingState } from '$lib/server/db/models/PriceSighting';

/** A sighting as the people who reported it see it. */
export interface MySighting {
	id: number;
	storeName: string;
	regionName: string;
	price: Money;
	/** YYYY-MM-DD, UTC. */
	observedOn: string;
	seenCount: number;
	state: PriceSightingState;
	rejectReason: string | null;
}

/** A pending sighting as editors see it. */
export interface PendingSighting {
	id: number;
	part: { slug: string; name: string };
	storeName: string;
	region: { code: string; name: string };
	price: Money;
	observedOn: string;
	url: string;
	seenCount: number;
	submittedBy: { name: string | null; email: string } | null;
	/** ISO 8601, UTC. */
	createdAt: string;
}

export interface SightingRegionOption {
	code: string;
	name: string;
	currency: string;
	/** Minor-unit digits of the currency (ISO 4217 exponent), for the price hint. */
	digits: number;
	stores: { id: number; name: string }[];
}
