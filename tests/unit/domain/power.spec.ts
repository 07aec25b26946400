import { describe, expect, it } from 'vitest';
import {
	amdPptW,
	CARD_CEILING_W,
	COMMON_PSU_SIZES_W,
	CONNECTOR_W,
	cpuSustainedPower,
	cpuSustainedPowerW,
	estimateLoad,
	gpuDeliverable,
	gpuDeliverableW,
	PCIE_SLOT_W,
	powerBudget,
	psuFeedsGpus,
	psuSizing,
	recommendedPsuW
} from '$lib/domain/power';
import {
	boardAm5Atx,
	caseAtx,
	cooler150,
	cpuAm5,
	ddr5Kit,
	goodBuild,
	gpu2x8,
	nvmeGen4,
	psu850,
	slot,
	withSlots
} from './fixtures';

describe('CPU sustained power', () => {
	// AMD press statement, 26 May 2022: "TDP*1.35 is the standard calculation for TDP v. PPT
	// for AMD sockets in the 'Zen' era… (170*1.35=229.5)" — docs/sources.md 8a, status V2
	// (several verbatim copies; primary not retrieved).
	it.each([
		[65, 88],
		[105, 142],
		[120, 162],
		[170, 230]
	])('AMD PPT: TDP %i W → %i W (docs/sources.md 8a, V2)', (tdp, ppt) => {
		expect(amdPptW(tdp)).toBe(ppt);
		expect(cpuSustainedPowerW({ socket: 'AM5', tdpW: tdp })).toBe(ppt);
	});

	it('AM4 maximum 105 W TDP → 142 W PPT; AM5 maximum 170 W → 230 W (docs/sources.md 8a, V2)', () => {
		expect(cpuSustainedPower({ socket: 'AM4', tdpW: 105 })).toMatchObject({
			watts: 142,
			basis: 'amd-ppt'
		});
		expect(cpuSustainedPower({ socket: 'AM5', tdpW: 170 })).toMatchObject({
			watts: 230,
			basis: 'amd-ppt'
		});
	});

	it.each([
		// Exact halves round up (docs/sources.md 8a, V2; note 5: integer arithmetic).
		[170, 230, '170 × 135 = 22950; 22950 / 100 = 229.5 → 230'],
		[90, 122, '90 × 135 = 12150; 121.5 → 122'],
		[30, 41, '30 × 135 = 4050; 40.5 → 41'],
		[95, 128, '95 × 135 = 12825; 128.25 → 128']
	])('AMD PPT rounds half up: TDP %i W → %i W (D: %s)', (tdp, ppt, _arithmetic) => {
		expect(amdPptW(tdp)).toBe(ppt);
	});

	it('prefers a stated sustained package power over any rule', () => {
		expect(cpuSustainedPower({ socket: 'LGA1700', tdpW: 125, packagePowerW: 253 })).toMatchObject({
			watts: 253,
			basis: 'stated'
		});
		expect(cpuSustainedPowerW({ socket: 'AM5', tdpW: 105, packagePowerW: 120 })).toBe(120);
	});

	it('LGA without packagePowerW: Processor Base Power (former TDP / PL1), and says so (docs/sources.md 8b, Intel ARK definitions, wording M)', () => {
		const p = cpuSustainedPower({ socket: 'LGA1851', tdpW: 125 });
		expect(p).toMatchObject({ watts: 125, basis: 'intel-base-power' });
		expect(p.note).toMatch(/Processor Base Power \(PL1\) 125 W/);
		expect(p.note).toMatch(/Maximum Turbo Power \(PL2\)/);
	});
});

