import { calculatorActions, calculatorLoad } from '$lib/server/calculator-page';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = () => calculatorLoad();
export const actions: Actions = calculatorActions;
