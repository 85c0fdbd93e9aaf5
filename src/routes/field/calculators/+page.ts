import { calculatorView } from '$lib/calculators/view';
import type { PageLoad } from './$types';

// The server's load decides who may see the calculators; this only picks the open one's code.
export const load: PageLoad = async ({ data, url }) => ({
	...data,
	...(await calculatorView(url))
});
