import { stopCluster } from './local-postgres';
import { progress } from './progress';

progress(stopCluster() ? 'PostgreSQL stopped.' : 'PostgreSQL was not running.');