describe('graphics card deliverable power (PCIe CEM limits)', () => {
	it('slot 75 W (PCIe CEM x16, docs/sources.md 2a, V2: 12 V × 5.5 A + 3.3 V × 3 A = 66 + 9.9 W)', () => {
		expect(PCIE_SLOT_W).toBe(75);
		expect(gpuDeliverableW({ powerConnectors: { pin6: 0, pin8: 0, h12v2x6: 0 } })).toBe(75);
	});

	it('6-pin 75 W, 8-pin 150 W, 12V-2x6 600 W (Intel 336521 rev 2.0 Table 3-5, docs/sources.md 2b, V)', () => {
		expect(CONNECTOR_W).toEqual({ pin6: 75, pin8: 150, h12v2x6: 600 });
	});

	it.each([
		// [6-pin, 8-pin, 12V-2x6, expected W, arithmetic (D)]
		[1, 0, 0, 150, '75 + 75'],
		[0, 1, 0, 225, '75 + 150'],
		[1, 1, 0, 300, '75 + 75 + 150'],
		[0, 2, 0, 375, '75 + 2 × 150'],
		[0, 3, 0, 525, '75 + 3 × 150']
	])(
		'%i × 6-pin + %i × 8-pin + %i × 12V-2x6 → %i W (D: %s, from 2a and 2b)',
		(pin6, pin8, h12v2x6, watts) => {
			expect(gpuDeliverableW({ powerConnectors: { pin6, pin8, h12v2x6 } })).toBe(watts);
		}
	);

	it('one 12V-2x6 → 75 + 600 = 675 W, exactly the CEM 5.1 card ceiling (2e, V: 336521 rev 2.1a; CEM 5.0 was 600 W)', () => {
		expect(CARD_CEILING_W).toEqual({ cem50: 600, cem51: 675 });
		expect(gpuDeliverable({ powerConnectors: { pin6: 0, pin8: 0, h12v2x6: 1 } })).toEqual({
			slotW: 75,
			connectorsW: 600,
			totalW: 675,
			ceilingW: 675,
			capped: false
		});
	});

	it('caps at the 675 W card ceiling (2e, V): two 12V-2x6 sum to 1275 W but deliver 675 W (D: 75 + 2 × 600)', () => {
		expect(gpuDeliverable({ powerConnectors: { pin6: 0, pin8: 0, h12v2x6: 2 } })).toMatchObject({
			connectorsW: 1200,
			totalW: 675,
			capped: true
		});
	});
});

describe('recommended PSU rating (common practice, no published source: the load at most two thirds of the rating)', () => {
	it('offers only common sizes', () => {
		expect(COMMON_PSU_SIZES_W).toEqual([450, 550, 650, 750, 850, 1000, 1200, 1300, 1500, 1600]);
	});

	it.each([
		// [load, recommended, arithmetic: minimum = ⌈load × 3 / 2⌉, then the next common size]
		[0, 450, 'minimum 0 → the smallest common size'],
		[200, 450, '200 × 1.5 = 300 → 450'],
		[300, 450, '300 × 1.5 = 450 → 450 (load exactly two thirds)'],
		[301, 550, '⌈301 × 1.5⌉ = ⌈451.5⌉ = 452 → 550'],
		[390, 650, '390 × 1.5 = 585 → 650'],
		[433, 650, '⌈649.5⌉ = 650 → 650'],
		[434, 750, '434 × 1.5 = 651 → 750'],
		[500, 750, '500 × 1.5 = 750 → 750'],
		[700, 1200, '700 × 1.5 = 1050 → 1200'],
		[1067, 1700, '⌈1600.5⌉ = 1601, above 1600 → next 100 W: 1700']
	])('load %i W → %i W (common practice, no published source; D: %s)', (load, recommended) => {
		expect(recommendedPsuW(load)).toBe(recommended);
	});

	it('keeps every load from 1 to 1066 W within two thirds of the recommendation (load × 3 ≤ rating × 2)', () => {
		for (let load = 1; load <= 1066; load++) {
			expect(load * 3, `load ${load}`).toBeLessThanOrEqual(recommendedPsuW(load) * 2);
		}
	});

	it('rejects negative or non-numeric loads', () => {
		expect(() => recommendedPsuW(-1)).toThrow(RangeError);
		expect(() => recommendedPsuW(Number.NaN)).toThrow(RangeError);
	});
});

