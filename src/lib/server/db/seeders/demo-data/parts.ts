import type { PartCategory } from '../../../../domain/types';
import type { SpecsByCategory } from '../../../../schemas/part-specs';
import type { DemoPart } from './types';

/*
 * Invented brands and models on real standards (sockets, DDR generations, board and
 * PSU form factors, PCIe generations, 80 PLUS levels, 12V-2x6). The mix is chosen so
 * fit checks have something to say: long cards next to a case with short clearance,
 * SFX units, a low-profile cooler beside a tall tower, DDR4 and DDR5 boards.
 *
 * CPUs on AM4/AM5 omit packagePowerW on purpose: the power budget derives it from
 * tdpW (round(tdp × 1.35)). LGA parts state it, because that platform has no such rule.
 */

function part<C extends PartCategory>(
	category: C,
	slug: string,
	brand: string,
	model: string,
	specs: SpecsByCategory[C]
): DemoPart {
	return { slug, category, brand, model, specs: specs as Record<string, unknown> };
}

const ALL_SOCKETS: SpecsByCategory['cooler']['sockets'] = ['AM4', 'AM5', 'LGA1700', 'LGA1851'];

const cpus: DemoPart[] = [
	part('cpu', 'halvard-strata-406', 'Halvard', 'Strata 406', {
		socket: 'AM4',
		cores: 6,
		threads: 12,
		baseClockGhz: 3.5,
		boostClockGhz: 4.4,
		tdpW: 65,
		memoryTypes: ['DDR4'],
		integratedGraphics: false,
		bundledCooler: true
	}),
	part('cpu', 'halvard-strata-406g', 'Halvard', 'Strata 406G', {
		socket: 'AM4',
		cores: 6,
		threads: 12,
		baseClockGhz: 3.9,
		boostClockGhz: 4.4,
		tdpW: 65,
		memoryTypes: ['DDR4'],
		integratedGraphics: true,
		bundledCooler: true
	}),
	part('cpu', 'halvard-strata-408', 'Halvard', 'Strata 408', {
		socket: 'AM4',
		cores: 8,
		threads: 16,
		baseClockGhz: 3.4,
		boostClockGhz: 4.6,
		tdpW: 65,
		memoryTypes: ['DDR4'],
		integratedGraphics: false,
		bundledCooler: true
	}),
	part('cpu', 'halvard-strata-606', 'Halvard', 'Strata 606', {
		socket: 'AM5',
		cores: 6,
		threads: 12,
		baseClockGhz: 3.8,
		boostClockGhz: 5.1,
		tdpW: 65,
		memoryTypes: ['DDR5'],
		integratedGraphics: true,
		bundledCooler: true
	}),
	part('cpu', 'halvard-strata-606x', 'Halvard', 'Strata 606X', {
		socket: 'AM5',
		cores: 6,
		threads: 12,
		baseClockGhz: 4.7,
		boostClockGhz: 5.3,
		tdpW: 105,
		memoryTypes: ['DDR5'],
		integratedGraphics: true,
		bundledCooler: false
	}),
	part('cpu', 'halvard-strata-708x', 'Halvard', 'Strata 708X', {
		socket: 'AM5',
		cores: 8,
		threads: 16,
		baseClockGhz: 4.5,
		boostClockGhz: 5.4,
		tdpW: 120,
		memoryTypes: ['DDR5'],
		integratedGraphics: true,
		bundledCooler: false
	}),
	part('cpu', 'halvard-strata-916x', 'Halvard', 'Strata 916X', {
		socket: 'AM5',
		cores: 16,
		threads: 32,
		baseClockGhz: 4.3,
		boostClockGhz: 5.7,
		tdpW: 170,
		memoryTypes: ['DDR5'],
		integratedGraphics: true,
		bundledCooler: false
	}),
	part('cpu', 'orrin-labs-meridian-510f', 'Orrin Labs', 'Meridian 510F', {
		socket: 'LGA1700',
		cores: 10,
		threads: 16,
		baseClockGhz: 2.5,
		boostClockGhz: 4.6,
		tdpW: 65,
		packagePowerW: 148,
		memoryTypes: ['DDR4', 'DDR5'],
		integratedGraphics: false,
		bundledCooler: true
	}),
	part('cpu', 'orrin-labs-meridian-780k', 'Orrin Labs', 'Meridian 780K', {
		socket: 'LGA1700',
		cores: 16,
		threads: 24,
		baseClockGhz: 3.4,
		boostClockGhz: 5.4,
		tdpW: 125,
		packagePowerW: 253,
		memoryTypes: ['DDR4', 'DDR5'],
		integratedGraphics: true,
		bundledCooler: false
	}),
	part('cpu', 'orrin-labs-meridian-745k', 'Orrin Labs', 'Meridian 745K', {
		socket: 'LGA1851',
		cores: 14,
		threads: 14,
		baseClockGhz: 4.2,
		boostClockGhz: 5.2,
		tdpW: 125,
		packagePowerW: 159,
		memoryTypes: ['DDR5'],
		integratedGraphics: true,
		bundledCooler: false
	}),
	// No bundled cooler and no integrated graphics: needs both a cooler and a card.
	part('cpu', 'orrin-labs-meridian-765kf', 'Orrin Labs', 'Meridian 765KF', {
		socket: 'LGA1851',
		cores: 20,
		threads: 20,
		baseClockGhz: 3.9,
		boostClockGhz: 5.5,
		tdpW: 125,
		packagePowerW: 250,
		memoryTypes: ['DDR5'],
		integratedGraphics: false,
		bundledCooler: false
	}),
	part('cpu', 'orrin-labs-meridian-785k', 'Orrin Labs', 'Meridian 785K', {
		socket: 'LGA1851',
		cores: 24,
		threads: 24,
		baseClockGhz: 3.7,
		boostClockGhz: 5.7,
		tdpW: 125,
		packagePowerW: 250,
		memoryTypes: ['DDR5'],
		integratedGraphics: true,
		bundledCooler: false
	})
];

