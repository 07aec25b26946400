import { describe, expect, it } from 'vitest';
import {
	BOARD_SIZES_MM,
	boardSizeText,
	fitReport,
	m2LengthMm,
	summarize,
	type Finding
} from '$lib/domain/fit';
import { powerBudget } from '$lib/domain/power';
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
	without,
	withSlots
} from './fixtures';

const byRule = (findings: Finding[], rule: string) => findings.filter((f) => f.rule === rule);
const only = (findings: Finding[], rule: string): Finding => {
	const matches = byRule(findings, rule);
	expect(matches, `${rule}: ${JSON.stringify(findings.map((f) => f.rule))}`).toHaveLength(1);
	return matches[0]!;
};

describe('board sizes (docs/sources.md 1a–1d)', () => {
	it('ATX 12 × 9.6 in = 305 × 244 mm (Intel microATX Motherboard Interface Specification v1.2 §2.1 Table 3, V; D: 12 × 25.4 = 304.8, 9.6 × 25.4 = 243.84)', () => {
		expect(BOARD_SIZES_MM.ATX).toMatchObject({ widthMm: 305, depthMm: 244 });
		expect(Math.round(12 * 25.4)).toBe(305);
		expect(Math.round(9.6 * 25.4)).toBe(244);
	});

	it('microATX maximum 9.6 × 9.6 in = 244 × 244 mm (same Table 3, V)', () => {
		expect(BOARD_SIZES_MM.microATX).toMatchObject({ widthMm: 244, depthMm: 244 });
	});

	it('Mini-ITX 170 × 170 mm (Intel Mini-ITX Addendum v1.1, §1 Table 1, V)', () => {
		expect(BOARD_SIZES_MM['Mini-ITX']).toMatchObject({ widthMm: 170, depthMm: 170 });
	});

	it('E-ATX has no standard size (docs/sources.md 1d, V2: the standard 12 × 13 in board is SSI EEB)', () => {
		expect(BOARD_SIZES_MM['E-ATX']).toBeNull();
		expect(boardSizeText('E-ATX')).toContain('no standard size');
		expect(boardSizeText('E-ATX')).toContain('305 × 330 mm');
	});
});

describe('M.2 module lengths from their names (docs/sources.md 7, V2: name = 22 mm width + length in mm)', () => {
	it.each([
		['m2-2230', 30],
		['m2-2242', 42],
		['m2-2260', 60],
		['m2-2280', 80],
		['m2-22110', 110]
	])('%s → %i mm', (formFactor, mm) => {
		expect(m2LengthMm(formFactor)).toBe(mm);
	});

	it('is null for drives that are not M.2', () => {
		expect(m2LengthMm('2.5in')).toBeNull();
	});
});