describe('load estimate', () => {
	it('sums CPU, card and documented allowances, with a labelled breakdown (D: arithmetic shown)', () => {
		const { loadW, breakdown } = estimateLoad(goodBuild());
		// CPU 142 (AM5 105 W × 1.35) + cooler fan 3 + board 50 + 2 DDR5 modules × 5 + NVMe 8
		// + card 263 + 3 case fans × 3 + USB 15 = 500
		expect(loadW).toBe(500);
		expect(breakdown.map((l) => [l.key, l.watts])).toEqual([
			['cpu', 142],
			['cooler', 3],
			['board', 50],
			['memory', 10],
			['storage', 8],
			['gpu', 263],
			['case', 9],
			['allowance:usb', 15]
		]);
		expect(breakdown.find((l) => l.key === 'cpu')?.basis).toMatch(/105 W TDP × 1\.35 = 142 W/);
		expect(breakdown.find((l) => l.key === 'cpu')?.label).toBe('cpu: Tarnwick Vela 65X');
		for (const key of ['cooler', 'board', 'memory', 'storage', 'case', 'allowance:usb']) {
			expect(breakdown.find((l) => l.key === key)?.basis, key).toMatch(
				/common practice \(no published source\)/
			);
		}
	});

	it('counts quantities, liquid cooler pump and radiator fans, fan packs and a missing board', () => {
		const liquid = slot('cooler', 'cooler', 'Ostery', 'Loop 360', {
			type: 'liquid',
			radiatorMm: 360,
			sockets: ['AM5'],
			ratedHeatW: 300
		});
		const liquid280 = slot('cooler', 'cooler2', 'Ostery', 'Loop 280', {
			type: 'liquid',
			radiatorMm: 280,
			sockets: ['AM5'],
			ratedHeatW: 280
		});
		const fans = slot(
			'fan',
			'fans',
			'Ostery',
			'Draft 120 (3-pack)',
			{ sizeMm: 120, count: 3, maxRpm: 1500 },
			2
		);
		const hdd = slot(
			'storage',
			'hdd',
			'Brightmoor',
			'Vault 8 TB',
			{ interface: 'sata', formFactor: '3.5in', capacityGb: 8000, readMbs: 250, writeMbs: 250 },
			2
		);
		const { breakdown } = estimateLoad([
			cpuAm5,
			liquid,
			liquid280,
			fans,
			hdd,
			{ ...ddr5Kit, quantity: 2 }
		]);
		// Allowances (common practice, no published source): fan 3 W, pump 5 W, 3.5-inch
		// drive 10 W, DDR5 module 5 W, board 50 W.
		expect(breakdown.map((l) => [l.key, l.watts])).toEqual([
			['cpu', 142], // 105 W TDP × 1.35 = 141.75 → 142 (8a)
			['cooler', 14], // 360 mm = 3 × 120 mm fans: pump 5 + 3 × 3 = 14
			['cooler2', 11], // 280 mm = 2 × 140 mm fans: 5 + 2 × 3 = 11
			['fans', 18], // 2 packs × 3 fans = 6 fans × 3 = 18
			['hdd', 20], // 2 × 10
			['memory', 20], // 2 kits × 2 modules = 4 × 5
			['allowance:motherboard', 50], // no board slot: counted anyway
			['allowance:usb', 15]
		]);
	});
});

