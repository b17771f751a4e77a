/**
 * Settings: defaults come from schema/settings/plugin.json through a real
 * SettingRegistry, and user values are validated by it.
 */
import { describe, expect, it } from 'vitest';
import { readSettings } from '../../src/plugins/settings';
import { settingRegistryWith } from './harness';

const ID = 'jupyterlab-psiscape:plugin';

describe('settings', () => {
  it('should take every default from the schema', async () => {
    const registry = settingRegistryWith(ID);
    const settings = await registry.load(ID);
    expect(readSettings(settings.composite)).toEqual({ pointSize: 40, placement: 'beside', presenterScale: 1.6 });
  });

  it('should apply a valid user value and reject an invalid one', async () => {
    const registry = settingRegistryWith(ID);
    const settings = await registry.load(ID);
    await settings.set('pointSize', 90);
    expect(readSettings(settings.composite).pointSize).toBe(90);
    await settings.set('presenterScale', 2);
    expect(readSettings(settings.composite).presenterScale).toBe(2);
    await expect(settings.set('pointSize', 1000)).rejects.toBeTruthy();
    await expect(settings.set('placement', 'floating')).rejects.toBeTruthy();
    await expect(settings.set('presenterScale', 0.5)).rejects.toBeTruthy();
    expect(readSettings(settings.composite)).toEqual({ pointSize: 90, placement: 'beside', presenterScale: 2 });
  });

  it('should name the setting when given an unvalidated composite', () => {
    expect(() => readSettings({ pointSize: 'big', placement: 'beside', presenterScale: 1.6 })).toThrow('setting "pointSize" must be a finite number, got "big"');
    expect(() => readSettings({ pointSize: 10, placement: 'left', presenterScale: 1.6 })).toThrow('setting "placement" must be "beside" or "tab", got "left"');
    expect(() => readSettings({ pointSize: 10, placement: 'tab', presenterScale: 0 })).toThrow('setting "presenterScale" must be a positive number, got 0');
  });
});
