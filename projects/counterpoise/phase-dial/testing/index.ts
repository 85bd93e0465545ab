export * from './public-api';