const coolers: DemoPart[] = [
	part('cooler', 'tessel-frostline-120', 'Tessel', 'Frostline 120', {
		type: 'air',
		heightMm: 155,
		sockets: ALL_SOCKETS,
		ratedHeatW: 220
	}),
	part('cooler', 'tessel-frostline-dual-140', 'Tessel', 'Frostline Dual 140', {
		type: 'air',
		heightMm: 165,
		sockets: ALL_SOCKETS,
		ratedHeatW: 260
	}),
	part('cooler', 'tessel-lowrise-47', 'Tessel', 'Lowrise 47', {
		type: 'air',
		heightMm: 47,
		sockets: ALL_SOCKETS,
		ratedHeatW: 95
	}),
	part('cooler', 'kelda-flatline-58', 'Kelda', 'Flatline 58', {
		type: 'air',
		heightMm: 58,
		sockets: ALL_SOCKETS,
		ratedHeatW: 110
	}),
	// Mounting kit only for the AM sockets, so it conflicts on an LGA board.
	part('cooler', 'kelda-slimtower-135', 'Kelda', 'Slimtower 135', {
		type: 'air',
		heightMm: 135,
		sockets: ['AM4', 'AM5'],
		ratedHeatW: 180
	}),
	part('cooler', 'brightwater-aqualoop-240', 'Brightwater Thermal', 'Aqualoop 240', {
		type: 'liquid',
		radiatorMm: 240,
		sockets: ALL_SOCKETS,
		ratedHeatW: 280
	}),
	part('cooler', 'brightwater-aqualoop-360', 'Brightwater Thermal', 'Aqualoop 360', {
		type: 'liquid',
		radiatorMm: 360,
		sockets: ALL_SOCKETS,
		ratedHeatW: 330
	})
];

