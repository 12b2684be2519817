import { expose } from 'comlink';
import { SimulationHost } from './simulationHost';

// The simulation worker: one model per worker, driven through the verbs of SimulationApi.
expose(new SimulationHost());
