import { takeoff } from './engine/takeoff/takeoff';
import { hillSmallholding } from './engine';
const t = takeoff(hillSmallholding);
for (const r of t.rows) console.log(r.group, r.code, r.quantity, r.unit, r.note ?? '', r.elements.join(','));