const motherboards: DemoPart[] = [
	part('motherboard', 'arkwell-s550m-daily', 'Arkwell', 'S550M Daily', {
		socket: 'AM4',
		chipset: 'S550',
		formFactor: 'microATX',
		memoryType: 'DDR4',
		memorySlots: 4,
		maxMemoryGb: 128,
		m2Slots: [
			{ pcieGen: 4, maxLengthMm: 80 },
			{ pcieGen: 3, maxLengthMm: 80 }
		],
		sataPorts: 4,
		wifi: false
	}),
	part('motherboard', 'arkwell-s450m-basic', 'Arkwell', 'S450M Basic', {
		socket: 'AM4',
		chipset: 'S450',
		formFactor: 'microATX',
		memoryType: 'DDR4',
		memorySlots: 2,
		maxMemoryGb: 64,
		m2Slots: [{ pcieGen: 3, maxLengthMm: 80 }],
		sataPorts: 4,
		wifi: false
	}),
	part('motherboard', 'vantor-s550-atx-wifi', 'Vantor', 'S550 ATX Wi-Fi', {
		socket: 'AM4',
		chipset: 'S550',
		formFactor: 'ATX',
		memoryType: 'DDR4',
		memorySlots: 4,
		maxMemoryGb: 128,
		m2Slots: [
			{ pcieGen: 4, maxLengthMm: 80 },
			{ pcieGen: 3, maxLengthMm: 80 }
		],
		sataPorts: 6,
		wifi: true
	}),
	part('motherboard', 'vantor-s650m-base', 'Vantor', 'S650M Base', {
		socket: 'AM5',
		chipset: 'S650',
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
	}),
	part('motherboard', 'vantor-s650-atx-wifi', 'Vantor', 'S650 ATX Wi-Fi', {
		socket: 'AM5',
		chipset: 'S650',
		formFactor: 'ATX',
		memoryType: 'DDR5',
		memorySlots: 4,
		maxMemoryGb: 192,
		m2Slots: [
			{ pcieGen: 5, maxLengthMm: 80 },
			{ pcieGen: 4, maxLengthMm: 80 },
			{ pcieGen: 4, maxLengthMm: 80 }
		],
		sataPorts: 4,
		wifi: true
	}),
	part('motherboard', 'vantor-s670e-atx-pro', 'Vantor', 'S670E ATX Pro', {
		socket: 'AM5',
		chipset: 'S670E',
		formFactor: 'ATX',
		memoryType: 'DDR5',
		memorySlots: 4,
		maxMemoryGb: 256,
		m2Slots: [
			{ pcieGen: 5, maxLengthMm: 80 },
			{ pcieGen: 5, maxLengthMm: 80 },
			{ pcieGen: 4, maxLengthMm: 80 },
			{ pcieGen: 4, maxLengthMm: 80 }
		],
		sataPorts: 6,
		wifi: true
	}),
	part('motherboard', 'vantor-s650i-wifi', 'Vantor', 'S650I Wi-Fi', {
		socket: 'AM5',
		chipset: 'S650',
		formFactor: 'Mini-ITX',
		memoryType: 'DDR5',
		memorySlots: 2,
		maxMemoryGb: 96,
		m2Slots: [
			{ pcieGen: 4, maxLengthMm: 80 },
			{ pcieGen: 4, maxLengthMm: 80 }
		],
		sataPorts: 2,
		wifi: true
	}),
	part('motherboard', 'vantor-s670e-itx', 'Vantor', 'S670E ITX', {
		socket: 'AM5',
		chipset: 'S670E',
		formFactor: 'Mini-ITX',
		memoryType: 'DDR5',
		memorySlots: 2,
		maxMemoryGb: 96,
		m2Slots: [
			{ pcieGen: 5, maxLengthMm: 80 },
			{ pcieGen: 4, maxLengthMm: 80 }
		],
		sataPorts: 2,
		wifi: true
	}),
	part('motherboard', 'pellworth-m870-atx', 'Pellworth', 'M870 ATX', {
		socket: 'LGA1851',
		chipset: 'M870',
		formFactor: 'ATX',
		memoryType: 'DDR5',
		memorySlots: 4,
		maxMemoryGb: 192,
		m2Slots: [
			{ pcieGen: 5, maxLengthMm: 80 },
			{ pcieGen: 4, maxLengthMm: 80 },
			{ pcieGen: 4, maxLengthMm: 80 },
			{ pcieGen: 4, maxLengthMm: 80 }
		],
		sataPorts: 4,
		wifi: true
	}),
	part('motherboard', 'pellworth-m860m-plus', 'Pellworth', 'M860M Plus', {
		socket: 'LGA1851',
		chipset: 'M860',
		formFactor: 'microATX',
		memoryType: 'DDR5',
		memorySlots: 4,
		maxMemoryGb: 192,
		m2Slots: [
			{ pcieGen: 4, maxLengthMm: 80 },
			{ pcieGen: 4, maxLengthMm: 80 }
		],
		sataPorts: 4,
		wifi: true
	}),
	part('motherboard', 'arkwell-m760m-d4', 'Arkwell', 'M760M D4', {
		socket: 'LGA1700',
		chipset: 'M760',
		formFactor: 'microATX',
		memoryType: 'DDR4',
		memorySlots: 4,
		maxMemoryGb: 128,
		m2Slots: [
			{ pcieGen: 4, maxLengthMm: 80 },
			{ pcieGen: 4, maxLengthMm: 80 }
		],
		sataPorts: 4,
		wifi: false
	}),
	part('motherboard', 'arkwell-m790-atx', 'Arkwell', 'M790 ATX', {
		socket: 'LGA1700',
		chipset: 'M790',
		formFactor: 'ATX',
		memoryType: 'DDR5',
		memorySlots: 4,
		maxMemoryGb: 192,
		m2Slots: [
			{ pcieGen: 5, maxLengthMm: 80 },
			{ pcieGen: 4, maxLengthMm: 80 },
			{ pcieGen: 4, maxLengthMm: 80 }
		],
		sataPorts: 6,
		wifi: true
	})
];