describe('fit report', () => {
	it('a build that fits gives only ok findings, one for each rule it could run', () => {
		const findings = fitReport(goodBuild());
		expect(findings.filter((f) => f.severity !== 'ok')).toEqual([]);
		expect(findings.map((f) => f.rule)).toEqual([
			'cpu-socket-board',
			'cpu-socket-cooler',
			'memory-type-board',
			'memory-type-cpu',
			'memory-slots',
			'memory-capacity',
			'm2-slot',
			'board-form-factor-case',
			'gpu-length-case',
			'cooler-height-case',
			'psu-form-factor-case',
			'psu-rating',
			'gpu-board-power',
			'gpu-power-connectors',
			'cpu-power-leads',
			'cooler-heat'
		]);
		const keys = new Set(goodBuild().map((s) => s.key));
		for (const f of findings) {
			expect(f.message.length).toBeGreaterThan(20);
			expect(f.slots.length).toBeGreaterThan(0);
			for (const key of f.slots) expect(keys.has(key), key).toBe(true);
		}
		expect(summarize(findings)).toEqual({ ok: 16, caution: 0, conflict: 0, worst: 'ok' });
	});

	// "Done when" cases of issue 4, at domain level.
	describe('done-when cases', () => {
		it('an AM5 CPU on an LGA1700 board is a conflict naming both parts and sockets', () => {
			const board = slot('motherboard', 'board', 'Quellbrook', 'Z7 ATX', {
				socket: 'LGA1700',
				chipset: 'Q790',
				formFactor: 'ATX',
				memoryType: 'DDR5',
				memorySlots: 4,
				maxMemoryGb: 192,
				m2Slots: [{ pcieGen: 4, maxLengthMm: 80 }],
				sataPorts: 4,
				wifi: false
			});
			const f = only(fitReport(withSlots(board)), 'cpu-socket-board');
			expect(f).toEqual({
				rule: 'cpu-socket-board',
				severity: 'conflict',
				slots: ['cpu', 'board'],
				message: 'Tarnwick Vela 65X is an AM5 CPU; Quellbrook Z7 ATX has an LGA1700 socket.'
			});
		});

		it('DDR4 memory on a DDR5 board is a conflict', () => {
			const kit = slot('memory', 'memory', 'Halden', 'Pulse DDR4-3200 2 × 16 GB', {
				type: 'DDR4',
				modules: 2,
				moduleGb: 16,
				speedMts: 3200,
				casLatency: 16,
				voltage: 1.35
			});
			const findings = fitReport(withSlots(kit));
			expect(only(findings, 'memory-type-board')).toEqual({
				rule: 'memory-type-board',
				severity: 'conflict',
				slots: ['memory', 'board'],
				message: 'Halden Pulse DDR4-3200 2 × 16 GB is DDR4; Quellbrook B6 ATX takes DDR5 only.'
			});
			// AM5 supports DDR5 only (docs/sources.md 9, V2), so the CPU rule agrees.
			expect(only(findings, 'memory-type-cpu').severity).toBe('conflict');
		});

		it('a card longer than the case allows is a conflict: "card is 336 mm, case fits 330 mm"', () => {
			const long = slot('gpu', 'gpu', 'Ferrant', 'Kestrel XL', {
				chip: 'K80',
				vramGb: 16,
				lengthMm: 336,
				slotWidth: 3.2,
				boardPowerW: 300,
				powerConnectors: { pin6: 0, pin8: 0, h12v2x6: 1 },
				pcieGen: 5
			});
			const f = only(fitReport(withSlots(long)), 'gpu-length-case');
			expect(f.severity).toBe('conflict');
			expect(f.slots).toEqual(['gpu', 'case']);
			expect(f.message).toBe(
				'Ferrant Kestrel XL is too long for Halden Atrium: card is 336 mm, case fits 330 mm (6 mm over).'
			);
		});

		it('a Mini-ITX-only case with an ATX board is a conflict quoting the standard sizes (docs/sources.md 1a, 1c)', () => {
			const itxCase = slot('case', 'case', 'Halden', 'Pocket', {
				boardFormFactors: ['Mini-ITX'],
				maxGpuLengthMm: 330,
				maxCoolerHeightMm: 165,
				psuFormFactors: ['ATX'],
				radiatorMm: 240,
				includedFans: 1,
				fanMounts: 2,
				bays25: 1,
				bays35: 0
			});
			const f = only(fitReport(withSlots(itxCase)), 'board-form-factor-case');
			expect(f.severity).toBe('conflict');
			expect(f.slots).toEqual(['board', 'case']);
			expect(f.message).toBe(
				'Quellbrook B6 ATX is ATX (305 × 244 mm); Halden Pocket takes Mini-ITX only (largest: Mini-ITX (170 × 170 mm)).'
			);
		});

		it('a PCIe 5.0 drive in a 4.0 slot is a caution, not a conflict, with the bandwidths (docs/sources.md 6: 5.0 x4 ≈ 15.75, 4.0 x4 ≈ 7.88 GB/s, D)', () => {
			const gen4Board = slot('motherboard', 'board', 'Quellbrook', 'B6M Base', {
				socket: 'AM5',
				chipset: 'Q650',
				formFactor: 'microATX',
				memoryType: 'DDR5',
				memorySlots: 4,
				maxMemoryGb: 192,
				m2Slots: [
					{ pcieGen: 4, maxLengthMm: 80 },
					{ pcieGen: 4, maxLengthMm: 80 }
				],
				sataPorts: 4,
				wifi: false
			});
			const gen5Drive = slot('storage', 'storage', 'Brightmoor', 'N5 2 TB', {
				interface: 'nvme',
				formFactor: 'm2-2280',
				pcieGen: 5,
				capacityGb: 2000,
				readMbs: 14000,
				writeMbs: 12000
			});
			const findings = fitReport(withSlots(gen4Board, gen5Drive));
			const f = only(findings, 'm2-slot');
			expect(f.severity).toBe('caution');
			expect(f.slots).toEqual(['storage', 'board']);
			expect(f.message).toBe(
				'Brightmoor N5 2 TB is a PCIe 5.0 drive in M.2 slot 1 of Quellbrook B6M Base (PCIe 4.0, up to 80 mm): it works, but at up to 7.88 GB/s instead of 15.75 GB/s (x4 link, usable one direction).'
			);
			expect(summarize(findings).conflict).toBe(0);
		});
	});

	describe('platform', () => {
		it('a cooler without a mount for the CPU socket is a conflict', () => {
			const amOnly = slot('cooler', 'cooler', 'Ostery', 'Slim 135', {
				type: 'air',
				heightMm: 135,
				sockets: ['AM4', 'AM5'],
				ratedHeatW: 180
			});
			const lgaCpu = slot('cpu', 'cpu', 'Marrow', 'Core 14', {
				socket: 'LGA1700',
				cores: 14,
				threads: 20,
				baseClockGhz: 3.5,
				boostClockGhz: 5.3,
				tdpW: 125,
				packagePowerW: 181,
				memoryTypes: ['DDR4', 'DDR5'],
				integratedGraphics: true,
				bundledCooler: false
			});
			const f = only(fitReport([lgaCpu, amOnly]), 'cpu-socket-cooler');
			expect(f.severity).toBe('conflict');
			expect(f.message).toBe('Ostery Slim 135 mounts on AM4, AM5 only; Marrow Core 14 is LGA1700.');
		});

		it('counts modules over all kits and quantities against the board slots, and capacity against the maximum', () => {
			const itx = slot('motherboard', 'board', 'Quellbrook', 'B6I', {
				socket: 'AM5',
				chipset: 'Q650',
				formFactor: 'Mini-ITX',
				memoryType: 'DDR5',
				memorySlots: 2,
				maxMemoryGb: 48,
				m2Slots: [{ pcieGen: 4, maxLengthMm: 80 }],
				sataPorts: 2,
				wifi: true
			});
			const findings = fitReport(withSlots(itx, { ...ddr5Kit, quantity: 2 }));
			const slots = only(findings, 'memory-slots');
			expect(slots.severity).toBe('conflict');
			expect(slots.message).toBe(
				'2 × Halden Flux DDR5-6000 2 × 16 GB: 4 modules, but Quellbrook B6I has 2 memory slots.'
			);
			const capacity = only(findings, 'memory-capacity');
			expect(capacity.severity).toBe('conflict');
			expect(capacity.message).toContain('64 GB in total, above the 48 GB');
		});
	});

	describe('case fit', () => {
		const eatxBoard = slot('motherboard', 'board', 'Quellbrook', 'X6 Extended', {
			socket: 'AM5',
			chipset: 'Q670',
			formFactor: 'E-ATX',
			memoryType: 'DDR5',
			memorySlots: 4,
			maxMemoryGb: 256,
			m2Slots: [{ pcieGen: 5, maxLengthMm: 80 }],
			sataPorts: 6,
			wifi: true
		});

		it('E-ATX: no standard size, so only a case listing E-ATX takes it (docs/sources.md 1d and note 10)', () => {
			expect(only(fitReport(withSlots(eatxBoard)), 'board-form-factor-case').severity).toBe(
				'conflict'
			);
			const bigCase = slot('case', 'case', 'Halden', 'Tower XL', {
				...caseAtx.part.specs,
				boardFormFactors: ['E-ATX', 'ATX']
			});
			expect(
				only(fitReport(withSlots(eatxBoard, bigCase)), 'board-form-factor-case').severity
			).toBe('ok');
		});

		it('a smaller standard board in a case that lists only ATX is a caution (fits by size: 244 × 244 within 305 × 244 mm)', () => {
			const atxOnly = slot('case', 'case', 'Halden', 'Plain ATX', {
				...caseAtx.part.specs,
				boardFormFactors: ['ATX']
			});
			const micro = slot('motherboard', 'board', 'Quellbrook', 'B6M', {
				...boardAm5Atx.part.specs,
				formFactor: 'microATX'
			});
			const f = only(fitReport(withSlots(atxOnly, micro)), 'board-form-factor-case');
			expect(f.severity).toBe('caution');
			expect(f.message).toContain('microATX (244 × 244 mm)');
		});

		it('an air cooler taller than the case clearance is a conflict with both heights', () => {
			const tall = slot('cooler', 'cooler', 'Ostery', 'Tower 170', {
				type: 'air',
				heightMm: 170,
				sockets: ['AM5'],
				ratedHeatW: 250
			});
			const f = only(fitReport(withSlots(tall)), 'cooler-height-case');
			expect(f.severity).toBe('conflict');
			expect(f.message).toBe(
				'Ostery Tower 170 is too tall for Halden Atrium: cooler is 170 mm, case fits 165 mm (5 mm over).'
			);
		});

		it('a radiator larger than the case takes, or a case without a mount, is a conflict; a liquid cooler skips the height rule', () => {
			const loop420 = slot('cooler', 'cooler', 'Ostery', 'Loop 420', {
				type: 'liquid',
				radiatorMm: 420,
				sockets: ['AM5'],
				ratedHeatW: 350
			});
			const findings = fitReport(withSlots(loop420));
			expect(byRule(findings, 'cooler-height-case')).toEqual([]);
			expect(only(findings, 'radiator-case')).toMatchObject({
				severity: 'conflict',
				message: 'Ostery Loop 420 has a 420 mm radiator; Halden Atrium takes up to 360 mm.'
			});
			const noMount = slot('case', 'case', 'Halden', 'Box', {
				...caseAtx.part.specs,
				radiatorMm: 0
			});
			expect(only(fitReport(withSlots(loop420, noMount)), 'radiator-case').message).toContain(
				'has no radiator mount'
			);
		});

		it('PSU form factor: ATX in an SFX-only case is a conflict; SFX in an ATX bay is a caution (bracket)', () => {
			const sfxCase = slot('case', 'case', 'Halden', 'Cube', {
				...caseAtx.part.specs,
				psuFormFactors: ['SFX', 'SFX-L']
			});
			expect(only(fitReport(withSlots(sfxCase)), 'psu-form-factor-case').severity).toBe('conflict');
			const sfx = slot('psu', 'psu', 'Ostery', 'Small 850', {
				...psu850.part.specs,
				formFactor: 'SFX'
			});
			const f = only(fitReport(withSlots(sfx)), 'psu-form-factor-case');
			expect(f.severity).toBe('caution');
			expect(f.message).toContain('adapter bracket');
		});
	});

	describe('power', () => {
		// Load of the good build is 500 W (see power.spec.ts); the PSU sizing cases are in
		// 'issue 13: the PSU line takes its severity and its recommendation from one rule'.
		it('a PSU of 650 W is a caution: 500 W is above two thirds of it (433 W) (common practice, no published source)', () => {
			const psu650 = slot('psu', 'psu', 'Ostery', 'Current 650', {
				...psu850.part.specs,
				ratedW: 650
			});
			const caution = only(fitReport(withSlots(psu650)), 'psu-rating');
			expect(caution.severity).toBe('caution');
			// D: 650 × 2 / 3 = 433.3 → 433 W; 500 × 3 / 2 = 750 W, itself a common size.
			expect(caution.message).toBe(
				'Ostery Current 650 is rated 650 W; the estimated load of 500 W is above two thirds of it (433 W). Recommended: at least 750 W, so the load stays within two thirds of the rating (common practice, no published source).'
			);
		});

		it('checks the card power connectors against the PSU leads (via the power budget rules)', () => {
			const h12Card = slot('gpu', 'gpu', 'Ferrant', 'Kestrel 5', {
				chip: 'K85',
				vramGb: 16,
				lengthMm: 300,
				slotWidth: 3,
				boardPowerW: 300,
				powerConnectors: { pin6: 0, pin8: 0, h12v2x6: 1 },
				pcieGen: 5
			});
			const noH12 = slot('psu', 'psu', 'Ostery', 'Classic 850', {
				...psu850.part.specs,
				connectors: { pin6: 0, pin8: 4, h12v2x6: 0, eps8: 2 }
			});
			const f = only(fitReport(withSlots(h12Card, noH12)), 'gpu-power-connectors');
			expect(f.severity).toBe('caution');
			expect(f.slots).toEqual(['gpu', 'psu']);
			expect(f.message).toContain('Ferrant Kestrel 5');
			expect(f.message).toContain('Ostery Classic 850');
		});

		it('a cooler rated below the CPU sustained power is a caution that says ratings are not comparable (docs/sources.md 15, common practice, no published source)', () => {
			const small = slot('cooler', 'cooler', 'Ostery', 'Low 47', {
				type: 'air',
				heightMm: 47,
				sockets: ['AM5'],
				ratedHeatW: 95
			});
			const f = only(fitReport(withSlots(small)), 'cooler-heat');
			expect(f.severity).toBe('caution');
			// 142 W = AMD PPT for 105 W TDP (docs/sources.md 8a, V2)
			expect(f.message).toContain(
				'Ostery Low 47 is rated for 95 W, below the 142 W Tarnwick Vela 65X sustains'
			);
			expect(f.message).toContain('no common test method');
		});
	});

	describe('storage', () => {
		const drive = (
			key: string,
			model: string,
			formFactor: 'm2-2280' | 'm2-2242' | 'm2-2230',
			pcieGen: 3 | 4 | 5,
			quantity = 1
		) =>
			slot(
				'storage',
				key,
				'Brightmoor',
				model,
				{ interface: 'nvme', formFactor, pcieGen, capacityGb: 1000, readMbs: 5000, writeMbs: 4000 },
				quantity
			);

		it('gives the fast slot to the fast drive: 5.0 and 4.0 drives on a board with one slot of each are both ok', () => {
			const findings = fitReport(
				withSlots(drive('storage', 'N4', 'm2-2280', 4), drive('fast', 'N5', 'm2-2280', 5))
			);
			expect(byRule(findings, 'm2-slot').map((f) => [f.slots[0], f.severity])).toEqual([
				['fast', 'ok'],
				['storage', 'ok']
			]);
			expect(
				only(
					findings.filter((f) => f.slots[0] === 'fast'),
					'm2-slot'
				).message
			).toContain('M.2 slot 1');
		});

		it('more M.2 drives than slots is a conflict naming the counts', () => {
			const findings = fitReport(withSlots(drive('storage', 'N4', 'm2-2280', 4, 3)));
			const f = only(findings, 'm2-count');
			expect(f.severity).toBe('conflict');
			expect(f.message).toBe(
				'3 M.2 drives (Brightmoor N4), but Quellbrook B6 ATX has 2 M.2 slots.'
			);
		});

		it('a drive longer than every slot takes is a conflict; a 2242 drive fits (docs/sources.md 7: 2280 = 80 mm)', () => {
			const shortSlots = slot('motherboard', 'board', 'Quellbrook', 'B6 Tiny', {
				...boardAm5Atx.part.specs,
				m2Slots: [{ pcieGen: 4, maxLengthMm: 42 }]
			});
			const f = only(fitReport(withSlots(shortSlots)), 'm2-length');
			expect(f.severity).toBe('conflict');
			expect(f.message).toBe(
				'Brightmoor N4 2 TB is 80 mm long (M.2 2280); the M.2 slots of Quellbrook B6 Tiny take up to 42 mm.'
			);
			expect(
				only(
					fitReport(withSlots(shortSlots, drive('storage', 'N4 Short', 'm2-2242', 4))),
					'm2-slot'
				).severity
			).toBe('ok');
		});

		it('SATA drives count against SATA ports', () => {
			const ssd = slot(
				'storage',
				'ssd',
				'Brightmoor',
				'S2 2 TB',
				{ interface: 'sata', formFactor: '2.5in', capacityGb: 2000, readMbs: 550, writeMbs: 520 },
				5
			);
			const f = only(fitReport(withSlots(ssd)), 'sata-ports');
			expect(f.severity).toBe('conflict');
			expect(f.message).toContain('5 SATA drives, but Quellbrook B6 ATX has 4 SATA ports');
		});
	});

	describe('missing slots', () => {
		it('a CPU without a bundled cooler and no cooler slot is a conflict; with a bundled cooler, ok', () => {
			const findings = fitReport(without('cooler'));
			expect(only(findings, 'cpu-cooler')).toEqual({
				rule: 'cpu-cooler',
				severity: 'conflict',
				slots: ['cpu'],
				message: 'Tarnwick Vela 65X comes without a cooler and the build has no CPU cooler.'
			});
			const boxed = slot('cpu', 'cpu', 'Tarnwick', 'Vela 65', {
				...cpuAm5.part.specs,
				tdpW: 65,
				bundledCooler: true
			});
			expect(
				only(fitReport(without('cooler').map((s) => (s.key === 'cpu' ? boxed : s))), 'cpu-cooler')
					.severity
			).toBe('ok');
		});

		it('a CPU without integrated graphics and no graphics card is a conflict; with integrated graphics, ok', () => {
			const noIgpu = slot('cpu', 'cpu', 'Tarnwick', 'Vela 65F', {
				...cpuAm5.part.specs,
				integratedGraphics: false
			});
			const build = without('gpu').map((s) => (s.key === 'cpu' ? noIgpu : s));
			expect(only(fitReport(build), 'cpu-graphics')).toMatchObject({
				severity: 'conflict',
				slots: ['cpu']
			});
			expect(only(fitReport(without('gpu')), 'cpu-graphics').severity).toBe('ok');
		});

		it('skips rules whose slots are missing, quietly', () => {
			const findings = fitReport([cpuAm5, boardAm5Atx]);
			expect(findings.map((f) => f.rule)).toEqual([
				'cpu-socket-board',
				'cpu-cooler',
				'cpu-graphics'
			]);
			// Without board, CPU, case or PSU only the card's own power check can run.
			expect(fitReport([gpu2x8, nvmeGen4, cooler150, ddr5Kit]).map((f) => f.rule)).toEqual([
				'gpu-board-power'
			]);
		});
	});

	it('summarize counts findings per severity and names the worst', () => {
		const findings = fitReport(
			withSlots(
				slot('cooler', 'cooler', 'Ostery', 'Low 47', {
					type: 'air',
					heightMm: 47,
					sockets: ['AM4'],
					ratedHeatW: 95
				})
			)
		);
		expect(summarize(findings)).toEqual({ ok: 14, caution: 1, conflict: 1, worst: 'conflict' });
	});
});