describe('PSU leads vs card inlets', () => {
	const card = (boardPowerW: number, pin6: number, pin8: number, h12v2x6: number) =>
		slot('gpu', 'gpu', 'Ferrant', `Test ${boardPowerW}`, {
			chip: 'T',
			vramGb: 8,
			lengthMm: 250,
			slotWidth: 2,
			boardPowerW,
			powerConnectors: { pin6, pin8, h12v2x6 },
			pcieGen: 4
		});
	const supply = (pin6: number, pin8: number, h12v2x6: number) =>
		slot('psu', 'psu', 'Ostery', `Leads ${pin6}/${pin8}/${h12v2x6}`, {
			ratedW: 850,
			formFactor: 'ATX',
			efficiency: '80 PLUS Gold',
			modular: 'full',
			connectors: { pin6, pin8, h12v2x6, eps8: 2 },
			atx3: false
		});

	it('native leads for every inlet: ok', () => {
		const findings = psuFeedsGpus(psu850, [gpu2x8]);
		expect(findings).toHaveLength(1);
		expect(findings[0]).toMatchObject({
			rule: 'gpu-power-connectors',
			severity: 'ok',
			slots: ['gpu', 'psu']
		});
		expect(findings[0]?.message).toContain('Ostery Current 850');
		expect(findings[0]?.message).toContain('Ferrant Kestrel 16G');
	});

	it('a 12V-2x6 card with a native 12V-2x6 lead: ok', () => {
		expect(psuFeedsGpus(psu850, [card(450, 0, 0, 1)]).map((f) => f.severity)).toEqual(['ok']);
	});

	it('a 300 W 12V-2x6 card on 8-pin leads: caution, adapter from 2 × 8-pin = 300 W (2b, V: 150 W per 8-pin; D: 300 − 75 slot = 225 W → 2 leads)', () => {
		const [f, ...rest] = psuFeedsGpus(supply(0, 3, 0), [card(300, 0, 0, 1)]);
		expect(rest).toEqual([]);
		expect(f?.severity).toBe('caution');
		expect(f?.message).toContain('2 × 8-pin (2 × 150 W = 300 W)');
		expect(f?.message).toContain('about 225 W');
	});

	it('a 450 W 12V-2x6 card needs 3 × 8-pin through an adapter (D: 450 − 75 = 375 W → ⌈375 / 150⌉ = 3); two leads are a conflict', () => {
		expect(psuFeedsGpus(supply(0, 3, 0), [card(450, 0, 0, 1)])[0]?.message).toContain(
			'3 × 8-pin (3 × 150 W = 450 W)'
		);
		const [f] = psuFeedsGpus(supply(0, 2, 0), [card(450, 0, 0, 1)]);
		expect(f?.severity).toBe('conflict');
		expect(f?.message).toMatch(/short of the 3 an adapter needs/);
	});

	it('too few 8-pin leads: conflict naming the counts', () => {
		const [f] = psuFeedsGpus(supply(0, 1, 0), [gpu2x8]);
		expect(f).toMatchObject({ severity: 'conflict' });
		expect(f?.message).toBe(
			'Ferrant Kestrel 16G needs 2 × 8-pin PCIe power; Ostery Leads 0/1/0 has 1 8-pin lead.'
		);
	});

	it('6-pin inlets take spare 6+2 leads; without any it is a conflict', () => {
		expect(psuFeedsGpus(supply(0, 2, 0), [card(225, 1, 1, 0)]).map((f) => f.severity)).toEqual([
			'ok'
		]);
		expect(psuFeedsGpus(supply(0, 1, 0), [card(225, 1, 1, 0)]).map((f) => f.severity)).toEqual([
			'conflict'
		]);
	});

	it('a card without power inlets draws from the slot only (75 W, 2a)', () => {
		const [f] = psuFeedsGpus(supply(0, 0, 0), [card(70, 0, 0, 0)]);
		expect(f?.severity).toBe('ok');
		expect(f?.message).toContain('75 W');
	});
});

