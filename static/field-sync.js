// Background Sync for the installer's outbox: when the browser says the network is back, wake
// the open field pages so they send what waits in IndexedDB ($lib/field/outbox.ts).
self.addEventListener('sync', (event) => {
	if (event.tag !== 'flushline-field') return;
	event.waitUntil(
		self.clients
			.matchAll({ includeUncontrolled: true, type: 'window' })
			.then((clients) => clients.forEach((c) => c.postMessage({ type: 'flushline-send' })))
	);
});
