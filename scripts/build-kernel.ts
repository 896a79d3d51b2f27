/** `npm run build:kernel`: rebuild the embedded WebAssembly kernels from their AssemblyScript sources. */
import { writeFileSync } from "node:fs";
import { compileKernel, kernelModulePath, KERNELS, renderKernelModule } from "./kernel-build";

for (const kernel of Object.values(KERNELS)) {
  const binary = await compileKernel(kernel);
  writeFileSync(kernelModulePath(kernel), renderKernelModule(binary, kernel));
  console.log(`${kernelModulePath(kernel)}: ${binary.length} bytes of WebAssembly`);
}
