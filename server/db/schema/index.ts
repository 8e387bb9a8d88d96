// Every area's tables, one export line per area file (add yours below).
export * from './auth';
export * from './mail';
export * from './meta';
export * from './ledger';
export * from './stock';
export * from './submissions';
export * from './jobs';
export * from './foundry';
export * from './publications';
export * from './editions';
export * from './puzzles';