describe('issue 13: graphics-card leads are one budget for every card', () => {
	// Two cards, each 2 × 8-pin, on a PSU with three 8-pin leads: 2 + 2 = 4 inlets, 3 leads,
	// so one inlet has no lead (D). A lead feeds one inlet (docs/sources.md 2b, V: one 8-pin
	// connector per 8-pin inlet).
	const cardB = slot('gpu', 'gpu2', 'Ferrant', 'Kestrel 12G', {
		chip: 'K60',
		vramGb: 12,
		lengthMm: 280,
		slotWidth: 2,
		boardPowerW: 220,
		powerConnectors: { pin6: 0, pin8: 2, h12v2x6: 0 },
		pcieGen: 4
	});
	const threeLeads = slot('psu', 'psu', 'Ostery', 'Current 1000', {
		...psu850.part.specs,
		ratedW: 1000,
		connectors: { pin6: 0, pin8: 3, h12v2x6: 0, eps8: 2 }
	});

	it('two cards in separate slots share the leads: 4 × 8-pin needed, 3 there → one conflict', () => {
		const findings = byRule(fitReport(withSlots(threeLeads, cardB)), 'gpu-power-connectors');
		expect(findings.map((f) => f.severity)).toEqual(['conflict']);
		expect(findings[0]!.slots).toEqual(['gpu', 'gpu2', 'psu']);
		expect(findings[0]!.message).toBe(
			'Ferrant Kestrel 16G and Ferrant Kestrel 12G need 4 × 8-pin PCIe power in all; Ostery Current 1000 has 3 8-pin leads.'
		);
	});

	it('the power budget checks the leads against every card, not only the first', () => {
		expect(powerBudget(withSlots(threeLeads, cardB)).gpuLeads).toBe('conflict');
	});

	it('one card slot with quantity 2 counts the same way', () => {
		const findings = byRule(
			fitReport(withSlots(threeLeads, { ...gpu2x8, quantity: 2 })),
			'gpu-power-connectors'
		);
		expect(findings.map((f) => f.severity)).toEqual(['conflict']);
		expect(findings[0]!.message).toContain('2 × Ferrant Kestrel 16G needs 4 × 8-pin');
	});

	it('with four 8-pin leads both cards are fed', () => {
		const four = slot('psu', 'psu', 'Ostery', 'Current 1000', {
			...threeLeads.part.specs,
			connectors: { pin6: 0, pin8: 4, h12v2x6: 0, eps8: 2 }
		});
		const findings = byRule(fitReport(withSlots(four, cardB)), 'gpu-power-connectors');
		expect(findings.map((f) => f.severity)).toEqual(['ok']);
	});
});

