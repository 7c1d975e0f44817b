"use client";

export { default } from "@/components/ui/AreaError";
