export * from './users';
export * from './projects';
export * from './limit-sets';
export * from './studies';
export * from './audit';
export * from './invitations';
export * from './records';
export * from './files';