const memory: DemoPart[] = [
	part('memory', 'aldmere-pulse-ddr4-3200-16gb', 'Aldmere', 'Pulse DDR4-3200 2 × 8 GB', {
		type: 'DDR4',
		modules: 2,
		moduleGb: 8,
		speedMts: 3200,
		casLatency: 16,
		voltage: 1.35
	}),
	part('memory', 'aldmere-pulse-ddr4-3600-32gb', 'Aldmere', 'Pulse DDR4-3600 2 × 16 GB', {
		type: 'DDR4',
		modules: 2,
		moduleGb: 16,
		speedMts: 3600,
		casLatency: 18,
		voltage: 1.35
	}),
	part('memory', 'brisk-ddr4-3200-32gb', 'Brisk Memory', 'Everyday DDR4-3200 2 × 16 GB', {
		type: 'DDR4',
		modules: 2,
		moduleGb: 16,
		speedMts: 3200,
		casLatency: 16,
		voltage: 1.35
	}),
	part('memory', 'aldmere-flux-ddr5-5600-32gb', 'Aldmere', 'Flux DDR5-5600 2 × 16 GB', {
		type: 'DDR5',
		modules: 2,
		moduleGb: 16,
		speedMts: 5600,
		casLatency: 36,
		voltage: 1.25
	}),
	part('memory', 'aldmere-flux-ddr5-6000-32gb', 'Aldmere', 'Flux DDR5-6000 2 × 16 GB', {
		type: 'DDR5',
		modules: 2,
		moduleGb: 16,
		speedMts: 6000,
		casLatency: 30,
		voltage: 1.35
	}),
	part('memory', 'brisk-ddr5-6000-64gb', 'Brisk Memory', 'Studio DDR5-6000 2 × 32 GB', {
		type: 'DDR5',
		modules: 2,
		moduleGb: 32,
		speedMts: 6000,
		casLatency: 30,
		voltage: 1.35
	}),
	// JEDEC timings at stock voltage: no memory profile to enable.
	part('memory', 'brisk-ddr5-4800-32gb', 'Brisk Memory', 'Everyday DDR5-4800 2 × 16 GB', {
		type: 'DDR5',
		modules: 2,
		moduleGb: 16,
		speedMts: 4800,
		casLatency: 40,
		voltage: 1.1
	}),
	part('memory', 'brisk-ddr5-6400-32gb', 'Brisk Memory', 'Studio DDR5-6400 2 × 16 GB', {
		type: 'DDR5',
		modules: 2,
		moduleGb: 16,
		speedMts: 6400,
		casLatency: 32,
		voltage: 1.4
	})
];

