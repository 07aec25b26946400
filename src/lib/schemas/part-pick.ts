import { z } from 'zod';

/*
 * A part typed by name or slug into a form that works without JavaScript (the guide editor's
 * pick and alternates, a build's add-slot and swap). The server looks the text up
 * (services/part-lookup.ts) and hands the operation's schema the part's id, so each operation
 * keeps its one schema for form and API; this only bounds what is typed, as the catalog
 * search does (schemas/parts.ts caps `q` at 100 characters).
 */

export const PART_TEXT_MAX = 100;

export const partText = z
	.string()
	.trim()
	.max(PART_TEXT_MAX, `At most ${PART_TEXT_MAX} characters.`);
