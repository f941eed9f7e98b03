export { deliveryKeys } from './keys';
export { useDeliveries, useBuildDelivery, useReleaseDelivery, useDeleteDelivery, downloadUrl } from './api';
export { DEFAULT_FORM, validateDeliveryForm, canDeliver } from './form';
export type { DeliveryFormErrors, LayerSetChoice } from './form';
export { BuildDeliveryForm } from './components/BuildDeliveryForm';
export { DeliveryList, provenanceOf } from './components/DeliveryList';
export * from './types';
