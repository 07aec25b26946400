// The parts of javascript-lp-solver's JSON model that the app uses (it ships no types).
declare module 'javascript-lp-solver' {
	export interface Model {
		optimize: string;
		opType: 'max' | 'min';
		constraints: Record<string, { equal?: number; min?: number; max?: number }>;
		variables: Record<string, Record<string, number>>;
	}
	export type Solution = { feasible: boolean; bounded: boolean; result: number } & Record<
		string,
		number | boolean | undefined
	>;
	const solver: { Solve(model: Model): Solution };
	export default solver;
}
