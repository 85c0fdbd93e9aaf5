// Site measures for the demo's jobs, typed the way a salesperson types them (feet and inches,
// fractions), so the demo's quotes come from the same path as real ones.
import { emptyRoom, type MeasureDraft, type RoomDraft } from '../src/lib/measure/draft';

type Floors = (name: string) => string;

function room(id: string, name: string, patch: Partial<RoomDraft>): RoomDraft {
	return { ...emptyRoom(id, name), ...patch };
}

const rect = (width: string, length: string) => ({ kind: 'rect' as const, width, length });

/** The measure of a demo job by its title; every job title in the seed has one. */
export function demoMeasure(title: string, floor: Floors): MeasureDraft {
	switch (title) {
		case 'Kitchen and hall, vinyl plank':
			return {
				builtYear: '1962',
				rooms: [
					room('kitchen', 'Kitchen', {
						// An L: the main run and the breakfast nook.
						shape: {
							kind: 'rects',
							rects: [
								{ x: '0', y: '0', width: "12'", length: "8'" },
								{ x: '0', y: "8'", width: "5'", length: "6'" }
							]
						},
						cutouts: [{ name: 'Island', x: "4'", y: "3'", width: "4'", length: '2\' 6"' }],
						floor: { productId: floor('Grey vinyl plank'), layout: 'straight' },
						remove: ['sheet_vinyl'],
						subfloor: { kind: 'plywood', thickness: '5/8', spanRating: '32/16' },
						repairs: {
							holes: [
								{ width: '4', length: '4 1/2' },
								{ width: '6', length: '3' }
							],
							seams: [{ length: '2\' 6"', width: '1/4', depth: '1/8' }],
							dents: [],
							fasteners: 'room',
							fastenerArea: ''
						},
						trim: true,
						transitions: '1'
					}),
					room('hall', 'Hall', {
						shape: rect('3\' 6"', "14'"),
						floor: { productId: floor('Grey vinyl plank'), layout: 'straight' },
						remove: ['sheet_vinyl'],
						subfloor: { kind: 'plywood', thickness: '5/8', spanRating: '' },
						transitions: '2'
					})
				]
			};
		case 'Basement carpet':
			return {
				builtYear: '1978',
				rooms: [
					room('family', 'Family room', {
						shape: rect("18'", '22\' 6"'),
						floor: { productId: floor('Plush carpet 12 ft'), layout: 'straight' },
						remove: ['carpet'],
						subfloor: { kind: 'concrete', thickness: '', spanRating: '' },
						readings: {
							flatness: [],
							rh: ['78', '82', '74'],
							calciumChloride: [],
							woodSubfloor: [],
							woodFlooring: []
						}
					})
				]
			};
		case 'Living room oak':
			return {
				builtYear: '1994',
				rooms: [
					room('living', 'Living room', {
						shape: rect("16'", "14'"),
						floor: { productId: floor('Oak plank 7 in'), layout: 'straight' },
						remove: ['carpet'],
						subfloor: { kind: 'plywood', thickness: '3/4', spanRating: '40/20' },
						readings: {
							flatness: [{ span: "10'", gap: '1/4' }],
							rh: [],
							calciumChloride: [],
							woodSubfloor: ['11', '12'],
							woodFlooring: ['8', '9']
						}
					})
				]
			};
		case 'Two bedrooms, carpet':
			return {
				builtYear: '1985',
				rooms: [
					room('bed1', 'Main bedroom', {
						shape: rect("11'", "12'"),
						floor: { productId: floor('Berber carpet 15 ft'), layout: 'straight' },
						remove: ['carpet'],
						subfloor: { kind: 'osb', thickness: '23/32', spanRating: '' }
					}),
					room('bed2', 'Small bedroom', {
						shape: rect("10'", '11\' 6"'),
						floor: { productId: floor('Berber carpet 15 ft'), layout: 'straight' },
						remove: ['carpet'],
						subfloor: { kind: 'osb', thickness: '23/32', spanRating: '' }
					})
				]
			};
		case 'Bathroom tile':
			return {
				builtYear: '1971',
				rooms: [
					room('bath', 'Bathroom', {
						shape: rect("8'", '9\' 6"'),
						cutouts: [{ name: 'Vanity', x: '0', y: '0', width: '2\' 6"', length: '1\' 10"' }],
						floor: { productId: floor('Porcelain tile 12 × 24 in'), layout: 'straight' },
						remove: ['vinyl_tile'],
						subfloor: { kind: 'plywood', thickness: '5/8', spanRating: '' },
						joists: { size: '2x8', species: 'douglas_fir_larch', spacing: '16', span: '13\' 6"' },
						readings: {
							flatness: [{ span: "10'", gap: '3/16' }],
							rh: [],
							calciumChloride: [],
							woodSubfloor: [],
							woodFlooring: []
						}
					})
				]
			};
		case 'Sunroom laminate':
			return {
				builtYear: '2004',
				rooms: [
					room('sun', 'Sunroom', {
						shape: {
							kind: 'rects',
							rects: [
								{ x: '0', y: '0', width: "10'", length: "12'" },
								{ x: "10'", y: "3'", width: "2'", length: "6'" }
							]
						},
						floor: { productId: floor('Walnut-look laminate 8 mm'), layout: 'diagonal' },
						subfloor: { kind: 'plywood', thickness: '3/4', spanRating: '' },
						trim: true
					})
				]
			};
		case 'Laundry sheet vinyl':
			return {
				builtYear: '1962',
				rooms: [
					room('laundry', 'Laundry', {
						shape: rect("7'", "8'"),
						floor: { productId: floor('Sheet vinyl 6 ft'), layout: 'straight' },
						remove: ['sheet_vinyl'],
						subfloor: { kind: 'plywood', thickness: '5/8', spanRating: '' },
						repairs: {
							holes: [],
							seams: [],
							dents: [{ length: '3', width: '2', depth: '1/8' }],
							fasteners: 'none',
							fastenerArea: ''
						}
					})
				]
			};
		case 'Upstairs landing carpet':
			return {
				builtYear: '1985',
				rooms: [
					room('landing', 'Landing', {
						shape: rect("6'", "9'"),
						floor: { productId: floor('Plush carpet 12 ft'), layout: 'straight' },
						remove: ['carpet'],
						subfloor: { kind: 'osb', thickness: '23/32', spanRating: '' }
					})
				]
			};
		case 'Den engineered wood':
			return {
				builtYear: '1978',
				rooms: [
					room('den', 'Den', {
						shape: rect("12'", "13'"),
						floor: { productId: floor('Oak plank 7 in'), layout: 'herringbone' },
						remove: ['carpet'],
						subfloor: { kind: 'plywood', thickness: '5/8', spanRating: '' }
					})
				]
			};
		default:
			throw new Error(`No demo measure for "${title}"`);
	}
}
