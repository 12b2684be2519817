import { parentPort } from 'node:worker_threads';
import { joinStepTeam, type TeamInvitation } from '../lib/model/threadTeam';

/**
 * A step helper thread: says it is ready, then joins each team it is invited to
 * (lib/model/threadTeam.ts), serving that step's phases until the team lets it go.
 */
parentPort!.on('message', (invitation: TeamInvitation) => joinStepTeam(invitation));
parentPort!.postMessage('ready');
