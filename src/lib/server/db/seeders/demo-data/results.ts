/*
 * Invented frame results and thermals for the demo guides. Every game title is made up;
 * figures are plausible for each build's class of graphics card, not measurements.
 * FPS are in tenths (integers), as stored.
 */
export interface DemoFrameResult {
	workload: string;
	resolution: string;
	preset: string;
	avgFpsTenths: number;
	low1FpsTenths: number | null;
	notes?: string;
}

export interface DemoThermalResult {
	loadName: string;
	cpuTempC: number;
	gpuTempC: number;
	cpuUtilPct: number;
	gpuUtilPct: number;
}

export interface DemoResults {
	frames: DemoFrameResult[];
	thermals: DemoThermalResult[];
}

/** Keyed by guide slug (demo-data/guides.ts). */
export const demoResults: Record<string, DemoResults> = {
	'steady-1080p-starter': {
		frames: [
			{
				workload: 'Hollow Meridian',
				resolution: '1920x1080',
				preset: 'High',
				avgFpsTenths: 784,
				low1FpsTenths: 592
			},
			{
				workload: 'Rustwake Rally',
				resolution: '1920x1080',
				preset: 'High',
				avgFpsTenths: 1126,
				low1FpsTenths: 861
			},
			{
				workload: 'Lanterns of Osk',
				resolution: '1920x1080',
				preset: 'Medium',
				avgFpsTenths: 1453,
				low1FpsTenths: 1017
			},
			{
				workload: 'Tidebreak Tactics',
				resolution: '1920x1080',
				preset: 'Ultra',
				avgFpsTenths: 618,
				low1FpsTenths: 477,
				notes: 'Late-game turn with 40 units on screen.'
			}
		],
		thermals: [
			{
				loadName: '30 min of Hollow Meridian',
				cpuTempC: 68,
				gpuTempC: 71,
				cpuUtilPct: 54,
				gpuUtilPct: 98
			},
			{
				loadName: 'All-core render, 10 min',
				cpuTempC: 79,
				gpuTempC: 38,
				cpuUtilPct: 100,
				gpuUtilPct: 3
			}
		]
	},
	'balanced-1440p-am5': {
		frames: [
			{
				workload: 'Hollow Meridian',
				resolution: '2560x1440',
				preset: 'High',
				avgFpsTenths: 962,
				low1FpsTenths: 731
			},
			{
				workload: 'Rustwake Rally',
				resolution: '2560x1440',
				preset: 'High',
				avgFpsTenths: 1318,
				low1FpsTenths: 1004
			},
			{
				workload: 'Lanterns of Osk',
				resolution: '2560x1440',
				preset: 'Ultra',
				avgFpsTenths: 1097,
				low1FpsTenths: 812
			},
			{
				workload: 'Glassline Frontier',
				resolution: '2560x1440',
				preset: 'High',
				avgFpsTenths: 874,
				low1FpsTenths: 655
			}
		],
		thermals: [
			{
				loadName: '30 min of Rustwake Rally',
				cpuTempC: 71,
				gpuTempC: 69,
				cpuUtilPct: 47,
				gpuUtilPct: 97
			},
			{
				loadName: 'All-core render, 10 min',
				cpuTempC: 84,
				gpuTempC: 40,
				cpuUtilPct: 100,
				gpuUtilPct: 2
			}
		]
	},
	'quiet-4k-play-and-work': {
		frames: [
			{
				workload: 'Hollow Meridian',
				resolution: '3840x2160',
				preset: 'High',
				avgFpsTenths: 713,
				low1FpsTenths: 560
			},
			{
				workload: 'Rustwake Rally',
				resolution: '3840x2160',
				preset: 'High',
				avgFpsTenths: 948,
				low1FpsTenths: 742
			},
			{
				workload: 'Glassline Frontier',
				resolution: '3840x2160',
				preset: 'Medium',
				avgFpsTenths: 822,
				low1FpsTenths: 611
			}
		],
		thermals: [
			{
				loadName: '45 min of Glassline Frontier',
				cpuTempC: 66,
				gpuTempC: 67,
				cpuUtilPct: 38,
				gpuUtilPct: 99
			},
			{
				loadName: 'Code compile loop, 15 min',
				cpuTempC: 77,
				gpuTempC: 36,
				cpuUtilPct: 100,
				gpuUtilPct: 1
			}
		]
	},
	'pocket-itx-1440p': {
		frames: [
			{
				workload: 'Hollow Meridian',
				resolution: '2560x1440',
				preset: 'Medium',
				avgFpsTenths: 889,
				low1FpsTenths: 648
			},
			{
				workload: 'Rustwake Rally',
				resolution: '2560x1440',
				preset: 'High',
				avgFpsTenths: 1174,
				low1FpsTenths: 873
			},
			{
				workload: 'Tidebreak Tactics',
				resolution: '2560x1440',
				preset: 'High',
				avgFpsTenths: 706,
				low1FpsTenths: 529
			}
		],
		thermals: [
			{
				loadName: '30 min of Hollow Meridian',
				cpuTempC: 76,
				gpuTempC: 74,
				cpuUtilPct: 51,
				gpuUtilPct: 98
			},
			{
				loadName: 'All-core render, 10 min',
				cpuTempC: 88,
				gpuTempC: 42,
				cpuUtilPct: 100,
				gpuUtilPct: 2
			}
		]
	}
};
