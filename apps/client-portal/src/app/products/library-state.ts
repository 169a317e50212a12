import type { ProductSummary } from '@ohmprint/contracts';

/** A product's reference library in words and icon (never colour alone). */
export function libraryLook(p: ProductSummary): { icon: string; label: string; hint: string } {
  switch (p.libraryState) {
    case 'published':
      return {
        icon: 'verified',
        label: `Library published, version ${p.publishedLibraryVersion?.version}`,
        hint: `${p.publishedLibraryVersion?.lotCount} authentic lots. Checks of this product can be ordered.`,
      };
    case 'building':
      return { icon: 'construction', label: 'Library being built', hint: 'Reference lots are on their way or being measured. Checks open once the lab publishes the library.' };
    default:
      return { icon: 'inventory_2', label: 'No library yet', hint: 'Enrol a few authentic lots so the lab can build the reference library checks are scored against.' };
  }
}
