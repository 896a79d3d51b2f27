/** The matrix rules live in lib/stratigraphy (pure), so a device can run the same loop check offline. */
export * from "@/lib/stratigraphy/matrix";
