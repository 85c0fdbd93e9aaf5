/** A URL-safe store slug from its name, with a short random tail so two "Oak & Tile" stores never clash. */
export function storeSlug(name: string): string {
	const base = name
		.normalize('NFKD')
		.replace(/[\u0300-\u036f]/g, '')
		.toLowerCase()
		.replace(/&/g, ' and ')
		.replace(/[^a-z0-9]+/g, '-')
		.replace(/^-+|-+$/g, '')
		.slice(0, 40);
	return `${base || 'store'}-${crypto.randomUUID().slice(0, 6)}`;
}
