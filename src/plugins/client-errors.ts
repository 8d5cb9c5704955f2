/**
 * Answers to requests the HTTP parser rejects before the framework sees them (a broken request
 * line, headers over the size limit, a request that did not arrive in time): RFC 9457 problem
 * documents like every other refusal, written straight to the socket, which then closes.
 */
import { STATUS_CODES } from 'node:http';
import type { Socket } from 'node:net';
import { PROBLEM_TYPE, problem } from './problem.js';

function answerFor(code: string | undefined) {
  if (code === 'ERR_HTTP_REQUEST_TIMEOUT') return problem(408, 'request-timeout', 'Request timeout', 'The request did not arrive within the time this service allows.');
  if (code === 'HPE_HEADER_OVERFLOW') return problem(431, 'headers-too-large', 'Request headers too large', 'The request headers are larger than this service accepts.');
  return problem(400, 'malformed-request', 'Malformed request', 'The request is not valid HTTP/1.1.');
}

/** Fastify's clientErrorHandler option. */
export function clientErrorHandler(err: Error & { code?: string }, socket: Socket): void {
  if (err.code === 'ECONNRESET' || socket.destroyed) return;
  if (socket.writable) {
    const body = JSON.stringify(answerFor(err.code));
    const status = JSON.parse(body).status as number;
    socket.write(
      `HTTP/1.1 ${status} ${STATUS_CODES[status]}\r\ncontent-type: ${PROBLEM_TYPE}\r\ncontent-length: ${Buffer.byteLength(body)}\r\nconnection: close\r\n\r\n${body}`,
    );
  }
  socket.destroy();
}
