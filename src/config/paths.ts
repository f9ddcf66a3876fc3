export { paths } from '@shared/paths';
