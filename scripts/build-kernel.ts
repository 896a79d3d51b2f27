/** `npm run build:kernel`: rebuild lib/spatial/kernel/isotropic-scan-wasm.ts from the AssemblyScript source. */
import { writeFileSync } from "node:fs";
import { compileKernel, KERNEL_MODULE, renderKernelModule } from "./kernel-build";

const binary = await compileKernel();
writeFileSync(KERNEL_MODULE, renderKernelModule(binary));
console.log(`${KERNEL_MODULE}: ${binary.length} bytes of WebAssembly`);