const storage: DemoPart[] = [
	part('storage', 'cindral-c3-1tb', 'Cindral', 'C3 1 TB', {
		interface: 'nvme',
		formFactor: 'm2-2280',
		pcieGen: 3,
		capacityGb: 1000,
		readMbs: 3500,
		writeMbs: 3000
	}),
	part('storage', 'cindral-c4-1tb', 'Cindral', 'C4 1 TB', {
		interface: 'nvme',
		formFactor: 'm2-2280',
		pcieGen: 4,
		capacityGb: 1000,
		readMbs: 7000,
		writeMbs: 5800
	}),
	part('storage', 'cindral-c4-2tb', 'Cindral', 'C4 2 TB', {
		interface: 'nvme',
		formFactor: 'm2-2280',
		pcieGen: 4,
		capacityGb: 2000,
		readMbs: 7100,
		writeMbs: 6700
	}),
	part('storage', 'cindral-c5-2tb', 'Cindral', 'C5 2 TB', {
		interface: 'nvme',
		formFactor: 'm2-2280',
		pcieGen: 5,
		capacityGb: 2000,
		readMbs: 14500,
		writeMbs: 12700
	}),
	part('storage', 'verrow-v4-lite-1tb', 'Verrow', 'V4 Lite 1 TB', {
		interface: 'nvme',
		formFactor: 'm2-2280',
		pcieGen: 4,
		capacityGb: 1000,
		readMbs: 5000,
		writeMbs: 4200
	}),
	part('storage', 'verrow-v4-4tb', 'Verrow', 'V4 4 TB', {
		interface: 'nvme',
		formFactor: 'm2-2280',
		pcieGen: 4,
		capacityGb: 4000,
		readMbs: 7000,
		writeMbs: 6500
	}),
	part('storage', 'verrow-s2-2tb', 'Verrow', 'S2 2 TB SATA', {
		interface: 'sata',
		formFactor: '2.5in',
		capacityGb: 2000,
		readMbs: 560,
		writeMbs: 530
	})
];

