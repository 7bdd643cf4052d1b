'use client';
/** The shop's settings (time zone, units, contact) for client components inside the signed-in pages. */
import { createContext, type ReactNode, useContext } from 'react';
import { DEFAULT_SHOP_SETTINGS, type ShopSettings } from '@/domain/shop-settings';

const Context = createContext<ShopSettings>(DEFAULT_SHOP_SETTINGS);

export function ShopSettingsProvider({ settings, children }: { settings: ShopSettings; children: ReactNode }) {
  return <Context.Provider value={settings}>{children}</Context.Provider>;
}

export const useShopSettings = (): ShopSettings => useContext(Context);
