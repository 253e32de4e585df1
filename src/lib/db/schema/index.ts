export * from './users';
export * from './projects';