const gpus: DemoPart[] = [
	part('gpu', 'ironvale-auric-a52-8g', 'Ironvale', 'Auric A52 Twin 8 GB', {
		chip: 'Auric A52',
		vramGb: 8,
		lengthMm: 199,
		slotWidth: 2,
		boardPowerW: 115,
		powerConnectors: { pin6: 0, pin8: 1, h12v2x6: 0 },
		pcieGen: 4
	}),
	part('gpu', 'solenne-cobalt-c6-8g', 'Solenne', 'Cobalt C6 Duo 8 GB', {
		chip: 'Cobalt C6',
		vramGb: 8,
		lengthMm: 204,
		slotWidth: 2,
		boardPowerW: 165,
		powerConnectors: { pin6: 0, pin8: 1, h12v2x6: 0 },
		pcieGen: 4
	}),
	part('gpu', 'solenne-auric-a64-12g', 'Solenne', 'Auric A64 Duo 12 GB', {
		chip: 'Auric A64',
		vramGb: 12,
		lengthMm: 242,
		slotWidth: 2.5,
		boardPowerW: 200,
		powerConnectors: { pin6: 0, pin8: 1, h12v2x6: 0 },
		pcieGen: 4
	}),
	// A short single-fan board of the same chip, for cases with little clearance.
	part('gpu', 'ironvale-auric-a64-mini-12g', 'Ironvale', 'Auric A64 Mini 12 GB', {
		chip: 'Auric A64',
		vramGb: 12,
		lengthMm: 182,
		slotWidth: 2,
		boardPowerW: 200,
		powerConnectors: { pin6: 0, pin8: 1, h12v2x6: 0 },
		pcieGen: 4
	}),
	part('gpu', 'ironvale-cobalt-c7-16g', 'Ironvale', 'Cobalt C7 Triple 16 GB', {
		chip: 'Cobalt C7',
		vramGb: 16,
		lengthMm: 267,
		slotWidth: 2.5,
		boardPowerW: 263,
		powerConnectors: { pin6: 0, pin8: 2, h12v2x6: 0 },
		pcieGen: 4
	}),
	part('gpu', 'solenne-cobalt-c8-20g', 'Solenne', 'Cobalt C8 Triple 20 GB', {
		chip: 'Cobalt C8',
		vramGb: 20,
		lengthMm: 320,
		slotWidth: 3,
		boardPowerW: 315,
		powerConnectors: { pin6: 0, pin8: 2, h12v2x6: 0 },
		pcieGen: 4
	}),
	part('gpu', 'ironvale-auric-a78-16g', 'Ironvale', 'Auric A78 Triple 16 GB', {
		chip: 'Auric A78',
		vramGb: 16,
		lengthMm: 336,
		slotWidth: 3.2,
		boardPowerW: 300,
		powerConnectors: { pin6: 0, pin8: 0, h12v2x6: 1 },
		pcieGen: 5
	}),
	part('gpu', 'solenne-auric-a90-24g', 'Solenne', 'Auric A90 Triple 24 GB', {
		chip: 'Auric A90',
		vramGb: 24,
		lengthMm: 348,
		slotWidth: 3.5,
		boardPowerW: 450,
		powerConnectors: { pin6: 0, pin8: 0, h12v2x6: 1 },
		pcieGen: 5
	})
];

const psus: DemoPart[] = [
	// 8-pin leads only: cards with a 12V-2x6 inlet need an adapter or another unit.
	part('psu', 'voltren-vp550-bronze', 'Voltren', 'VP550 Bronze', {
		ratedW: 550,
		formFactor: 'ATX',
		efficiency: '80 PLUS Bronze',
		modular: 'none',
		connectors: { pin6: 0, pin8: 2, h12v2x6: 0, eps8: 1 },
		atx3: false
	}),
	part('psu', 'voltren-vp650-gold', 'Voltren', 'VP650 Gold', {
		ratedW: 650,
		formFactor: 'ATX',
		efficiency: '80 PLUS Gold',
		modular: 'full',
		connectors: { pin6: 0, pin8: 3, h12v2x6: 0, eps8: 1 },
		atx3: false
	}),
	part('psu', 'voltren-vp750-gold', 'Voltren', 'VP750 Gold', {
		ratedW: 750,
		formFactor: 'ATX',
		efficiency: '80 PLUS Gold',
		modular: 'full',
		connectors: { pin6: 0, pin8: 2, h12v2x6: 1, eps8: 2 },
		atx3: true
	}),
	part('psu', 'voltren-vp850-gold', 'Voltren', 'VP850 Gold', {
		ratedW: 850,
		formFactor: 'ATX',
		efficiency: '80 PLUS Gold',
		modular: 'full',
		connectors: { pin6: 0, pin8: 3, h12v2x6: 1, eps8: 2 },
		atx3: true
	}),
	part('psu', 'voltren-vp1000-gold', 'Voltren', 'VP1000 Gold', {
		ratedW: 1000,
		formFactor: 'ATX',
		efficiency: '80 PLUS Gold',
		modular: 'full',
		connectors: { pin6: 0, pin8: 4, h12v2x6: 1, eps8: 2 },
		atx3: true
	}),
	part('psu', 'stillwater-sw1000-platinum', 'Stillwater Power', 'SW1000 Platinum', {
		ratedW: 1000,
		formFactor: 'ATX',
		efficiency: '80 PLUS Platinum',
		modular: 'full',
		connectors: { pin6: 0, pin8: 4, h12v2x6: 1, eps8: 2 },
		atx3: true
	}),
	part('psu', 'stillwater-sfx600-gold', 'Stillwater Power', 'SFX600 Gold', {
		ratedW: 600,
		formFactor: 'SFX',
		efficiency: '80 PLUS Gold',
		modular: 'full',
		connectors: { pin6: 0, pin8: 2, h12v2x6: 0, eps8: 1 },
		atx3: false
	}),
	part('psu', 'stillwater-sfx750-gold', 'Stillwater Power', 'SFX750 Gold', {
		ratedW: 750,
		formFactor: 'SFX',
		efficiency: '80 PLUS Gold',
		modular: 'full',
		connectors: { pin6: 0, pin8: 2, h12v2x6: 1, eps8: 1 },
		atx3: true
	}),
	part('psu', 'voltren-sfxl850-platinum', 'Voltren', 'SFX-L 850 Platinum', {
		ratedW: 850,
		formFactor: 'SFX-L',
		efficiency: '80 PLUS Platinum',
		modular: 'full',
		connectors: { pin6: 0, pin8: 2, h12v2x6: 1, eps8: 2 },
		atx3: true
	})
];