describe('issue 13: board power above what the slot and connectors may deliver', () => {
	// PCIe CEM: slot 75 W (docs/sources.md 2a, V2); 8-pin 150 W (2b, V).
	// A 2 × 8-pin card may draw 75 + 2 × 150 = 375 W (D).
	const hungry = slot('gpu', 'gpu', 'Ferrant', 'Kestrel OC', {
		...gpu2x8.part.specs,
		boardPowerW: 400
	});

	it('a 2 × 8-pin card stating 400 W is a conflict: 400 W > 375 W deliverable', () => {
		const f = only(fitReport(withSlots(hungry)), 'gpu-board-power');
		expect(f).toEqual({
			rule: 'gpu-board-power',
			severity: 'conflict',
			slots: ['gpu'],
			message:
				'Ferrant Kestrel OC states 400 W board power, more than its slot and power inlets may deliver by the PCIe CEM limits: 375 W (slot 75 W + 2 × 8-pin at 150 W). Check the figure with the card maker: drawing 25 W more would run the leads beyond their rating.'
		});
	});

	it('the same card at 375 W (exactly what may be delivered) is ok', () => {
		const exact = slot('gpu', 'gpu', 'Ferrant', 'Kestrel 375', {
			...gpu2x8.part.specs,
			boardPowerW: 375
		});
		const f = only(fitReport(withSlots(exact)), 'gpu-board-power');
		expect(f.severity).toBe('ok');
		expect(f.message).toBe(
			'Ferrant Kestrel 375 states 375 W board power; its slot and power inlets may deliver 375 W by the PCIe CEM limits (slot 75 W + 2 × 8-pin at 150 W).'
		);
	});

	it('every card gets its own line, and the power budget lists every card', () => {
		const second = slot('gpu', 'gpu2', 'Ferrant', 'Kestrel OC', {
			...gpu2x8.part.specs,
			boardPowerW: 400
		});
		const findings = byRule(fitReport(withSlots(second)), 'gpu-board-power');
		expect(findings.map((f) => [f.slots[0], f.severity])).toEqual([
			['gpu', 'ok'],
			['gpu2', 'conflict']
		]);
		const budget = powerBudget(withSlots(second));
		// 263 W within 375 W; 400 W above 375 W (D, from 2a and 2b).
		expect(budget.gpus.map((g) => [g.key, g.boardPowerW, g.deliverableW, g.severity])).toEqual([
			['gpu', 263, 375, 'ok'],
			['gpu2', 400, 375, 'conflict']
		]);
	});
});

