"use client";

export { SectionError as default } from "@/components/ui/section-error";