const cases: DemoPart[] = [
	part('case', 'cairnhouse-m-mesh', 'Cairnhouse', 'M Mesh', {
		boardFormFactors: ['microATX', 'Mini-ITX'],
		maxGpuLengthMm: 330,
		maxCoolerHeightMm: 160,
		psuFormFactors: ['ATX'],
		radiatorMm: 240,
		includedFans: 2,
		fanMounts: 6,
		bays25: 2,
		bays35: 1
	}),
	part('case', 'cairnhouse-atrium-atx', 'Cairnhouse', 'Atrium ATX', {
		boardFormFactors: ['ATX', 'microATX', 'Mini-ITX'],
		maxGpuLengthMm: 400,
		maxCoolerHeightMm: 172,
		psuFormFactors: ['ATX'],
		radiatorMm: 360,
		includedFans: 3,
		fanMounts: 9,
		bays25: 2,
		bays35: 2
	}),
	part('case', 'cairnhouse-basis-atx', 'Cairnhouse', 'Basis ATX', {
		boardFormFactors: ['ATX', 'microATX', 'Mini-ITX'],
		maxGpuLengthMm: 345,
		maxCoolerHeightMm: 162,
		psuFormFactors: ['ATX'],
		radiatorMm: 280,
		includedFans: 1,
		fanMounts: 6,
		bays25: 2,
		bays35: 2
	}),
	part('case', 'norrow-glassline-m', 'Norrow Works', 'Glassline M', {
		boardFormFactors: ['microATX', 'Mini-ITX'],
		maxGpuLengthMm: 340,
		maxCoolerHeightMm: 165,
		psuFormFactors: ['ATX'],
		radiatorMm: 280,
		includedFans: 0,
		fanMounts: 7,
		bays25: 2,
		bays35: 0
	}),
	// Nine fan mounts (three front, three top, one rear, two bottom): the quiet guide fills
	// them with the three included fans, a 3-pack and its 360 mm radiator on top.
	part('case', 'norrow-atlas-silent', 'Norrow Works', 'Atlas Silent', {
		boardFormFactors: ['E-ATX', 'ATX', 'microATX', 'Mini-ITX'],
		maxGpuLengthMm: 365,
		maxCoolerHeightMm: 170,
		psuFormFactors: ['ATX'],
		radiatorMm: 360,
		includedFans: 3,
		fanMounts: 9,
		bays25: 3,
		bays35: 2
	}),
	// About ten litres: short card clearance and room for a low-profile cooler only.
	part('case', 'norrow-pocket-itx', 'Norrow Works', 'Pocket ITX', {
		boardFormFactors: ['Mini-ITX'],
		maxGpuLengthMm: 220,
		maxCoolerHeightMm: 58,
		psuFormFactors: ['SFX'],
		radiatorMm: 0,
		includedFans: 1,
		fanMounts: 2,
		bays25: 1,
		bays35: 0
	}),
	part('case', 'norrow-shoebox-itx', 'Norrow Works', 'Shoebox ITX', {
		boardFormFactors: ['Mini-ITX'],
		maxGpuLengthMm: 325,
		maxCoolerHeightMm: 67,
		psuFormFactors: ['SFX', 'SFX-L'],
		radiatorMm: 240,
		includedFans: 0,
		fanMounts: 4,
		bays25: 2,
		bays35: 0
	}),
	part('case', 'cairnhouse-cube-itx', 'Cairnhouse', 'Cube ITX', {
		boardFormFactors: ['Mini-ITX'],
		maxGpuLengthMm: 290,
		maxCoolerHeightMm: 72,
		psuFormFactors: ['SFX', 'SFX-L'],
		radiatorMm: 240,
		includedFans: 2,
		fanMounts: 4,
		bays25: 2,
		bays35: 0
	})
];