describe('power budget', () => {
	it('combines load, recommendation, PSU headroom and the card power paths (D: 850 − 500 = 350 W = 41 % of 850; 500 × 1.5 = 750)', () => {
		const budget = powerBudget(goodBuild());
		expect(budget).toMatchObject({
			loadW: 500,
			minimumW: 750,
			recommendedW: 750,
			psuSeverity: 'ok',
			psuRatedW: 850,
			headroomPct: 41,
			gpus: [
				{
					key: 'gpu',
					name: 'Ferrant Kestrel 16G',
					quantity: 1,
					boardPowerW: 263,
					deliverableW: 375,
					severity: 'ok'
				}
			],
			gpuLeads: 'ok'
		});
	});

	it('flags connectors that cannot feed the card and leaves PSU fields out without a PSU', () => {
		const weak = slot('psu', 'psu', 'Ostery', 'Basic 650', {
			ratedW: 650,
			formFactor: 'ATX',
			efficiency: '80 PLUS Bronze',
			modular: 'none',
			connectors: { pin6: 0, pin8: 1, h12v2x6: 0, eps8: 1 },
			atx3: false
		});
		expect(powerBudget(withSlots(weak)).gpuLeads).toBe('conflict');
		const noPsu = powerBudget([cpuAm5, cooler150, boardAm5Atx, ddr5Kit, nvmeGen4, gpu2x8, caseAtx]);
		expect(noPsu.psuRatedW).toBeUndefined();
		expect(noPsu.headroomPct).toBeUndefined();
		expect(noPsu.gpuLeads).toBeUndefined();
	});
});

describe('issue 13: PSU sizing, one threshold (two thirds; common practice, no published source)', () => {
	it.each([
		// [load, rated, severity, minimum, recommended, arithmetic (D)]
		[
			430,
			700,
			'ok',
			645,
			650,
			'430 × 3 = 1290 ≤ 700 × 2 = 1400; 430 × 3 / 2 = 645 → next common size 650'
		],
		[467, 700, 'caution', 701, 750, '467 × 3 = 1401 > 1400; ⌈467 × 1.5⌉ = ⌈700.5⌉ = 701 → 750'],
		[
			466,
			700,
			'ok',
			699,
			750,
			'466 × 3 = 1398 ≤ 1400; 699 → 750 (700 W itself is within: 699 ≤ 700)'
		],
		[
			700,
			700,
			'caution',
			1050,
			1200,
			'700 × 3 = 2100 > 1400; not below the load, so not a conflict'
		],
		[701, 700, 'conflict', 1052, 1200, '701 > 700; ⌈1051.5⌉ = 1052 → 1200']
	] as const)(
		'load %i W on %i W → %s, minimum %i W, recommended %i W (D: %s)',
		(load, ratedW, severity, minimumW, recommendedW, _arithmetic) => {
			expect(psuSizing(load, ratedW)).toMatchObject({ severity, minimumW, recommendedW });
		}
	);
});

describe('issue 13: load estimate gaps', () => {
	it('a bundled cooler has a fan too: 3 W when the CPU brings its cooler and the build has no cooler slot (allowance, common practice, no published source)', () => {
		const boxed = slot('cpu', 'cpu', 'Tarnwick', 'Vela 65', {
			...cpuAm5.part.specs,
			tdpW: 65,
			bundledCooler: true
		});
		const { loadW, breakdown } = estimateLoad([boxed, boardAm5Atx]);
		// 88 (65 W × 1.35 = 87.75 → 88, 8a) + 3 (bundled cooler fan) + 50 (board) + 15 (USB) = 156 W
		expect(breakdown.map((l) => [l.key, l.watts])).toEqual([
			['cpu', 88],
			['allowance:bundled-cooler', 3],
			['board', 50],
			['allowance:usb', 15]
		]);
		expect(loadW).toBe(156);
	});

	it('counts the board allowance per board (quantity 2 → 2 × 50 = 100 W; common practice)', () => {
		const { breakdown } = estimateLoad([{ ...boardAm5Atx, quantity: 2 }]);
		expect(breakdown.find((l) => l.key === 'board')?.watts).toBe(100);
	});
});
