import { wholeNumberFromText } from './primitives';

/*
 * A posted form, read into the JSON shape of an operation's schema. Every operation that a
 * page and the JSON API both offer has one schema (schemas/build.ts, build-sync.ts,
 * guide-editor.ts); its page action reads the form with a small function from FormReader to
 * that shape and parses with the same schema, so a bad value gets the same message both ways.
 *
 * The reader only converts: text stays text unless the schema wants a number (digits only,
 * primitives.ts) or a boolean (a checkbox). It never validates, and it picks only the
 * fields the operation has, so a button's name or a stray field is never an unknown key.
 */
export class FormReader {
	constructor(readonly data: FormData) {}

	/** The field's text; undefined when absent (a file counts as absent). */
	text(name: string): string | undefined {
		const value = this.data.get(name);
		return typeof value === 'string' ? value : undefined;
	}

	/** Text where a blank field means "none" (null), e.g. an optional amount cleared. */
	textOrNull(name: string): string | null | undefined {
		const value = this.text(name);
		return value === undefined ? undefined : value.trim() === '' ? null : value;
	}

	/** A whole number by the shared rule (ASCII digits only); anything else as posted. */
	number(name: string): unknown {
		const value = this.text(name);
		return value === undefined ? undefined : wholeNumberFromText(value);
	}

	/** A checkbox: ticked posts "on" (or "true"); unticked posts nothing, which is false. */
	checkbox(name: string): boolean {
		const value = this.text(name);
		return value === 'on' || value === 'true';
	}

	/** "true" / "false" from a hidden field or radio; anything else as posted (the schema refuses it). */
	boolean(name: string): unknown {
		const value = this.text(name);
		return value === 'true' ? true : value === 'false' ? false : value;
	}

	/** Every text value of a repeated field (check boxes with one name). */
	all(name: string): string[] {
		return this.data.getAll(name).filter((v): v is string => typeof v === 'string');
	}

	/** Fields named `<prefix><rest>`, as rest → text (e.g. the sync table's `choice:<row>` radios). */
	withPrefix(prefix: string): Record<string, string> {
		const found: Record<string, string> = {};
		for (const [key, value] of this.data)
			if (key.startsWith(prefix) && typeof value === 'string')
				found[key.slice(prefix.length)] = value;
		return found;
	}
}
