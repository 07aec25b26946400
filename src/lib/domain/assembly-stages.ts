/*
 * Assembly stages: the fixed order a desktop PC goes together in, in our own words
 * (docs/architecture.md "Gallery", "Assembly checklist"). Gallery photos are filed under a
 * stage; a build's checklist has one tick per stage. The keys are stored (gallery_photos,
 * build_stage_ticks), so they never change; labels may.
 *
 * Cautions follow the product's safety rule (docs/architecture.md; help/safety): the usual
 * warnings where a stage can hurt someone, always deferring to the manufacturers' manuals
 * and local electrical codes. Common practice, no published source.
 */
export const ASSEMBLY_STAGES = [
	{ key: 'prepare-case', label: 'Prepare the case' },
	{ key: 'cpu-memory', label: 'CPU and memory on the board' },
	{ key: 'cooler', label: 'CPU cooler' },
	{ key: 'board-into-case', label: 'Board into the case' },
	{ key: 'storage', label: 'Storage' },
	{ key: 'psu-cabling', label: 'Power supply and cabling' },
	{ key: 'graphics-card', label: 'Graphics card' },
	{ key: 'cable-management', label: 'Cable management' },
	{ key: 'first-boot', label: 'First boot' }
] as const;

export type AssemblyStage = (typeof ASSEMBLY_STAGES)[number]['key'];
export const ASSEMBLY_STAGE_KEYS = ASSEMBLY_STAGES.map((s) => s.key) as [
	AssemblyStage,
	...AssemblyStage[]
];

export function isAssemblyStage(value: string): value is AssemblyStage {
	return (ASSEMBLY_STAGE_KEYS as readonly string[]).includes(value);
}

export function stageLabel(key: string): string {
	return ASSEMBLY_STAGES.find((s) => s.key === key)?.label ?? key;
}

export const CAUTIONS = {
	mains:
		'Switch the power supply off and unplug it from the mains before you work inside the case.',
	psu: 'Never open a power supply: its capacitors can hold a dangerous charge after it is unplugged.',
	edges:
		'Case edges, slot covers and fan grilles can be sharp; move slowly and wear thin gloves if needed.',
	static:
		'Discharge static first: touch bare metal on the case frame or wear a wrist strap clipped to it.',
	seating:
		'Push every power connector fully home until its latch clicks and no gap shows; a half-seated connector can overheat.'
} as const;
export type CautionKey = keyof typeof CAUTIONS;

const STAGE_CAUTIONS: Record<AssemblyStage, CautionKey[]> = {
	'prepare-case': ['mains', 'edges'],
	'cpu-memory': ['static'],
	cooler: ['static'],
	'board-into-case': ['static', 'edges'],
	storage: ['static'],
	'psu-cabling': ['mains', 'psu', 'seating'],
	'graphics-card': ['static', 'seating'],
	'cable-management': ['edges', 'seating'],
	'first-boot': ['mains', 'seating']
};

/** The cautions shown with a stage, in a fixed order. */
export function cautionsFor(stage: AssemblyStage): string[] {
	return STAGE_CAUTIONS[stage].map((k) => CAUTIONS[k]);
}

export const DEFER_TO_MANUALS =
	"Follow your local electrical codes and the manufacturers' manuals; where a guide and a manual disagree, the manual wins.";

export interface StageSteps {
	/** Steps written before any stage heading: shown above the checklist, not ticked. */
	general: string[];
	byStage: Partial<Record<AssemblyStage, string[]>>;
}

/*
 * Build-notes steps per stage. The rule, documented for authors in help/photos: inside the
 * "Assembly steps" section, a heading (any level, "### Cooler") whose text is a stage's
 * name (case and surrounding punctuation ignored) or its key starts that stage; the list
 * items below it, up to the next such heading, are that stage's steps. A heading that names
 * no stage ends the current stage. Steps before the first stage heading are general.
 */
export function stepsByStage(assemblyMarkdown: string): StageSteps {
	const result: StageSteps = { general: [], byStage: {} };
	let current: AssemblyStage | null = null;
	let inList = false;
	let step: string[] | null = null;
	const flush = () => {
		if (!step) return;
		const text = step.join(' ').replace(/\s+/g, ' ').trim();
		if (text) {
			if (current) (result.byStage[current] ??= []).push(text);
			else result.general.push(text);
		}
		step = null;
	};
	for (const line of assemblyMarkdown.split('\n')) {
		const heading = /^\s{0,3}#{1,6}\s+(.+?)\s*#*\s*$/.exec(line)?.[1];
		if (heading !== undefined) {
			flush();
			current = stageNamed(heading);
			inList = false;
			continue;
		}
		const item = /^\s{0,3}(?:[-*+]|\d{1,3}[.)])\s+(.*)$/.exec(line);
		if (item) {
			flush();
			step = [item[1] ?? ''];
			inList = true;
			continue;
		}
		if (inList && step && /^\s{2,}\S/.test(line)) {
			step.push(line.trim());
			continue;
		}
		flush();
		inList = false;
	}
	flush();
	return result;
}

function stageNamed(heading: string): AssemblyStage | null {
	const plain = heading
		.toLowerCase()
		.replace(/[^a-z0-9 -]+/g, ' ')
		.replace(/\s+/g, ' ')
		.trim();
	for (const stage of ASSEMBLY_STAGES) {
		if (plain === stage.key || plain === stage.label.toLowerCase()) return stage.key;
	}
	return null;
}

/** Done and total stages, and the whole-percent share done (rounded down, so 100 means all). */
export function checklistProgress(
	stages: readonly AssemblyStage[],
	ticked: ReadonlySet<string>
): { done: number; total: number; percent: number } {
	const done = stages.filter((s) => ticked.has(s)).length;
	const total = stages.length;
	return { done, total, percent: total === 0 ? 0 : Math.floor((done * 100) / total) };
}