describe('issue 13: M.2 drives', () => {
	const nvme = (
		key: string,
		model: string,
		formFactor: 'm2-2280' | 'm2-2242' | 'm2-2230',
		pcieGen?: 3 | 4 | 5
	) =>
		slot('storage', key, 'Brightmoor', model, {
			interface: 'nvme',
			formFactor,
			...(pcieGen ? { pcieGen } : {}),
			capacityGb: 1000,
			readMbs: 5000,
			writeMbs: 4000
		});

	it('an NVMe drive without a stated PCIe generation is "unknown generation", never an M.2 SATA drive', () => {
		const f = only(fitReport(withSlots(nvme('storage', 'N? 1 TB', 'm2-2280'))), 'm2-slot');
		expect(f.severity).toBe('caution');
		expect(f.message).not.toMatch(/SATA/);
		expect(f.message).toBe(
			'Brightmoor N? 1 TB is an NVMe drive of unstated PCIe generation in M.2 slot 1 of Quellbrook B6 ATX (PCIe 5.0, up to 80 mm): NVMe drives work in any PCIe M.2 slot, but whether this slot runs it at full speed cannot be checked. Look up the drive’s PCIe generation.'
		);
	});

	it('places drives so that every drive fits when some assignment fits (5.0 2242 and 4.0 2280 on a 5.0 80 mm + 4.0 42 mm board)', () => {
		// Taking the fast slot for the fast drive leaves the 2280 drive only the 42 mm slot.
		// The only placement that fits both: the 2280 drive in slot 1 (80 mm), the 2242 drive
		// in slot 2 (42 mm), where the PCIe 5.0 drive runs at 4.0 speed: one caution, no
		// conflict (docs/sources.md 7: 2280 = 80 mm, 2242 = 42 mm).
		const board = slot('motherboard', 'board', 'Quellbrook', 'B6 Mixed', {
			...boardAm5Atx.part.specs,
			m2Slots: [
				{ pcieGen: 5, maxLengthMm: 80 },
				{ pcieGen: 4, maxLengthMm: 42 }
			]
		});
		const findings = fitReport(
			withSlots(
				board,
				nvme('storage', 'N4 2280', 'm2-2280', 4),
				nvme('short', 'N5 2242', 'm2-2242', 5)
			)
		);
		expect(byRule(findings, 'm2-length')).toEqual([]);
		expect(byRule(findings, 'm2-slot').map((f) => [f.slots[0], f.severity])).toEqual([
			['short', 'caution'],
			['storage', 'ok']
		]);
	});

	it('a 2280 drive on a board whose only slot takes 2242 is a conflict (80 mm > 42 mm, docs/sources.md 7)', () => {
		const board = slot('motherboard', 'board', 'Quellbrook', 'B6 Tiny', {
			...boardAm5Atx.part.specs,
			m2Slots: [{ pcieGen: 4, maxLengthMm: 42 }]
		});
		const f = only(fitReport(withSlots(board)), 'm2-length');
		expect(f.severity).toBe('conflict');
		expect(f.message).toBe(
			'Brightmoor N4 2 TB is 80 mm long (M.2 2280); the M.2 slots of Quellbrook B6 Tiny take up to 42 mm.'
		);
	});

	it('two 2280 drives for one 80 mm slot and one 42 mm slot: the second is a conflict naming the taken slot', () => {
		// 2 drives ≤ 2 slots, so not a count problem; only slot 1 takes 80 mm (docs/sources.md 7).
		const board = slot('motherboard', 'board', 'Quellbrook', 'B6 Mixed', {
			...boardAm5Atx.part.specs,
			m2Slots: [
				{ pcieGen: 5, maxLengthMm: 80 },
				{ pcieGen: 4, maxLengthMm: 42 }
			]
		});
		const findings = fitReport(
			withSlots(board, { ...nvme('storage', 'N4 2280', 'm2-2280', 4), quantity: 2 })
		);
		expect(byRule(findings, 'm2-count')).toEqual([]);
		expect(only(findings, 'm2-length').message).toBe(
			'Brightmoor N4 2280 is 80 mm long (M.2 2280); the M.2 slot of Quellbrook B6 Mixed long enough for it (slot 1) is taken by the other M.2 drives.'
		);
	});
});

