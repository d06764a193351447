/** The terminal debugger: the only public surface of tui/. */
export { Controller, type ControllerOptions } from './controller.js';
export { DebuggerApp } from './app.js';
export { startDebugger, type TerminalStreams } from './start.js';
export { KEYS, type KeyBinding } from './keys.js';
export { COMMANDS, type CommandDef } from './commands.js';
export { wantsColour } from './style.js';
