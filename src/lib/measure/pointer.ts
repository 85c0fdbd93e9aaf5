/**
 * Work that would move the page (a message appearing under a field that was just left) waits
 * while a pointer is pressed: leaving a field by pressing a button must not push that button
 * from under the pointer before the press ends, or the click lands elsewhere. Browser-only;
 * on the server (and with no pointer pressed) the work runs at once.
 */
let pressed = false;
const waiting: (() => void)[] = [];

function release() {
	pressed = false;
	// After the click that this release makes has been dispatched.
	setTimeout(() => {
		for (const work of waiting.splice(0)) work();
	}, 0);
}

if (typeof window !== 'undefined') {
	window.addEventListener('pointerdown', () => (pressed = true), { capture: true });
	window.addEventListener('pointerup', release, { capture: true });
	window.addEventListener('pointercancel', release, { capture: true });
}

/** Runs `work` now, or once the pressed pointer is released and its click has landed. */
export function afterPointer(work: () => void): void {
	if (pressed) waiting.push(work);
	else work();
}