describe('issue 13: drive bays and fan mounts (common practice, no published source)', () => {
	// caseAtx: 2 × 2.5-inch bays, 2 × 3.5-inch bays, 9 fan mounts, 3 included fans.
	const hdd = (quantity: number) =>
		slot(
			'storage',
			'hdd',
			'Brightmoor',
			'Vault 8 TB',
			{ interface: 'sata', formFactor: '3.5in', capacityGb: 8000, readMbs: 250, writeMbs: 250 },
			quantity
		);
	const ssd = (quantity: number) =>
		slot(
			'storage',
			'ssd',
			'Brightmoor',
			'S2 1 TB',
			{ interface: 'sata', formFactor: '2.5in', capacityGb: 1000, readMbs: 550, writeMbs: 500 },
			quantity
		);
	const fans = (count: number, quantity: number) =>
		slot(
			'fan',
			'fans',
			'Ostery',
			`Draft 120 (${count}-pack)`,
			{ sizeMm: 120, count, maxRpm: 1500 },
			quantity
		);
	const sixMounts = slot('case', 'case', 'Halden', 'Compact', {
		...caseAtx.part.specs,
		fanMounts: 6,
		includedFans: 2
	});

	it('three 3.5-inch drives in a case with two 3.5-inch bays: conflict (3 > 2)', () => {
		const f = only(fitReport(withSlots(hdd(3))), 'drive-bays');
		expect(f.severity).toBe('conflict');
		expect(f.slots).toEqual(['hdd', 'case']);
		expect(f.message).toBe(
			'3 × Brightmoor Vault 8 TB: 3 3.5-inch drives, but Halden Atrium has 2 3.5-inch bays.'
		);
	});

	it('two 3.5-inch drives for two bays: ok (2 = 2)', () => {
		expect(only(fitReport(withSlots(hdd(2))), 'drive-bays').severity).toBe('ok');
	});

	it('2.5-inch drives use 2.5-inch bays, then free 3.5-inch bays (caution), then none (conflict)', () => {
		// 2 ≤ 2 → ok; 4 = 2 + 2 free 3.5-inch bays → caution; 5 > 2 + 2 → conflict.
		expect(only(fitReport(withSlots(ssd(2))), 'drive-bays').severity).toBe('ok');
		const four = only(fitReport(withSlots(ssd(4))), 'drive-bays');
		expect(four.severity).toBe('caution');
		expect(four.message).toBe(
			'4 × Brightmoor S2 1 TB: 4 2.5-inch drives for the 2 2.5-inch bays of Halden Atrium; 2 go in free 3.5-inch bays, which often take a 2.5-inch drive on the same tray or with an adapter bracket: check the case manual.'
		);
		expect(only(fitReport(withSlots(ssd(5))), 'drive-bays').severity).toBe('conflict');
	});

	it('eight fans for six mounts: 2 included + 2 × 3-pack = 8 > 6, but the 6 added fit once the included ones come out → caution', () => {
		const f = only(fitReport(withSlots(sixMounts, fans(3, 2))), 'fan-mounts');
		expect(f.severity).toBe('caution');
		expect(f.message).toBe(
			'2 included fans and 6 added fans (2 × Ostery Draft 120 (3-pack)) need 8 fan mounts; Halden Compact has 6. Without the included fans the rest need 6, so 2 of the included fans must come out or move.'
		);
	});

	it('eight added fans for six mounts: conflict even without the included fans (8 > 6)', () => {
		const f = only(fitReport(withSlots(sixMounts, fans(4, 2))), 'fan-mounts');
		expect(f.severity).toBe('conflict');
	});

	it('a 360 mm radiator takes three 120 mm fan mounts: 2 included + 3 = 5 ≤ 6 → ok; with a 3-pack, 8 > 6 → caution', () => {
		const loop = slot('cooler', 'cooler', 'Ostery', 'Loop 360', {
			type: 'liquid',
			radiatorMm: 360,
			sockets: ['AM5'],
			ratedHeatW: 300
		});
		expect(only(fitReport(withSlots(sixMounts, loop)), 'fan-mounts').severity).toBe('ok');
		expect(only(fitReport(withSlots(sixMounts, loop, fans(3, 1))), 'fan-mounts').severity).toBe(
			'caution'
		);
	});
});

