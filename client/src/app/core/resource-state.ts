import { computed, type Resource, type Signal } from '@angular/core';
import { apiErrorMessage, type StatusMessages } from './api-errors';

/**
 * The load-and-error shape every data screen repeats around its `rxResource`s, kept once.
 */

/** The first failed resource's error as the sentence a screen shows (null while none has failed). */
export function loadErrorText(resources: readonly Resource<unknown>[], byStatus?: StatusMessages): Signal<string | null> {
  return computed(() => {
    for (const resource of resources) {
      const error = resource.error();
      if (error) return apiErrorMessage(error, byStatus);
    }
    return null;
  });
}

/** A resource's value, or `fallback` while it loads or after it failed (`value()` throws in the error state). */
export function valueOr<T, F>(resource: Resource<T | undefined>, fallback: F): Signal<T | F> {
  return computed(() => (resource.hasValue() ? resource.value() : fallback));
}
