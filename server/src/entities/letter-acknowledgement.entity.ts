import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

@Entity({ name: 'letter_acknowledgements' })
@Index('letter_acknowledgements_key', ['letterId', 'guardianId'], { unique: true })
export class LetterAcknowledgement {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column('uuid', { name: 'letter_id' })
  letterId: string;

  @Column('uuid', { name: 'guardian_id' })
  guardianId: string;

  @Column('timestamptz', { name: 'acknowledged_at', default: () => 'now()' })
  acknowledgedAt: Date;
}