describe('issue 13: the PSU line takes its severity and its recommendation from one rule', () => {
	// One threshold (docs/sources.md "PSU sizing threshold"; common practice, no published
	// source): the estimated load at most two thirds of the rating. The good build's load is
	// 500 W (power.spec.ts), so the smallest rating that keeps it is 500 × 3 / 2 = 750 W (D).
	const rated = (w: number) =>
		slot('psu', 'psu', 'Ostery', `Current ${w}`, { ...psu850.part.specs, ratedW: w });

	it('750 W: 500 W is exactly two thirds (500 × 3 = 1500 = 750 × 2) → ok, and nothing larger is recommended', () => {
		const build = withSlots(rated(750));
		const f = only(fitReport(build), 'psu-rating');
		expect(f).toMatchObject({ severity: 'ok', slots: ['psu'] });
		expect(f.message).toBe(
			'Ostery Current 750 is rated 750 W; the estimated load of 500 W is within two thirds of it (500 W). Common practice, no published source.'
		);
		expect(powerBudget(build)).toMatchObject({
			loadW: 500,
			minimumW: 750,
			recommendedW: 750,
			psuSeverity: 'ok'
		});
	});

	it('740 W: 500 W is above two thirds (740 × 2 / 3 = 493.3 → 493 W) → caution recommending at least 750 W', () => {
		const build = withSlots(rated(740));
		const f = only(fitReport(build), 'psu-rating');
		expect(f.severity).toBe('caution');
		expect(f.message).toBe(
			'Ostery Current 740 is rated 740 W; the estimated load of 500 W is above two thirds of it (493 W). Recommended: at least 750 W, so the load stays within two thirds of the rating (common practice, no published source).'
		);
		expect(powerBudget(build).psuSeverity).toBe('caution');
	});

	it('700 W: caution; the minimum 750 W is itself a common size, so no second figure', () => {
		expect(only(fitReport(withSlots(rated(700))), 'psu-rating').severity).toBe('caution');
	});

	it('450 W: below the 500 W load → conflict', () => {
		const build = withSlots(rated(450));
		const f = only(fitReport(build), 'psu-rating');
		expect(f.severity).toBe('conflict');
		expect(f.message).toBe(
			'Ostery Current 450 is rated 450 W, below the estimated load of 500 W. Recommended: at least 750 W.'
		);
		expect(powerBudget(build).psuSeverity).toBe('conflict');
	});
});

