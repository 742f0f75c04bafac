// @vitest-environment jsdom
import { describe, expect, it } from 'vitest';
import { viewerCommand } from './viewer-keys';

document.body.innerHTML = `
  <div id="page"><canvas id="canvas"></canvas><button id="play">Play</button>
  <div role="slider" id="slider"></div><input id="field"></div>`;
const el = (id: string) => document.getElementById(id);
const key = (k: string, mods: Partial<KeyboardEvent> = {}) => ({ key: k, altKey: false, ctrlKey: false, metaKey: false, ...mods });

describe('viewerCommand', () => {
  it('when focus is on the page or the canvas, then space, arrows, Home and End drive playback', () => {
    expect(viewerCommand(key(' '), el('canvas'))).toBe('toggle-play');
    expect(viewerCommand(key('ArrowLeft'), el('page'))).toBe('previous');
    expect(viewerCommand(key('ArrowRight'), null)).toBe('next');
    expect(viewerCommand(key('Home'), el('canvas'))).toBe('first');
    expect(viewerCommand(key('End'), el('canvas'))).toBe('last');
  });

  it('when a button has focus, then space is left to the button but arrows still step', () => {
    expect(viewerCommand(key(' '), el('play'))).toBeNull();
    expect(viewerCommand(key('ArrowRight'), el('play'))).toBe('next');
  });

  it('when a slider or text field has focus, then its own keys are left alone', () => {
    expect(viewerCommand(key('ArrowLeft'), el('slider'))).toBeNull();
    expect(viewerCommand(key(' '), el('field'))).toBeNull();
  });

  it('when a modifier is held or the key is not ours, then nothing happens', () => {
    expect(viewerCommand(key('ArrowLeft', { altKey: true }), el('canvas'))).toBeNull();
    expect(viewerCommand(key('p'), el('canvas'))).toBeNull();
  });
});
