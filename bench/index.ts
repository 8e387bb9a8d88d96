// `npm run bench`: every area's benchmark, one import line each (each module runs on import).
import './foundry';
import './puzzle';
import './tiling';
import './print';
import './intake';