const fans: DemoPart[] = [
	part('fan', 'tessel-breeze-120-3pack', 'Tessel', 'Breeze 120 (3-pack)', {
		sizeMm: 120,
		count: 3,
		maxRpm: 1800
	}),
	part('fan', 'tessel-breeze-140-2pack', 'Tessel', 'Breeze 140 (2-pack)', {
		sizeMm: 140,
		count: 2,
		maxRpm: 1500
	}),
	part('fan', 'tessel-breeze-92', 'Tessel', 'Breeze 92', { sizeMm: 92, count: 1, maxRpm: 2200 }),
	part('fan', 'kelda-quietwing-120-2pack', 'Kelda', 'Quietwing 120 (2-pack)', {
		sizeMm: 120,
		count: 2,
		maxRpm: 1200
	}),
	part('fan', 'kelda-quietwing-140-3pack', 'Kelda', 'Quietwing 140 (3-pack)', {
		sizeMm: 140,
		count: 3,
		maxRpm: 1200
	}),
	part('fan', 'kelda-quietwing-92', 'Kelda', 'Quietwing 92', { sizeMm: 92, count: 1, maxRpm: 1600 })
];

const operatingSystems: DemoPart[] = [
	part('os', 'orchard-os-12-home', 'Orchard Systems', 'Orchard OS 12 Home', {
		edition: 'Home',
		licence: 'retail'
	}),
	part('os', 'orchard-os-12-pro', 'Orchard Systems', 'Orchard OS 12 Pro', {
		edition: 'Pro',
		licence: 'oem'
	}),
	// The licence is free; the listed price is the boxed USB installer.
	part('os', 'larkspur-os-24-lts', 'Larkspur Project', 'Larkspur OS 24 LTS', {
		edition: '24 LTS desktop, USB installer',
		licence: 'free'
	})
];

const extras: DemoPart[] = [
	part('extra', 'tessel-tx4-thermal-paste', 'Tessel', 'TX-4 thermal paste 4 g', {
		kind: 'Thermal paste'
	}),
	part('extra', 'ironvale-anchor-gpu-bracket', 'Ironvale', 'Anchor graphics card bracket', {
		kind: 'Graphics card support bracket'
	}),
	part('extra', 'cairnhouse-sag-stand', 'Cairnhouse', 'Sag stand, adjustable', {
		kind: 'Graphics card support stand'
	}),
	part('extra', 'cairnhouse-wrist-strap', 'Cairnhouse', 'Anti-static wrist strap', {
		kind: 'Anti-static wrist strap'
	})
];

export const demoParts: DemoPart[] = [
	...cpus,
	...coolers,
	...motherboards,
	...memory,
	...storage,
	...gpus,
	...psus,
	...cases,
	...fans,
	...operatingSystems,
	...extras
];
