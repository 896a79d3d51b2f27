"use client";

import { useQueryClient } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useEffect, useSyncExternalStore } from "react";
import { device, type DeviceSnapshot } from "@/lib/offline/device";

/** Starts the signed-in user's device (outbox, sync, number blocks) and follows its state. */
export function useDevice(userId: string, siteId: string | null): DeviceSnapshot {
  const qc = useQueryClient();
  const router = useRouter();
  useEffect(() => {
    device.onSynced = () => {
      void qc.invalidateQueries();
      router.refresh();
    };
    void device.start(userId, siteId);
    const on = () => device.setOnline(true);
    const off = () => device.setOnline(false);
    window.addEventListener("online", on);
    window.addEventListener("offline", off);
    return () => {
      window.removeEventListener("online", on);
      window.removeEventListener("offline", off);
    };
  }, [userId, siteId, qc, router]);
  return useSyncExternalStore(device.subscribe, device.getSnapshot, device.getServerSnapshot);
}
