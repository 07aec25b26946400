import type { SeederModule } from '../umzug.js';
import * as guidePrices from '../../services/guide-prices.js';

/*
 * The demo guides' stored figures in every region (guide_region_prices), computed the way a
 * publish, a quote or a rates refresh computes them; after the community and the rates.
 */
export const up: SeederModule['up'] = async () => {
	await guidePrices.refreshAll();
};

export const down: SeederModule['down'] = async ({ context: sequelize }) => {
	await sequelize.query('DELETE FROM guide_region_prices');
};
