/** Money on every screen: the one formatter (domain/format.ts), whole cents of an ISO 4217 currency, shown with it. */
export { formatMoney, DEFAULT_CURRENCY } from '~/lib/domain/format';
