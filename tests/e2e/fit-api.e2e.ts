import { expect, test } from '@playwright/test';

/*
 * POST /api/v1/fit over HTTP against the production build. Parts are typed in as specs
 * (invented names, real standards); each case breaks exactly one rule.
 */
const cpuAm5 = {
	socket: 'AM5',
	cores: 8,
	threads: 16,
	baseClockGhz: 4.2,
	boostClockGhz: 5.0,
	tdpW: 105,
	memoryTypes: ['DDR5'],
	integratedGraphics: true,
	bundledCooler: false
};
const boardAm5Atx = {
	socket: 'AM5',
	chipset: 'X-sample',
	formFactor: 'ATX',
	memoryType: 'DDR5',
	memorySlots: 4,
	maxMemoryGb: 192,
	m2Slots: [{ pcieGen: 4, maxLengthMm: 80 }],
	sataPorts: 4,
	wifi: true
};
const coolerAm5 = { type: 'air', heightMm: 155, sockets: ['AM5', 'LGA1700'], ratedHeatW: 220 };
const ramDdr5 = {
	type: 'DDR5',
	modules: 2,
	moduleGb: 16,
	speedMts: 6000,
	casLatency: 30,
	voltage: 1.35
};
const gpu = {
	chip: 'Sample 70',
	vramGb: 12,
	lengthMm: 336,
	slotWidth: 2.5,
	boardPowerW: 250,
	powerConnectors: { pin6: 0, pin8: 2, h12v2x6: 0 },
	pcieGen: 4
};
const psu = {
	ratedW: 850,
	formFactor: 'ATX',
	efficiency: '80 PLUS Gold',
	modular: 'full',
	connectors: { pin6: 0, pin8: 4, h12v2x6: 1, eps8: 2 },
	atx3: true
};
const caseAtx = {
	boardFormFactors: ['ATX', 'microATX', 'Mini-ITX'],
	maxGpuLengthMm: 360,
	maxCoolerHeightMm: 170,
	psuFormFactors: ['ATX'],
	radiatorMm: 360,
	includedFans: 3,
	fanMounts: 8,
	bays25: 2,
	bays35: 2
};

function build(
	overrides: Partial<Record<string, { category: string; specs: Record<string, unknown> }>> = {}
) {
	const base: Record<string, { category: string; specs: Record<string, unknown> }> = {
		cpu: { category: 'cpu', specs: cpuAm5 },
		cooler: { category: 'cooler', specs: coolerAm5 },
		board: { category: 'motherboard', specs: boardAm5Atx },
		memory: { category: 'memory', specs: ramDdr5 },
		gpu: { category: 'gpu', specs: gpu },
		psu: { category: 'psu', specs: psu },
		case: { category: 'case', specs: caseAtx },
		...overrides
	};
	return {
		slots: Object.entries(base).map(([key, s]) => ({
			key,
			category: s.category,
			brand: 'Sample',
			model: key,
			specs: s.specs
		}))
	};
}

type Finding = { rule: string; severity: string; message: string; slots: string[] };

async function findings(
	request: import('@playwright/test').APIRequestContext,
	body: unknown
): Promise<Finding[]> {
	const response = await request.post('/api/v1/fit', { data: body });
	expect(response.status()).toBe(200);
	const json = (await response.json()) as {
		findings: Finding[];
		power: { loadW: number; recommendedW: number };
	};
	expect(json.power.loadW).toBeGreaterThan(0);
	return json.findings;
}

const conflicts = (list: Finding[]) => list.filter((f) => f.severity === 'conflict');

test('a compatible build has no conflict', async ({ request }) => {
	expect(conflicts(await findings(request, build()))).toEqual([]);
});

test('an AM5 CPU on an LGA1700 board is a conflict', async ({ request }) => {
	const list = await findings(
		request,
		build({ board: { category: 'motherboard', specs: { ...boardAm5Atx, socket: 'LGA1700' } } })
	);
	expect(conflicts(list).some((f) => /AM5/.test(f.message) && /LGA1700/.test(f.message))).toBe(
		true
	);
});

test('DDR4 memory on a DDR5 board is a conflict', async ({ request }) => {
	const list = await findings(
		request,
		build({
			memory: {
				category: 'memory',
				specs: { ...ramDdr5, type: 'DDR4', speedMts: 3200, casLatency: 16, voltage: 1.2 }
			}
		})
	);
	expect(conflicts(list).some((f) => /DDR4/.test(f.message) && /DDR5/.test(f.message))).toBe(true);
});

test('a card longer than the case allows is a conflict naming both lengths', async ({
	request
}) => {
	const list = await findings(
		request,
		build({ case: { category: 'case', specs: { ...caseAtx, maxGpuLengthMm: 330 } } })
	);
	expect(conflicts(list).some((f) => /336 mm/.test(f.message) && /330 mm/.test(f.message))).toBe(
		true
	);
});

test('an ATX board in a Mini-ITX-only case is a conflict', async ({ request }) => {
	const list = await findings(
		request,
		build({ case: { category: 'case', specs: { ...caseAtx, boardFormFactors: ['Mini-ITX'] } } })
	);
	expect(conflicts(list).some((f) => /ATX/.test(f.message) && /Mini-ITX/.test(f.message))).toBe(
		true
	);
});

test('a PCIe 5.0 drive in a PCIe 4.0 M.2 slot is a caution, not a conflict', async ({
	request
}) => {
	const drive = {
		interface: 'nvme',
		formFactor: 'm2-2280',
		pcieGen: 5,
		capacityGb: 2000,
		readMbs: 12000,
		writeMbs: 11000
	};
	const list = await findings(request, {
		slots: [
			...build().slots,
			{ key: 'drive', category: 'storage', brand: 'Sample', model: 'drive', specs: drive }
		]
	});
	const m2 = list.filter((f) => f.slots.includes('drive'));
	expect(m2.some((f) => f.severity === 'caution')).toBe(true);
	expect(m2.some((f) => f.severity === 'conflict')).toBe(false);
});

test('bad input gets 400 with field messages: unknown field, absurd length, unknown category', async ({
	request
}) => {
	const unknownField = await request.post('/api/v1/fit', {
		data: build({ gpu: { category: 'gpu', specs: { ...gpu, lenghtMm: 300 } } })
	});
	expect(unknownField.status()).toBe(400);
	expect(Object.keys((await unknownField.json()).issues)).toEqual(
		expect.arrayContaining([expect.stringMatching(/^slots\.4\.specs/)])
	);

	const absurd = await request.post('/api/v1/fit', {
		data: build({ gpu: { category: 'gpu', specs: { ...gpu, lengthMm: 5000 } } })
	});
	expect(absurd.status()).toBe(400);
	expect(JSON.stringify(await absurd.json())).toMatch(/lengthMm/);

	const category = await request.post('/api/v1/fit', {
		data: { slots: [{ category: 'toaster', specs: {} }] }
	});
	expect(category.status()).toBe(400);
});
