import { NextResponse } from "next/server";
import { buildOpenApiDocument } from "@/lib/server/openapi";

export function GET() {
  return NextResponse.json(buildOpenApiDocument());
}