describe('issue 13: the same kind of gap in other rules', () => {
	it('CPU power leads: one 8-pin EPS12V lead carries 288–384 W (docs/sources.md 3d: 4 pins × 12 V × 6–8 A, V + D)', () => {
		// The good build: 142 W (AM5 105 W TDP × 1.35, 8a) on 2 leads: 142 ≤ 2 × 288 = 576 → ok.
		expect(only(fitReport(goodBuild()), 'cpu-power-leads')).toEqual({
			rule: 'cpu-power-leads',
			severity: 'ok',
			slots: ['cpu', 'psu'],
			message:
				'Ostery Current 850 has 2 8-pin EPS12V CPU leads (288–384 W each by their pin ratings); Tarnwick Vela 65X sustains about 142 W.'
		});
		// A CPU stating 320 W sustained on one lead: 320 > 288 → caution.
		const hot = slot('cpu', 'cpu', 'Tarnwick', 'Vela 99X', {
			...cpuAm5.part.specs,
			packagePowerW: 320
		});
		const oneLead = slot('psu', 'psu', 'Ostery', 'Current 850 S', {
			...psu850.part.specs,
			connectors: { ...psu850.part.specs.connectors, eps8: 1 }
		});
		const f = only(fitReport(withSlots(hot, oneLead)), 'cpu-power-leads');
		expect(f.severity).toBe('caution');
		expect(f.message).toBe(
			'Tarnwick Vela 99X sustains about 320 W; Ostery Current 850 S has 1 8-pin EPS12V CPU lead, which carries 288–384 W by its pin ratings (4 × 12 V × 6–8 A). Connect every CPU power inlet the board has, and check the board manual.'
		);
		// No EPS lead listed at all → caution (common practice, no published source).
		const none = slot('psu', 'psu', 'Ostery', 'Current 850 N', {
			...psu850.part.specs,
			connectors: { ...psu850.part.specs.connectors, eps8: 0 }
		});
		expect(only(fitReport(withSlots(none)), 'cpu-power-leads').severity).toBe('caution');
	});

	it('two graphics cards: a Mini-ITX board has one expansion slot (conflict); on ATX the slot layout is not recorded (caution)', () => {
		const itx = slot('motherboard', 'board', 'Quellbrook', 'B6I', {
			...boardAm5Atx.part.specs,
			formFactor: 'Mini-ITX',
			memorySlots: 2
		});
		const itxCase = slot('case', 'case', 'Halden', 'Atrium', {
			...caseAtx.part.specs,
			boardFormFactors: ['Mini-ITX']
		});
		const two = { ...gpu2x8, quantity: 2 };
		expect(only(fitReport(withSlots(itx, itxCase, two)), 'gpu-slots-board')).toMatchObject({
			severity: 'conflict',
			message:
				'Quellbrook B6I is Mini-ITX, which has one expansion slot; the build has 2 graphics cards (2 × Ferrant Kestrel 16G).'
		});
		// ATX: 7 slot positions (docs/sources.md 1e, M); 2 cards × ⌈2.5⌉ = 6 ≤ 7 → caution.
		const atx = only(fitReport(withSlots(two)), 'gpu-slots-board');
		expect(atx.severity).toBe('caution');
		expect(atx.message).toBe(
			'2 graphics cards (2 × Ferrant Kestrel 16G) take 6 expansion slot positions (3 each for 2.5-slot cards); an ATX board has up to 7. The catalog does not record how many x16 slots Quellbrook B6 ATX has or how far apart they are: check the board manual.'
		);
		// Three such cards: 3 × 3 = 9 > 7 → conflict.
		expect(only(fitReport(withSlots({ ...gpu2x8, quantity: 3 })), 'gpu-slots-board').severity).toBe(
			'conflict'
		);
		// One card: no finding.
		expect(byRule(fitReport(goodBuild()), 'gpu-slots-board')).toEqual([]);
	});

	it('more than one CPU, board, case or PSU: a caution that the checks use the first only', () => {
		const f = only(fitReport(withSlots({ ...psu850, quantity: 2 })), 'part-count');
		expect(f).toEqual({
			rule: 'part-count',
			severity: 'caution',
			slots: ['psu'],
			message:
				'The build lists 2 power supplies (2 × Ostery Current 850); the fit report and the power budget check the first one only.'
		});
	});

	it('a 2.5-inch NVMe drive connects to neither an M.2 slot nor a SATA port: caution', () => {
		const u2 = slot('storage', 'u2', 'Brightmoor', 'U2 4 TB', {
			interface: 'nvme',
			formFactor: '2.5in',
			pcieGen: 4,
			capacityGb: 4000,
			readMbs: 6000,
			writeMbs: 4000
		});
		const findings = fitReport(withSlots(u2));
		expect(only(findings, 'drive-interface')).toEqual({
			rule: 'drive-interface',
			severity: 'caution',
			slots: ['u2', 'board'],
			message:
				'Brightmoor U2 4 TB is a 2.5-inch NVMe drive (U.2 or similar): it plugs into neither an M.2 slot nor a SATA port of Quellbrook B6 ATX, so it needs a U.2 port or an adapter card. Check the board manual.'
		});
		expect(byRule(findings, 'sata-ports')).toEqual([]);
	});
});
